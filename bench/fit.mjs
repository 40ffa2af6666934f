// Benchmark (issue 3): analyse a 100,000-point tensile record and fit every law (time, peak memory),
// then fit the same flow curves side by side with SciPy's curve_fit (bench/fit_scipy.py, Debian's
// python3-scipy at /usr/bin/python3): speed and residual. Run after `npm run build`:
//   node bench/fit.mjs
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { analyzeRecord, fitLaw, lawBounds, LAW_NAMES, LAW_PARAMETERS, startValues, synthesizeRecord, xoshiro128ss } from '../dist/core/index.js';
import { parseRecordText } from '../dist/records/index.js';

const median = (a) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)];
const mb = (kb) => (kb / 1024).toFixed(0);
console.log(`node ${process.version}, ${new Date().toISOString().slice(0, 10)}`);

// 1. An invented 100,000-point record (Swift law, noise, toe, necking), seeded.
const rec = synthesizeRecord({ law: { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, elasticModulus: 200000, rng: xoshiro128ss(42), noise: 1, toe: 1e-4, step: 2.6e-6, necking: { extraStrain: 0.06, dropTo: 0.7 } });
const rss0 = process.resourceUsage().maxRSS;
const times = [];
let a;
analyzeRecord(rec, { fit: false }); // warm-up (JIT), not timed
for (let k = 0; k < 3; k++) {
  const t0 = performance.now();
  a = analyzeRecord(rec);
  times.push(performance.now() - t0);
}
const rss1 = process.resourceUsage().maxRSS;
console.log(`analyse + fit all ${LAW_NAMES.length} laws, ${rec.strain.length} points (flow curve ${a.flowCurve.strain.length} points): median ${median(times).toFixed(0)} ms over 3 runs (${times.map((t) => t.toFixed(0)).join(', ')}); peak RSS ${mb(rss1)} MB (${mb(rss0)} MB before analysing)`);
for (const f of a.fits.fits) console.log(`  ${f.law.padEnd(14)} converged ${f.converged} in ${f.iterations} iterations, rmse ${f.rmse.toFixed(3)} MPa`);

// 2. Side by side with SciPy on the same flow curves, same start values, same bounds.
const py = '/usr/bin/python3';
const hasScipy = spawnSync(py, ['-c', 'import scipy'], { encoding: 'utf8' }).status === 0;
const curves = [['100k-point invented record', a.flowCurve]];
const rec42 = parseRecordText(readFileSync(join(import.meta.dirname, '..', 'test', 'fixtures', '42crmos4', '46NT99.csv'), 'utf8'), { file: '46NT99.csv' });
curves.push(['42CrMoS4 46NT99 (open data, CC BY 4.0)', analyzeRecord(rec42, { fit: false }).flowCurve]);
const dir = mkdtempSync(join(tmpdir(), 'sl-bench-'));
for (const [name, fc] of curves) {
  const laws = {};
  const ours = {};
  for (const law of LAW_NAMES) {
    const { lower, upper } = lawBounds(law);
    // SciPy's trf needs a start strictly inside finite bounds: same clamp for both.
    const start = startValues(law, fc.strain, fc.stress).map((v, j) => Math.min(upper[j] * (1 - 1e-9), Math.max(lower[j] + 1e-9, v)));
    laws[law] = { start, lower, upper };
    const ts = [];
    let f;
    for (let k = 0; k < 4; k++) {
      if (k === 0) { fitLaw(law, fc.strain, fc.stress, { start: Object.fromEntries(start.map((v, j) => [LAW_PARAMETERS[law][j].name, v])) }); continue; } // warm-up (JIT), not timed
      const t0 = performance.now();
      f = fitLaw(law, fc.strain, fc.stress, { start: Object.fromEntries(start.map((v, j) => [LAW_PARAMETERS[law][j].name, v])) });
      ts.push(performance.now() - t0);
    }
    ours[law] = { ms: median(ts), ssr: f.rmse ** 2 * fc.strain.length, converged: f.converged };
  }
  console.log(`\n${name}: ${fc.strain.length} points; median of 3 runs each`);
  let sp = null;
  if (hasScipy) {
    const file = join(dir, 'data.json');
    writeFileSync(file, JSON.stringify({ x: fc.strain, y: fc.stress, repeat: 3, laws }));
    const r = spawnSync(py, [join(import.meta.dirname, 'fit_scipy.py'), file], { encoding: 'utf8', maxBuffer: 1 << 26 });
    if (r.status === 0) sp = JSON.parse(r.stdout);
    else console.log(`  (SciPy run failed: ${r.stderr.trim().split('\n').pop()})`);
  } else console.log('  (SciPy not installed: apt-get install -y python3-scipy)');
  if (sp) console.log(`  SciPy ${sp.scipy}, NumPy ${sp.numpy}; curve_fit method trf, 2-point Jacobian, default tolerances`);
  console.log('  law             ours ms   scipy ms   scipy/ours   SSR ours        SSR scipy       SSR ours/scipy');
  for (const law of LAW_NAMES) {
    const o = ours[law], s = sp?.laws[law];
    const sms = s?.ms, sssr = s?.ssr;
    console.log(`  ${law.padEnd(14)} ${o.ms.toFixed(1).padStart(8)}  ${sms === undefined ? '       —' : sms.toFixed(1).padStart(9)}   ${sms === undefined ? '    —' : (sms / o.ms).toFixed(2).padStart(9)}    ${o.ssr.toExponential(6).padEnd(14)}  ${sssr === undefined ? (s?.error ? 'error: ' + s.error.slice(0, 40) : '—') : sssr.toExponential(6).padEnd(14)}  ${sssr === undefined ? '' : (o.ssr / sssr).toFixed(6)}${o.converged ? '' : '  (ours: not converged)'}`);
  }
}

