// Re-runs the SciPy reference of test/core/fit/fitter.test.ts ("fitLaw against SciPy curve_fit on the same flow
// curve"): the flow curve of the 42CrMoS4 open record 46NT99 (MaterialDigital, CC BY 4.0) as analyzeRecord
// extracts it, fitted by scipy.optimize.curve_fit (method 'trf', the bounds of LAW_PARAMETERS with open ends moved
// inward as lawBounds does, ftol = xtol = gtol = 1e-14, p0 = our startValues). Prints the test's `ref` lines.
// Needed whenever the record estimators move the flow curve's ends. Usage: npm run build && node bench/fitter-scipy-ref.mjs
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyzeRecord, lawBounds, startValues } from '../dist/core/index.js';
import { parseRecordText } from '../dist/records/index.js';

const repo = join(import.meta.dirname, '..');
const rec = parseRecordText(readFileSync(join(repo, 'test', 'fixtures', '42crmos4', '46NT99.csv'), 'utf8'), { file: '46NT99.csv' });
const fc = analyzeRecord(rec, { fit: false }).flowCurve;
const laws = ['hollomon', 'voce', 'swift'];
const input = { x: Array.from(fc.strain), y: Array.from(fc.stress), laws: Object.fromEntries(laws.map((l) => [l, { p0: startValues(l, fc.strain, fc.stress), ...lawBounds(l) }])) };
const py = `
import json, sys, numpy as np
from scipy.optimize import curve_fit
d = json.load(sys.stdin); x = np.array(d['x']); y = np.array(d['y'])
F = {'hollomon': lambda e, K, n: K * e**n, 'voce': lambda e, s0, Q, b: s0 + Q * (1 - np.exp(-b * e)), 'swift': lambda e, K, e0, n: K * (e0 + e)**n}
print('    // %d points' % len(x))
for law in ['hollomon', 'voce', 'swift']:
    L = d['laws'][law]
    p, pc = curve_fit(F[law], x, y, p0=L['p0'], bounds=(L['lower'], L['upper']), method='trf', ftol=1e-14, xtol=1e-14, gtol=1e-14)
    r = y - F[law](x, *p)
    print(f"    {law}: {{ p: [{', '.join(repr(float(v)) for v in p)}], se: [{', '.join(repr(float(v)) for v in np.sqrt(np.diag(pc)))}], rmse: {float(np.sqrt(np.mean(r*r)))!r} }},")
`;
const out = spawnSync('python3', ['-c', py], { input: JSON.stringify(input), encoding: 'utf8' });
process.stdout.write(out.stdout); process.stderr.write(out.stderr);
process.exit(out.status ?? 1);
