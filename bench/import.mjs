// Benchmark (issue 3): import a 1,000,000-row tensile record as a stream (readRecordFile) — peak
// memory and time — against the file's size. Each import runs in its own child process so the peak
// RSS is that of the import alone. Run after `npm run build`:
//   node bench/import.mjs
import { spawnSync } from 'node:child_process';
import { createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

if (process.argv[2] === 'child') {
  const { readRecordFile } = await import('../dist/records/node.js');
  const before = process.resourceUsage().maxRSS;
  const t0 = performance.now();
  const r = await readRecordFile(process.argv[3]);
  const ms = performance.now() - t0;
  console.log(JSON.stringify({ rows: r.rows, ms, maxRSSkB: process.resourceUsage().maxRSS, baseRSSkB: before, last: [r.strain[r.rows - 1], r.stress[r.rows - 1]] }));
  process.exit(0);
}

const ROWS = Number(process.env.ROWS ?? 1_000_000);
const dir = mkdtempSync(join(tmpdir(), 'sl-import-'));
const file = join(dir, 'big.csv');
// An invented record: metadata, a header, a units row, then ROWS rows of time, strain (%), stress (MPa), force (kN).
await new Promise((resolve, reject) => {
  const w = createWriteStream(file);
  w.on('error', reject);
  w.write('Record:\tINVENTED benchmark record\nGauge length:\t50\tmm\nTime\tStrain\tStress\tForce\ns\t%\tMPa\tkN\n');
  let i = 0;
  const write = () => {
    let ok = true;
    while (i < ROWS && ok) {
      let chunk = '';
      for (let k = 0; k < 1000 && i < ROWS; k++, i++) {
        const e = (i / ROWS) * 30;
        chunk += `${(i * 0.01).toFixed(2)}\t${e.toFixed(6)}\t${(250 + 300 * (1 - Math.exp(-e / 8)) + ((i * 7919) % 13) / 13).toFixed(4)}\t${(5 + e).toFixed(5)}\n`;
      }
      ok = w.write(chunk);
    }
    if (i < ROWS) w.once('drain', write);
    else w.end(resolve);
  };
  write();
});
const size = statSync(file).size;
const r = spawnSync(process.execPath, [import.meta.filename, 'child', file], { encoding: 'utf8' });
if (r.status !== 0) { console.error(r.stderr); process.exit(1); }
const res = JSON.parse(r.stdout);
const base = spawnSync(process.execPath, ['-e', 'import("' + new URL('../dist/records/node.js', import.meta.url).href + '").then(() => console.log(process.resourceUsage().maxRSS))'], { encoding: 'utf8' });
console.log(`node ${process.version}, ${new Date().toISOString().slice(0, 10)}`);
console.log(`import of ${res.rows.toLocaleString('en')} rows (${(size / 1048576).toFixed(1)} MB file, tab-separated, metadata + units row): ${(res.ms / 1000).toFixed(2)} s, ${(res.rows / res.ms * 1000 / 1e6).toFixed(2)} M rows/s`);
console.log(`peak RSS of the importing process ${(res.maxRSSkB / 1024).toFixed(0)} MB; a process that only loads the module: ${(Number(base.stdout) / 1024).toFixed(0)} MB; the two columns kept as Float64Array: ${(res.rows * 16 / 1048576).toFixed(0)} MB (grown by doubling: up to 2×)`);
rmSync(dir, { recursive: true, force: true });
