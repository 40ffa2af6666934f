// `analyze` speed and fit quality (issue 12), side by side in one run:
//  1. `node bin/strainledger.js analyze` of an INVENTED 1,000,000-row record (bench/records-gen.mjs)
//     under /usr/bin/time -v (wall time and peak RSS of the whole command, Node start-up included),
//     beside numpy.loadtxt only READING the same file. Aims: ≤ 2× numpy's read, peak < 300 MB.
//  2. the same command on a 100,000-point record beside the SciPy six-law script (bench/fit_scipy.py:
//     bounded curve_fit, method trf, the same bounds and start values) fitting that record's flow
//     curve (fit time only, Python start-up and reading excluded). Aim: ≥ 10× faster.
//  3. each law's RMSE on the FULL flow curve, ours (block averages above 4000 points) against
//     SciPy's point-by-point fit of the full curve. Aim: no worse than SciPy's by more than 1 %.
// Run after `npm run build`: node bench/analyze.mjs   (SKIP_1M_SCIPY=1 skips SciPy on the 1M curve;
// BEFORE=/path/to/older/bin/strainledger.js also times an older build on the 1M record, interleaved)
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyzeRecord, lawBounds, LAW_NAMES, startValues, START_SAMPLE } from '../dist/core/index.js';
import { readRecordFile } from '../dist/records/node.js';
import { writeInventedRecord } from './records-gen.mjs';

const repo = join(import.meta.dirname, '..');
const dir = mkdtempSync(join(tmpdir(), 'sl-analyze-'));
const la = () => loadavg().map((x) => x.toFixed(1)).join(' ');
const med = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
console.log(`node ${process.version}, ${new Date().toISOString()}; load average ${la()} (2 cores)`);

/** Wall seconds and peak RSS (MB) of `analyze FILE --format json`, and its JSON. */
function ours(file, bin = join(repo, 'bin', 'strainledger.js')) {
  const r = spawnSync('/usr/bin/time', ['-v', process.execPath, bin, 'analyze', file, '--format', 'json'], { encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.status !== 0) throw new Error(r.stderr);
  const wall = r.stderr.match(/Elapsed \(wall clock\) time \(h:mm:ss or m:ss\): (\d+):([\d.]+)/);
  const rss = Number(r.stderr.match(/Maximum resident set size \(kbytes\): (\d+)/)[1]);
  return { s: Number(wall[1]) * 60 + Number(wall[2]), mb: rss / 1024, json: JSON.parse(r.stdout) };
}
const pyRead = join(dir, 'read.py');
writeFileSync(pyRead, `import sys, time\nimport numpy as np\nt0 = time.perf_counter()\na = np.loadtxt(sys.argv[1], delimiter=',', skiprows=1)\nprint(time.perf_counter() - t0)\n`);
const numpyRead = (file) => Number(spawnSync('python3', [pyRead, file], { encoding: 'utf8' }).stdout);

/** SciPy's fits of the flow curve of `file` (same bounds, same start values as ours). */
async function scipy(file, repeat) {
  const rec = await readRecordFile(file);
  const fc = analyzeRecord(rec, { fit: false }).flowCurve;
  const n = fc.strain.length;
  const step = Math.max(1, Math.floor(n / START_SAMPLE));
  const xs = [], ys = [];
  for (let i = 0; i < n; i += step) { xs.push(fc.strain[i]); ys.push(fc.stress[i]); }
  const laws = {};
  for (const law of LAW_NAMES) {
    const { lower, upper } = lawBounds(law);
    laws[law] = { start: startValues(law, xs, ys).map((v, j) => Math.min(upper[j] * (1 - 1e-9), Math.max(lower[j] + 1e-9, v))), lower, upper };
  }
  const data = join(dir, 'curve.json');
  writeFileSync(data, JSON.stringify({ x: Array.from(fc.strain), y: Array.from(fc.stress), repeat, laws }));
  const r = spawnSync('python3', [join(import.meta.dirname, 'fit_scipy.py'), data], { encoding: 'utf8', maxBuffer: 1 << 26 });
  if (r.status !== 0) throw new Error(r.stderr);
  const out = JSON.parse(r.stdout);
  for (const v of Object.values(out.laws)) if (v.ssr !== undefined) v.rmse = Math.sqrt(v.ssr / n);
  return { n, ...out };
}

function rmseTable(o, sp) {
  console.log('    law             RMSE ours MPa   RMSE SciPy MPa   ours/SciPy   fitted on (ours)');
  let worst = 0;
  for (const f of o.json.fits) {
    const s = sp.laws[f.law];
    const ratio = s?.rmse ? f.rmse / s.rmse : NaN;
    if (ratio > worst) worst = ratio;
    console.log(`    ${f.law.padEnd(15)} ${f.rmse.toFixed(5).padStart(12)}   ${s?.rmse ? s.rmse.toFixed(5).padStart(14) : (s?.error ?? '—').slice(0, 30)}   ${Number.isFinite(ratio) ? ratio.toFixed(5).padStart(10) : '         —'}   ${f.basis.blockSize > 1 ? `${f.basis.fittedPoints} averages of ${f.basis.blockSize}` : 'all points'}`);
  }
  console.log(`    aim: each law's RMSE ≤ 1.01 × SciPy's: worst ratio ${worst.toFixed(5)} — ${worst <= 1.01 ? 'met' : 'NOT met'}`);
}

// 1. 1,000,000 rows.
const big = join(dir, 'r1m.csv');
const bigRows = await writeInventedRecord(big, 1_000_000);
const runsO = [], runsN = [], runsB = [];
const before = process.env.BEFORE;
for (let k = 0; k < 3; k++) { runsO.push(ours(big)); runsN.push(numpyRead(big)); if (before) runsB.push(ours(big, before)); }
const o1 = med(runsO.map((r) => r.s)), n1 = med(runsN), m1 = Math.max(...runsO.map((r) => r.mb));
console.log(`\n1. analyze of ${bigRows.toLocaleString('en')} rows (flow curve ${runsO[0].json.fits[0].points.toLocaleString('en')} points): ${o1.toFixed(2)} s (${runsO.map((r) => r.s.toFixed(2)).join(', ')}), peak RSS ${m1.toFixed(0)} MB`);
console.log(`   numpy.loadtxt reading it: ${n1.toFixed(2)} s (${runsN.map((x) => x.toFixed(2)).join(', ')}); ratio ours/numpy ${(o1 / n1).toFixed(2)}`);
if (before) {
  const b1 = med(runsB.map((r) => r.s));
  const same = runsB.every((r) => JSON.stringify(r.json.fits) === JSON.stringify(runsO[0].json.fits) && r.json.tensileStrength === runsO[0].json.tensileStrength);
  console.log(`   older build (${before}): ${b1.toFixed(2)} s (${runsB.map((r) => r.s.toFixed(2)).join(', ')}), peak RSS ${Math.max(...runsB.map((r) => r.mb)).toFixed(0)} MB; older/this ${(b1 / o1).toFixed(2)}; same fits and Rm: ${same}`);
}
console.log(`   aims: ≤ 2× numpy's read — ${o1 <= 2 * n1 ? 'met' : 'NOT met'}; peak RSS < 300 MB — ${m1 < 300 ? 'met' : 'NOT met'}   (load average ${la()})`);

// 2. 100,000 points.
const mid = join(dir, 'r100k.csv');
const midRows = await writeInventedRecord(mid, 100_000);
const runs2 = [];
for (let k = 0; k < 3; k++) runs2.push(ours(mid));
const o2 = med(runs2.map((r) => r.s));
const sp2 = await scipy(mid, 3);
const spTotal = Object.values(sp2.laws).reduce((a, v) => a + (v.ms ?? 0), 0) / 1000;
console.log(`\n2. analyze of ${midRows.toLocaleString('en')} rows: ${o2.toFixed(2)} s (${runs2.map((r) => r.s.toFixed(2)).join(', ')}), peak RSS ${Math.max(...runs2.map((r) => r.mb)).toFixed(0)} MB`);
console.log(`   SciPy ${sp2.scipy} (NumPy ${sp2.numpy}) six-law fit of its ${sp2.n}-point flow curve: ${spTotal.toFixed(2)} s (${Object.entries(sp2.laws).map(([l, v]) => `${l} ${v.ms ? (v.ms / 1000).toFixed(2) : 'error'}`).join(', ')})`);
console.log(`   ratio SciPy/ours ${(spTotal / o2).toFixed(1)} — aim ≥ 10×: ${spTotal / o2 >= 10 ? 'met' : 'NOT met'}   (load average ${la()})`);
rmseTable(runs2[0], sp2);

// 3. RMSE on the full 1,000,000-point curve against SciPy's point-by-point fit of it.
if (!process.env.SKIP_1M_SCIPY) {
  const sp1 = await scipy(big, 0);
  console.log(`\n3. RMSE on the full ${sp1.n.toLocaleString('en')}-point flow curve, SciPy fitting every point once (${Object.values(sp1.laws).reduce((a, v) => a + (v.ms ?? 0), 0) / 1000} s in all):`);
  rmseTable(runsO[0], sp1);
}
console.log(`\nload average at the end ${la()}`);
rmSync(dir, { recursive: true, force: true });
