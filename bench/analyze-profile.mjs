import { Session } from 'node:inspector/promises';
// Where a warm in-process analyze of an INVENTED 1,000,000-row record (bench/records-gen.mjs) spends its time: 6 runs
// to warm up, then 10 under the sampling profiler (node:inspector, 100 µs), self time per function per run.
// Run after `npm run build`: node bench/analyze-profile.mjs
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeInventedRecord } from './records-gen.mjs';
import { readRecordFile } from '../dist/records/node.js';
import { analyzeRecord } from '../dist/core/index.js';
const dir = mkdtempSync(join(tmpdir(), 'sl-prof-')), f = join(dir, 'r1m.csv');
await writeInventedRecord(f, 1_000_000);
const r = await readRecordFile(f);
for (let k = 0; k < 6; k++) analyzeRecord(r);
const s = new Session(); s.connect();
await s.post('Profiler.enable'); await s.post('Profiler.setSamplingInterval', { interval: 100 }); await s.post('Profiler.start');
const t = []; const N = 10;
for (let k = 0; k < N; k++) { const t0 = performance.now(); analyzeRecord(r); t.push(performance.now() - t0); }
const { profile: p } = await s.post('Profiler.stop');
console.log('warm analyze with fits, ms:', t.map((x) => x.toFixed(0)).join(' '));
const byId = new Map(p.nodes.map((n) => [n.id, n])); const self = new Map(); let tot = 0;
for (let i = 0; i < p.samples.length; i++) { const n = byId.get(p.samples[i]); const k = n.callFrame.functionName + ' ' + n.callFrame.url.split('/').slice(-2).join('/'); const dt = p.timeDeltas[i]; self.set(k, (self.get(k) || 0) + dt); tot += dt; }
console.log('per run, ms (self time):', (tot / 1000 / N).toFixed(0), 'total');
[...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, 16).forEach(([k, v]) => console.log((v / 1000 / N).toFixed(1).padStart(7), k));
rmSync(dir, { recursive: true, force: true });
