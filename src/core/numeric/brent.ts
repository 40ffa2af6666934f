/** Result of a scalar root search. Solvers never stop quietly: `converged` says whether it worked. */
export interface RootResult {
  root: number;
  converged: boolean;
  iterations: number;
  /** |f(root)| at the returned point. */
  residual: number;
}

/**
 * Brent's method for a root of f on a bracket [a, b] with f(a)·f(b) ≤ 0.
 *
 * Source: R. P. Brent, *Algorithms for Minimization without Derivatives* (1973), ch. 4, the
 * `zero` procedure (inverse quadratic interpolation, secant and bisection safeguards).
 * Units: those of f's argument. Valid range: any finite bracket with a sign change.
 * @throws RangeError when the bracket holds no sign change or the ends are not finite.
 * @example brent((x) => x * x - 2, 0, 2).root // 1.4142135623730951
 */
export function brent(
  f: (x: number) => number,
  a: number,
  b: number,
  tol = 1e-13,
  maxIter = 200,
): RootResult {
  let fa = f(a);
  let fb = f(b);
  if (!Number.isFinite(fa) || !Number.isFinite(fb)) throw new RangeError(`brent: f not finite at bracket ends [${a}, ${b}]`);
  if (fa === 0) return { root: a, converged: true, iterations: 0, residual: 0 };
  if (fb === 0) return { root: b, converged: true, iterations: 0, residual: 0 };
  if (fa * fb > 0) throw new RangeError(`brent: no sign change on [${a}, ${b}] (f = ${fa}, ${fb})`);
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let iter = 1; iter <= maxIter; iter++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b; b = c; c = a;
      fa = fb; fb = fc; fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const xm = 0.5 * (c - b);
    if (Math.abs(xm) <= tol1 || fb === 0) return { root: b, converged: true, iterations: iter, residual: Math.abs(fb) };
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * xm * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * xm * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      p = Math.abs(p);
      if (2 * p < Math.min(3 * xm * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = xm;
        e = d;
      }
    } else {
      d = xm;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : xm > 0 ? tol1 : -tol1;
    fb = f(b);
    if (!Number.isFinite(fb)) throw new RangeError(`brent: f not finite at ${b}`);
  }
  return { root: b, converged: false, iterations: maxIter, residual: Math.abs(fb) };
}
