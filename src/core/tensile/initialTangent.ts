import { cholesky, choleskySolve } from '../fit/symmetric.js';

/** The initial tangent of a rise that bends from low stress, with the bend's power and fit. */
export interface InitialTangent {
  /** Tangent modulus at the band's lower end, MPa. */
  modulus: number;
  /** Its standard error, MPa (residual scale floored at the record's noise). */
  standardError: number;
  /** Strain where the tangent line meets zero stress (toe-compensated origin), fraction. */
  toeStrain: number;
  /** Exponent m of the bend term that fitted best. */
  power: number;
  /** Points in the band. */
  points: number;
  /** R² of the bent fit (strain on stress), 0–1. */
  r2: number;
  /** How far the bend term lowered the residual sum, in noise variances (the test statistic). */
  improvement: number;
  /** The fitted curve: strain at stress σ (MPa), fraction (dilution correction not applied). */
  strainAt: (sigma: number) => number;
}

/** Exponents of the bend term tried (Ramberg–Osgood exponents of metals run from about 3 to 40 — common practice; 2, a plain parabola, is the generic curvature of a toe's end or of noise, not a bend from low stress). */
const POWERS = [3, 3.5, 4, 4.5, 5, 5.5, 6, 7, 8, 9, 10, 12, 14, 16, 20, 25, 32, 40] as const;

/**
 * Initial tangent of an elastic rise that has no straight part: gradual yielding, as in austenitic
 * stainless steels and many aluminium alloys, where plastic strain grows from low stress on (the
 * Ramberg–Osgood form ε = σ/E + K·(σ/σ0.2)^n; Ramberg & Osgood, NACA TN 902, 1943). A straight line over
 * a band such as 10–40 % of Rp0.2 then measures a secant slope several percent below E, and the offset
 * line drawn with it meets the curve too high: Rp0.2 is overstated, the unsafe direction.
 *
 * Model over the band [from, to), in the Ramberg–Osgood form (strain as a function of stress):
 *   ε = a + σ/E + d·(σ/S)^m,  d ≥ 0,  S = the band's highest stress.
 * For each m in {3, 3.5, 4, …, 40} the three coefficients (a, 1/E, d) come from linear least squares; the m with
 * the smallest residual sum wins, refined by golden-section search between its grid neighbours. The bend is taken
 * as real when it lowers the straight line's residual sum by more than `sigmas`² variances (an F-test with the variance known: the larger of the record's stress
 * noise carried into strain, (noise/E)², and the residual variance). The noise sits in the stress, the
 * regressor here, which flattens the fitted 1/E by the factor λ = 1 − noise²/var(σ) (regression dilution;
 * Fuller, Measurement Error Models, 1987, §1.1); 1/E is divided by λ to undo it. E's standard error follows
 * from the least-squares covariance of 1/E (σ̂²·(JᵀJ)⁻¹ with J the columns [1, σ − σ̄, w, d·w·ln(σ/S)], w = (σ/S)^m:
 * the exponent counted as fitted; Bates & Watts, Nonlinear Regression Analysis, 1988, §2.3, from memory), widened
 * by n/n_eff for autocorrelated residuals (n_eff = n(1 − r₁)/(1 + r₁)), carried through 1/x. The toe-compensated origin is
 * a, the strain where the fitted curve meets zero stress.
 *
 * Units: strain fraction, stress MPa, E MPa. Valid: at least 12 points in the band, rising.
 * Returns null when the band is too short, the bend is not significant, or the fit is degenerate.
 * @example initialTangent(eps, sig, 10, 200, 0.5) // { modulus: 195000, power: 4, ... } on a Ramberg–Osgood rise
 */
export function initialTangent(strain: ArrayLike<number>, stress: ArrayLike<number>, from: number, to: number, noise: number, sigmas = 3): InitialTangent | null {
  const n = to - from;
  if (n < 12) return null;
  let S = 0, sbar = 0, xbar = 0;
  for (let i = from; i < to; i++) { S = Math.max(S, stress[i]!); sbar += stress[i]!; xbar += strain[i]!; }
  sbar /= n; xbar /= n;
  if (!(S > 0)) return null;
  // Straight line x = a + b·σ first (its residual sum is the reference); sums about the band means.
  let sss = 0, ssx = 0, sxx = 0;
  for (let i = from; i < to; i++) {
    const v = stress[i]! - sbar, x = strain[i]! - xbar;
    sss += v * v; ssx += v * x; sxx += x * x;
  }
  if (!(sss > 0) || !(ssx > 0)) return null;
  const bLine = ssx / sss;
  const ssrLine = Math.max(0, sxx - ssx * bLine);
  let best: { ssr: number; m: number; c: Float64Array; inv: Float64Array } | null = null;
  // v = σ − σ̄, r = max(σ, 0)/S and x = e − x̄ once per point (the same values the loops below computed per power),
  // and the per-power sums in a small function of its own: this function runs once per record, and its loops ran
  // unoptimised with a heap number per value (speed follow-up J). Same operations in the same order.
  const cols = bandColumns(strain, stress, from, to, sbar, S, xbar);
  const sums = new Float64Array(8);
  const fitPower = (m: number) => {
    // Normal equations of [1, v, w], v = σ − σ̄ (MPa), w = (σ/S)^m, for x − x̄.
    bendSums(cols, m, sums);
    const s1 = sums[0]!, s2 = sums[1]!, s11 = sums[2]!, s12 = sums[3]!, s22 = sums[4]!, t0 = sums[5]!, t1 = sums[6]!, t2 = sums[7]!;
    const L = cholesky(new Float64Array([n, s1, s2, s1, s11, s12, s2, s12, s22]), 3);
    if (!L) return null;
    const c = choleskySolve(L, 3, new Float64Array([t0, t1, t2]));
    if (!(c[2]! >= 0) || !(c[1]! > 0)) return null;
    const ssr = Math.max(0, sxx - (c[0]! * t0 + c[1]! * t1 + c[2]! * t2));
    return { ssr, m, c, inv: choleskySolve(L, 3, new Float64Array([0, 1, 0])) };
  };
  let bi = -1;
  for (let k = 0; k < POWERS.length; k++) {
    const f = fitPower(POWERS[k]!);
    if (f && (!best || f.ssr < best.ssr)) { best = f; bi = k; }
  }
  // The exponent between the grid's neighbours of the best one: golden-section search on the residual sum (on clean,
  // finely sampled records the grid's step moved the tangent by 1–3 %).
  if (best) {
    let a: number = POWERS[Math.max(0, bi - 1)]!, b: number = POWERS[Math.min(POWERS.length - 1, bi + 1)]!;
    const gr = (Math.sqrt(5) - 1) / 2;
    for (let k = 0; k < 30 && b - a > 1e-3; k++) {
      const m1 = b - gr * (b - a), m2 = a + gr * (b - a);
      const f1 = fitPower(m1), f2 = fitPower(m2);
      if (!f1 || !f2) break;
      if (f1.ssr < f2.ssr) b = m2; else a = m1;
      const f = f1.ssr < f2.ssr ? f1 : f2;
      if (f.ssr < best.ssr) best = f;
    }
  }
  if (!best) return null;
  const s2 = Math.max((noise * bLine) ** 2, best.ssr / (n - 4));
  const improvement = (ssrLine - best.ssr) / s2;
  if (!(improvement > sigmas * sigmas)) return null;
  const lambda = 1 - (noise * noise) / (sss / n);
  if (!(lambda > 0.5)) return null; // the band's stress spread is not well above the noise
  // Residuals of closely spaced points are not independent (filtered load signals, a model that does not
  // quite fit): the variance is widened by n/n_eff, n_eff from the residuals' lag-1 autocorrelation r₁,
  // n_eff = n(1 − r₁)/(1 + r₁) (Bayley & Hammersley, J. R. Stat. Soc. Suppl. 8, 1946), as the law fits do.
  const lag = bendResidualLag(cols, best.m, best.c[0]!, best.c[1]!, best.c[2]!);
  const r0 = lag[0], r1 = lag[1];
  const rho = r0 > 0 ? Math.max(0, Math.min(0.95, r1 / r0)) : 0;
  const widen = (1 + rho) / (1 - rho);
  const b = best.c[1]! / lambda;
  // The exponent is fitted too: 1/E's variance from the four-parameter normal matrix (the exponent's column is
  // ∂x/∂m = d·(σ/S)^m·ln(σ/S)), which widens it where slope and exponent trade off.
  const inv11 = exponentInverse11(cols, best.m, best.c[2]!) ?? best.inv[1]!;
  const seB = Math.sqrt(s2 * inv11 * widen) / lambda;
  const E = 1 / b;
  if (!Number.isFinite(E) || !(seB >= 0)) return null;
  // Strain at zero stress: x̄ + c0 − b·σ̄ − d·0 (the bend term vanishes at σ = 0).
  const toeStrain = xbar + best.c[0]! - best.c[1]! * sbar;
  const { c, m } = best;
  const strainAt = (sigma: number) => xbar + c[0]! + c[1]! * (sigma - sbar) + c[2]! * (Math.max(sigma, 0) / S) ** m;
  return { modulus: E, standardError: seB * E * E, toeStrain, power: m, points: n, r2: sxx > 0 ? Math.max(0, 1 - best.ssr / sxx) : 1, improvement, strainAt };
}

/** Element (1, 1) of the inverse normal matrix of the columns [1, v, w, d·w·ln r] (w = r^m), or null when singular. */
function exponentInverse11(c: BandColumns, m: number, d: number): number | null {
  if (!(d > 0)) return null;
  const M = new Float64Array(16), col = new Float64Array(4);
  const { v: vs, r: rs } = c;
  for (let i = 0; i < vs.length; i++) {
    const r = rs[i]!, w = r ** m;
    col[0] = 1; col[1] = vs[i]!; col[2] = w; col[3] = r > 0 ? d * w * Math.log(r) : 0;
    for (let a = 0; a < 4; a++) for (let b = a; b < 4; b++) M[a * 4 + b]! += col[a]! * col[b]!;
  }
  for (let a = 0; a < 4; a++) for (let b = 0; b < a; b++) M[a * 4 + b] = M[b * 4 + a]!;
  const L = cholesky(M, 4);
  if (!L) return null;
  const x = choleskySolve(L, 4, new Float64Array([0, 1, 0, 0]))[1]!;
  return x > 0 && Number.isFinite(x) ? x : null;
}

/** The band's points as initialTangent uses them: v = σ − σ̄, r = max(σ, 0)/S, x = e − x̄ (MPa, 1, strain). */
interface BandColumns { v: Float64Array; r: Float64Array; x: Float64Array }

function bandColumns(strain: ArrayLike<number>, stress: ArrayLike<number>, from: number, to: number, sbar: number, S: number, xbar: number): BandColumns {
  const n = to - from;
  const v = new Float64Array(n), r = new Float64Array(n), x = new Float64Array(n);
  for (let i = from; i < to; i++) {
    v[i - from] = stress[i]! - sbar;
    r[i - from] = Math.max(stress[i]!, 0) / S;
    x[i - from] = strain[i]! - xbar;
  }
  return { v, r, x };
}

/** Σv, Σw, Σv², Σvw, Σw², Σx, Σvx, Σwx with w = r^m, in index order, into out[0…8). */
function bendSums(c: BandColumns, m: number, out: Float64Array): void {
  const { v: vs, r: rs, x: xs } = c;
  let s1 = 0, s2 = 0, s11 = 0, s12 = 0, s22 = 0, t0 = 0, t1 = 0, t2 = 0;
  for (let i = 0; i < vs.length; i++) {
    const v = vs[i]!, w = rs[i]! ** m, x = xs[i]!;
    s1 += v; s2 += w; s11 += v * v; s12 += v * w; s22 += w * w;
    t0 += x; t1 += v * x; t2 += w * x;
  }
  out[0] = s1; out[1] = s2; out[2] = s11; out[3] = s12; out[4] = s22; out[5] = t0; out[6] = t1; out[7] = t2;
}

/** Σres² and the lag-1 Σresᵢresᵢ₋₁ of x − (c0 + c1·v + c2·r^m), in index order. */
function bendResidualLag(c: BandColumns, m: number, c0: number, c1: number, c2: number): [number, number] {
  const { v: vs, r: rs, x: xs } = c;
  let r0 = 0, r1 = 0, prev = NaN;
  for (let i = 0; i < vs.length; i++) {
    const w = rs[i]! ** m;
    const res = xs[i]! - (c0 + c1 * vs[i]! + c2 * w);
    r0 += res * res;
    if (i > 0) r1 += res * prev;
    prev = res;
  }
  return [r0, r1];
}
