import { InputError } from '../errors.js';

/**
 * Regularized incomplete beta function I_x(a, b), by the continued fraction of W. H. Press et al.,
 * *Numerical Recipes*, 3rd ed., §6.4 (eqs. 6.4.5–6.4.6, modified Lentz's method).
 * Valid for a, b > 0 and 0 ≤ x ≤ 1; relative accuracy about 1e-14.
 */
export function incompleteBeta(x: number, a: number, b: number): number {
  if (!(a > 0) || !(b > 0)) throw new InputError('a, b', [a, b], 'positive shape parameters');
  if (!(x >= 0 && x <= 1)) throw new InputError('x', x, 'a number in [0, 1]');
  if (x === 0 || x === 1) return x;
  const lnFront = lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log1p(-x);
  if (x < (a + 1) / (a + b + 2)) return (Math.exp(lnFront) * betaFraction(x, a, b)) / a;
  return 1 - (Math.exp(lnFront) * betaFraction(1 - x, b, a)) / b;
}

function betaFraction(x: number, a: number, b: number): number {
  const tiny = 1e-300;
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 10000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-15) return h;
  }
  return h;
}

/** ln Γ(x) for x > 0, Lanczos approximation (g = 7, 9 terms; Numerical Recipes §6.1), relative error < 1e-14. */
export function lnGamma(x: number): number {
  const g = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
    12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7];
  if (x < 0.5) return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - lnGamma(1 - x);
  const xx = x - 1;
  let s = g[0]!;
  for (let i = 1; i < 9; i++) s += g[i]! / (xx + i);
  const t = xx + 7.5;
  return 0.5 * Math.log(2 * Math.PI) + (xx + 0.5) * Math.log(t) - t + Math.log(s);
}

/**
 * Cumulative distribution of Student's t with `dof` degrees of freedom:
 * F(t) = 1 − ½·I_{ν/(ν+t²)}(ν/2, ½) for t ≥ 0 (Abramowitz & Stegun, *Handbook of Mathematical
 * Functions*, 26.7.1 with 26.5.27). Valid: dof > 0, any finite t.
 * @example studentTCdf(0, 5) // 0.5
 */
export function studentTCdf(t: number, dof: number): number {
  if (!(dof > 0)) throw new InputError('dof', dof, 'a number > 0');
  const tail = 0.5 * incompleteBeta(dof / (dof + t * t), dof / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/**
 * Quantile of Student's t: the t with studentTCdf(t, dof) = p, by bisection to 1e-12 on the CDF above.
 * Used for 95 % confidence intervals of fitted parameters (p = 0.975).
 * Valid: 0 < p < 1, dof ≥ 1. Source of the definition: Abramowitz & Stegun 26.7.
 * @example studentTQuantile(0.975, 10) // 2.2281388519649385 (scipy.stats.t.ppf gives the same)
 */
export function studentTQuantile(p: number, dof: number): number {
  if (!(p > 0 && p < 1)) throw new InputError('p', p, 'a probability in (0, 1)');
  if (!(dof >= 1)) throw new InputError('dof', dof, 'a number ≥ 1');
  if (p === 0.5) return 0;
  if (p < 0.5) return -studentTQuantile(1 - p, dof);
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, dof) < p) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-13 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (studentTCdf(mid, dof) < p) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
