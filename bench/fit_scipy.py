#!/usr/bin/python3
"""Side-by-side partner of bench/fit.mjs: fits the same laws to the same flow curve with SciPy's
curve_fit (method 'trf' because the fits are bounded; default tolerances; 2-point Jacobian), from the
same start values and within the same bounds, and prints per law the median time of `repeat` runs,
the residual sum of squares and the parameters as JSON. Usage: fit_scipy.py DATA.json
(DATA: {"x": [...], "y": [...], "repeat": 3, "laws": {name: {"start": [...], "lower": [...], "upper": [...]}}})."""
import json
import sys
import time

import numpy as np
from scipy.optimize import curve_fit
import scipy


def hollomon(x, K, n): return K * x ** n
def ludwik(x, s0, K, n): return s0 + K * x ** n
def swift(x, K, e0, n): return K * (e0 + x) ** n
def voce(x, s0, Q, b): return s0 + Q * -np.expm1(-b * x)
def hockett_sherby(x, sat, s0, a, p): return sat - (sat - s0) * np.exp(-a * x ** p)
def swift_voce(x, al, K, e0, n, s0, Q, b): return al * swift(x, K, e0, n) + (1 - al) * voce(x, s0, Q, b)


LAWS = {'hollomon': hollomon, 'ludwik': ludwik, 'swift': swift, 'voce': voce, 'hockettSherby': hockett_sherby, 'swiftVoce': swift_voce}

d = json.load(open(sys.argv[1]))
x = np.asarray(d['x'], dtype=float)
y = np.asarray(d['y'], dtype=float)
out = {'scipy': scipy.__version__, 'numpy': np.__version__, 'laws': {}}
for name, spec in d['laws'].items():
    f = LAWS[name]
    times = []
    p = None
    ok = True
    repeat = d.get('repeat', 3)
    for k in range(repeat + 1 if repeat > 0 else 1):  # the first run warms up and is not timed (repeat 0: one timed run)
        t0 = time.perf_counter()
        try:
            p, _cov = curve_fit(f, x, y, p0=spec['start'], bounds=(spec['lower'], spec['upper']), method='trf', maxfev=20000)
        except Exception as e:  # report, never hide
            ok = False
            out['laws'][name] = {'error': str(e)}
            break
        if k > 0 or repeat == 0:
            times.append(time.perf_counter() - t0)
    if not ok:
        continue
    r = f(x, *p) - y
    out['laws'][name] = {'ms': 1000 * sorted(times)[len(times) // 2], 'ssr': float(np.dot(r, r)), 'params': [float(v) for v in p]}
print(json.dumps(out))
