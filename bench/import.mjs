// Import speed (issue 12): a 1,000,000-row two-column CSV (INVENTED record, bench/records-gen.mjs,
// about 19 MB) read side by side in one run, each reader in its own child process (time of the read
// inside the process; peak RSS of the process):
//   ours      readRecordFile (dist/records/node.js): 1 MiB pieces of the file's bytes through the byte row scanner
//   udsv      udsv 0.7.3 typedCols on the whole file read as one string (the fastest general CSV
//             parser measured on this machine class, ../shared/DESIGN.md §8)
//   csv-parse csv-parse 7.0.3 with per-record `info`, the reader before issue 12 (set OLD=1; ~10 s)
//   numpy     numpy.loadtxt(delimiter=',', skiprows=1) (python3 on the PATH)
//   quoted    readRecordFile on the same rows with every cell in double quotes ("0.125","205.3"), as some
//             exports write them (read by the same byte scanner since the eighth session; csv-parse before)
//   text      parseRecordText of the whole file as one string: the record bench's reader (in its web worker)
// Run after `npm run build`: node bench/import.mjs   (ROWS=... for another size)
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeInventedRecord } from './records-gen.mjs';

const who = process.argv[2];
if (who === 'text') {
  const { parseRecordText } = await import('../dist/records/index.js');
  const text = readFileSync(process.argv[3], 'utf8');
  const t0 = performance.now();
  const r = parseRecordText(text, { file: 'big.csv' });
  const ms = performance.now() - t0;
  console.log(JSON.stringify({ rows: r.rows, ms, maxRSSkB: process.resourceUsage().maxRSS, last: r.stress[r.rows - 1] }));
  process.exit(0);
}
if (who === 'ours' || who === 'udsv' || who === 'csv-parse') {
  const file = process.argv[3];
  // Modules are loaded before the clock starts (the same for each reader): the rate is the reading's.
  const { readRecordFile } = who === 'ours' ? await import('../dist/records/node.js') : {};
  const { inferSchema, initParser } = who === 'udsv' ? await import('udsv') : {};
  const { parse } = who === 'csv-parse' ? await import('csv-parse') : {};
  const t0 = performance.now();
  let rows, last;
  if (who === 'ours') {
    const r = await readRecordFile(file);
    rows = r.rows; last = r.stress[r.rows - 1];
  } else if (who === 'udsv') {
    const text = readFileSync(file, 'utf8');
    const schema = inferSchema(text);
    const cols = initParser(schema).typedCols(text);
    rows = cols[0].length; last = cols[1][rows - 1];
  } else {
    const { createReadStream } = await import('node:fs');
    rows = 0;
    await new Promise((resolve, reject) => {
      createReadStream(file).pipe(parse({ from_line: 2, info: true, trim: true, relax_column_count: true, skip_empty_lines: true }))
        .on('data', (r) => { rows++; last = Number(r.record[1]); }).on('end', resolve).on('error', reject);
    });
  }
  const ms = performance.now() - t0;
  console.log(JSON.stringify({ rows, ms, maxRSSkB: process.resourceUsage().maxRSS, last }));
  process.exit(0);
}

const ROWS = Number(process.env.ROWS ?? 1_000_000);
const dir = mkdtempSync(join(tmpdir(), 'sl-import-'));
const file = join(dir, 'big.csv');
const rows = await writeInventedRecord(file, ROWS);
const size = statSync(file).size;
const quotedFile = join(dir, 'quoted.csv');
writeFileSync(quotedFile, readFileSync(file, 'utf8').replace(/[^,\n]+/g, '"$&"'));
const run = (name) => {
  const [who, f] = name === 'quoted' ? ['ours', quotedFile] : [name, file];
  const r = spawnSync(process.execPath, [import.meta.filename, who, f], { encoding: 'utf8', maxBuffer: 1 << 24 });
  if (r.status !== 0) return { error: r.stderr.trim().split('\n').pop() };
  return JSON.parse(r.stdout);
};
const py = `import sys, time, resource
import numpy as np
t0 = time.perf_counter()
a = np.loadtxt(sys.argv[1], delimiter=',', skiprows=1)
ms = (time.perf_counter() - t0) * 1000
print('{"rows": %d, "ms": %f, "maxRSSkB": %d, "last": %r, "numpy": "%s"}' % (a.shape[0], ms, resource.getrusage(resource.RUSAGE_SELF).ru_maxrss, float(a[-1, 1]), np.__version__))`;
const pyFile = join(dir, 'loadtxt.py');
writeFileSync(pyFile, py);
const runPy = () => {
  const r = spawnSync('python3', [pyFile, file], { encoding: 'utf8' });
  return r.status === 0 ? JSON.parse(r.stdout) : { error: r.stderr.trim().split('\n').pop() };
};
console.log(`node ${process.version}, ${new Date().toISOString()}; file: ${rows.toLocaleString('en')} rows, ${(size / 1048576).toFixed(1)} MB, two columns; load average before ${loadavg().map((x) => x.toFixed(1)).join(' ')} (2 cores)`);
const names = ['ours', 'udsv', 'numpy', 'quoted', 'text', ...(process.env.OLD ? ['csv-parse'] : [])];
const results = Object.fromEntries(names.map((n) => [n, []]));
// Three rounds, readers interleaved, so load changes hit each alike; the median is reported.
for (let round = 0; round < 3; round++) for (const n of names) results[n].push(n === 'numpy' ? runPy() : run(n));
const med = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const summary = {};
for (const n of names) {
  const ok = results[n].filter((r) => !r.error);
  if (!ok.length) { console.log(`  ${n.padEnd(9)} failed: ${results[n][0].error}`); continue; }
  const ms = med(ok.map((r) => r.ms));
  summary[n] = ms;
  console.log(`  ${n.padEnd(9)} ${(ms / 1000).toFixed(3)} s (${ok.map((r) => (r.ms / 1000).toFixed(2)).join(', ')})  ${(ok[0].rows / ms * 1000 / 1e6).toFixed(2)} M rows/s  peak RSS ${(med(ok.map((r) => r.maxRSSkB)) / 1024).toFixed(0)} MB  rows ${ok[0].rows}  last stress ${ok[0].last}${ok[0].numpy ? `  (numpy ${ok[0].numpy})` : ''}`);
}
if (summary.ours) {
  console.log(`  ratios: udsv/ours ${(summary.udsv / summary.ours).toFixed(2)}, numpy/ours ${(summary.numpy / summary.ours).toFixed(2)}`);
  console.log(`  aim ≥ 2 M rows/s: ${(rows / summary.ours * 1000 / 1e6).toFixed(2)} M rows/s — ${rows / summary.ours * 1000 >= 2e6 ? 'met' : 'NOT met'}`);
}
console.log(`  load average after ${loadavg().map((x) => x.toFixed(1)).join(' ')}`);
rmSync(dir, { recursive: true, force: true });
