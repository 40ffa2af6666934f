// Re-runs the SciPy reference of test/core/fit/open-records.test.ts: every law fitted to the flow curve of each of
// the ten open 42CrMoS4 records (MaterialDigital, CC BY 4.0; test/fixtures/42crmos4) as analyzeRecord extracts it,
// by scipy.optimize.curve_fit (method 'trf', the bounds of LAW_PARAMETERS as lawBounds gives them, ftol = xtol =
// gtol = 1e-14, max_nfev 20000), from our start values: startValues for five laws, and for the Swift–Voce blend
// the start fitLawGroup uses (α = 0.5 with our Swift and Voce fits), α free in SciPy. Prints the test's `ref` table
// (RMSE per law, MPa). Needed whenever the record estimators move the flow curves.
// Usage: npm run build && node bench/fitter-scipy-open.mjs [DIR]   (DIR: another folder of records, e.g. the TS275 records
// of ../shared/datasets/ts275-steel-tension for test/core/tensile/ts275-optional.test.ts)
import { spawnSync } from 'node:child_process';
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { analyzeRecord, fitLaw, lawBounds, LAW_NAMES, startValues } from '../dist/core/index.js';
import { parseRecordText } from '../dist/records/index.js';

const dir = process.argv[2] ?? join(import.meta.dirname, '..', 'test', 'fixtures', '42crmos4');
const input = [];
for (const file of readdirSync(dir).filter((f) => f.endsWith('.csv')).sort()) {
  const fc = analyzeRecord(parseRecordText(readFileSync(join(dir, file), 'utf8'), { file }), { fit: false }).flowCurve;
  const x = Array.from(fc.strain), y = Array.from(fc.stress);
  const s = fitLaw('swift', x, y).params, v = fitLaw('voce', x, y).params;
  const laws = {};
  for (const law of LAW_NAMES) {
    const p0 = law === 'swiftVoce' ? [0.5, s.K, s.eps0, s.n, v.sigma0, v.Q, v.b] : startValues(law, x, y);
    laws[law] = { p0, ...lawBounds(law) };
  }
  input.push({ name: file.replace('.csv', ''), x, y, laws });
}
const py = `
import json, sys, numpy as np
from scipy.optimize import curve_fit
import scipy
def sw(e, K, e0, n): return K * (e0 + e)**n
def vo(e, s0, Q, b): return s0 + Q * -np.expm1(-b * e)
F = {'hollomon': lambda e, K, n: K * e**n, 'ludwik': lambda e, s0, K, n: s0 + K * e**n, 'swift': sw, 'voce': vo,
     'hockettSherby': lambda e, sat, s0, a, p: sat - (sat - s0) * np.exp(-a * e**p),
     'swiftVoce': lambda e, al, K, e0, n, s0, Q, b: al * sw(e, K, e0, n) + (1 - al) * vo(e, s0, Q, b)}
print('    // SciPy %s, numpy %s' % (scipy.__version__, np.__version__))
for rec in json.load(sys.stdin):
    x = np.array(rec['x']); y = np.array(rec['y']); out = []
    for law, L in rec['laws'].items():
        p0 = np.clip(L['p0'], L['lower'], L['upper'])
        p, _ = curve_fit(F[law], x, y, p0=p0, bounds=(L['lower'], L['upper']), method='trf', ftol=1e-14, xtol=1e-14, gtol=1e-14, max_nfev=20000)
        r = y - F[law](x, *p)
        out.append('%s: %r' % (law, float(np.sqrt(np.mean(r * r)))))
    print("    '%s': { points: %d, %s }," % (rec['name'], len(x), ', '.join(out)))
`;
const out = spawnSync('python3', ['-c', py], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 1 << 26 });
process.stdout.write(out.stdout); process.stderr.write(out.stderr);
process.exit(out.status ?? 1);
