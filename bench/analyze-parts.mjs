// Where in-process analyze time goes on an INVENTED 1,000,000-row record (bench/records-gen.mjs): reading
// (readRecordFile) and analyzeRecord without and with the law fits, 6 runs each, medians of the last 5.
// Run after `npm run build`: node bench/analyze-parts.mjs
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeInventedRecord } from './records-gen.mjs';
import { readRecordFile } from '../dist/records/node.js';
import { analyzeRecord } from '../dist/core/index.js';
const dir = mkdtempSync(join(tmpdir(), 'sl-parts-')), f = join(dir, 'r1m.csv');
await writeInventedRecord(f, 1_000_000);
const tr = [], ta = [], tn = [];
for (let k = 0; k < 6; k++) {
  let t0 = performance.now(); const r = await readRecordFile(f); tr.push(performance.now() - t0);
  t0 = performance.now(); analyzeRecord(r, { fit: false }); tn.push(performance.now() - t0);
  t0 = performance.now(); analyzeRecord(r); ta.push(performance.now() - t0);
}
const med = (a) => a.slice(1).sort((x, y) => x - y)[2];
console.log('read', med(tr).toFixed(0), 'ms; analyze fit:false', med(tn).toFixed(0), 'ms; analyze with fits', med(ta).toFixed(0), 'ms');
rmSync(dir, { recursive: true, force: true });
