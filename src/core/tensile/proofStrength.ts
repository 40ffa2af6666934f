import { studentTQuantile } from '../fit/studentT.js';
import { movingAverage, polynomialFit } from './localFit.js';
import { recordNoiseWide } from './recordNoise.js';

/** Half the samples around the offset crossing its noise is estimated from. */
const RP_NOISE_HALF = 64;

/**
 * Proof strength, plastic extension: the stress where the line parallel to the elastic line, offset by
 * `offset` strain, meets the curve — Rp in ISO 6892-1 §3.10.3.1 and Figure 3 (0.2 % offset: Rp0.2);
 * "offset method", ASTM E8 §7.7.1. Found as the first sign change of g = σ − E·(e − e0 − offset)
 * after `fromIndex`, linearly interpolated between the two bracketing points; with `noise` > 0 (the
 * record's noise sd, MPa) the crossing is read from a least-squares parabola through the samples
 * whose plastic strain is within [offset/2, 2·offset] (at least 7), not from two noisy samples, with its standard
 * error when `lineVariance` is given (the parabola's prediction error at the crossing, widened for correlated residuals, and `lineVariance`, the
 * variance of the elastic line's strain at a stress (strain², from {@link elasticLineVariance}), carried through the
 * offset line). The noise of that error is the one about the crossing: `recordNoiseWide` over the 64 samples before
 * and after the first sign change where the record holds them, else `noise` (the open 46NT71 scatters 2 MPa about a
 * local smooth on its elastic rise and while it necks, 1 MPa about its offset crossing; with the record-wide figure
 * its Rp0.2 was warned uncertain, 1113–1151 MPa). `noiseLag1` (0–0.9, the record-wide lag-1 correlation of the noise,
 * {@link noiseLag1}) is the floor of the window's own residual lag-1 in that error: a parabola through a dozen samples
 * reads a correlation of 0.7 as about 0.
 * Units: strain fraction, stresses and E in MPa. Valid: offset > 0.
 * @returns the stress in MPa and the (fractional) index, or null when the curve never crosses the line.
 * @example proofStrength([0, 0.002, 0.004, 0.006], [0, 400, 440, 450], 200000, 0, 0.002) // ≈ 436.4 MPa
 */
export function proofStrength(
  strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, offset: number, fromIndex = 0, toIndex = strain.length, noise = 0, lineVariance?: (stress: number) => number, noiseLag1 = 0,
): { stress: number; index: number; standardError?: number; halfWidth95?: number } | null {
  const i = firstCrossing(strain, stress, E, toe, offset, fromIndex, toIndex);
  if (i < 0) return null;
  const prev = stress[i - 1]! - E * (strain[i - 1]! - toe - offset), cur = stress[i]! - E * (strain[i]! - toe - offset);
  const t = prev / (prev - cur);
  const raw = { stress: stress[i - 1]! + t * (stress[i]! - stress[i - 1]!), index: i - 1 + t };
  if (!(noise > 0)) return raw;
  // The noise where the curve meets the offset line: the samples from RP_NOISE_HALF before the crossing to as many
  // after it (8 blocks of 16 at least for recordNoiseWide), else the record's.
  const a = Math.max(0, i - RP_NOISE_HALF), b = Math.min(toIndex, i + RP_NOISE_HALF);
  const local = b - a >= 2 * RP_NOISE_HALF ? recordNoiseWide(stress, a, b) : noise;
  return smoothCrossing(strain, stress, E, toe, offset, i, toIndex, local, lineVariance, noiseLag1) ?? raw;
}

// The record-long loops below are small functions of their own, without closures: proofStrength runs five
// times per record (three offsets, and Rp at both ends of E's interval), and on a 1,000,000-row record its
// loops through closures ran unoptimised long enough to be 50 ms of the analysis (speed follow-up J). The
// same operations in the same order: the same numbers.

/**
 * The first i in (fromIndex, toIndex) where g = σ − E·(e − e0 − offset) changes sign from > 0 to ≤ 0
 * (g(i − 1) > 0, g(i) ≤ 0), or −1. Units: strain fraction, MPa.
 */
function firstCrossing(strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, offset: number, fromIndex: number, toIndex: number): number {
  let prevPositive = stress[fromIndex]! - E * (strain[fromIndex]! - toe - offset) > 0;
  for (let i = fromIndex + 1; i < toIndex; i++) {
    const cur = stress[i]! - E * (strain[i]! - toe - offset);
    if (prevPositive && cur <= 0) return i;
    prevPositive = cur > 0;
  }
  return -1;
}

/** True when the samples i, i + dir, i + 2·dir all leave [lo, hi] in plastic strain e − e0 − σ/E (or the record). */
function leaves(strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, lo: number, hi: number, i: number, dir: number, toIndex: number): boolean {
  for (let k = 0; k < 3; k++) {
    const j = i + k * dir;
    if (j < 0 || j >= toIndex) return true;
    const v = strain[j]! - toe - stress[j]! / E;
    if (v >= lo && v <= hi) return false;
  }
  return true;
}

/** First index of the window: moved down from c while the samples below do not leave [lo, hi] (see smoothCrossing). */
function windowStart(strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, lo: number, hi: number, c: number, toIndex: number): number {
  let a = c;
  while (a - 1 >= 0 && !leaves(strain, stress, E, toe, lo, hi, a - 1, -1, toIndex)) a--;
  return a;
}

/** Last index of the window: moved up from c while the samples above do not leave [lo, hi]. */
function windowEnd(strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, lo: number, hi: number, c: number, toIndex: number): number {
  let b = c;
  while (b + 1 < toIndex && !leaves(strain, stress, E, toe, lo, hi, b + 1, 1, toIndex)) b++;
  return b;
}

/**
 * The offset-line crossing read from a local least-squares parabola s(e) instead of two noisy samples:
 * the samples around the crossing whose plastic strain e − e0 − s/E lies in [offset/2, 2·offset] (at
 * least 7; the run ends at three samples in a row outside), so the estimate's noise is about σ̂·√(3/m) instead
 * of σ̂, and the first sign change of a noisy record (early by the noise) only picks the neighbourhood. Null when the fit
 * does not cross the line inside its own span (the raw crossing is used then). Returns the crossing's standard error
 * too (the parabola's prediction error and the modulus's, see below).
 */
function smoothCrossing(strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, offset: number, c: number, toIndex: number, noise: number, lineVariance?: (stress: number) => number, noiseLag1 = 0): { stress: number; index: number; standardError?: number; halfWidth95?: number } | null {
  const lo = 0.5 * offset, hi = 2 * offset;
  // The window ends where three samples in a row leave [lo, hi]: one noisy sample (in load or extension, the
  // strain of a dense record is not even monotone under extensometer noise) does not cut it short.
  const a = windowStart(strain, stress, E, toe, lo, hi, c, toIndex), b = windowEnd(strain, stress, E, toe, lo, hi, c, toIndex);
  if (b - a + 1 < 7) return null;
  const f = polynomialFit(strain, stress, a, b + 1, 2);
  if (!f) return null;
  const G = (e: number) => f.at(e) - E * (e - toe - offset);
  const x01 = spanOf(strain, a, b);
  let x0 = x01[0], x1 = x01[1];
  if (!(G(x0) > 0 && G(x1) <= 0)) return null;
  for (let k = 0; k < 80 && x1 - x0 > 1e-14; k++) { const m = 0.5 * (x0 + x1); if (G(m) > 0) x0 = m; else x1 = m; }
  const e = 0.5 * (x0 + x1);
  // Fractional index by the strain of the neighbouring samples.
  let i = a;
  while (i < b && strain[i + 1]! < e) i++;
  const t = strain[i + 1]! > strain[i]! ? (e - strain[i]!) / (strain[i + 1]! - strain[i]!) : 0;
  // Standard error of the crossing. The parabola's value at e has variance s²·xᵀ(XᵀX)⁻¹x, x = (1, u, u²) (Draper &
  // Smith ch. 5), s the larger of σ̂ and the residual scatter, widened by (1 + ρ)/(1 − ρ) for residuals correlated
  // from sample to sample (lag-1 ρ ≥ 0); a change δ of the curve moves the crossing's stress by δ·E/(E − f′). The
  // elastic line's own error (slope and toe, `lineVariance`: the variance of its strain at the crossing's stress)
  // shifts the offset line sideways by Δe, which moves the crossing's stress by f′·Δe·E/(E − f′).
  const at = { stress: f.at(e), index: i + Math.min(1, Math.max(0, t)) };
  if (!lineVariance) return at;
  const S = new Float64Array(5);
  const r0 = windowMoments(strain, stress, a, b, f.xm, f.h, f.c[0]!, f.c[1]!, f.c[2]!, S);
  const r00 = r0[0], r01 = r0[1];
  const own = r00 > 0 ? Math.min(0.9, Math.max(0, r01 / r00)) : 0;
  // The window's own lag-1 reads correlated noise low (a parabola through 13 samples takes up most of it): the
  // record-wide figure is the floor. The degrees of freedom stay the window's (they are those of its residual scatter).
  const rho = Math.min(0.9, Math.max(own, noiseLag1));
  const s2 = Math.max(noise * noise, f.ssr / Math.max(1, f.n - 3)) * (1 + rho) / (1 - rho);
  const ue = (e - f.xm) / f.h;
  const lev = quadForm3(S, [1, ue, ue * ue]);
  const slope = (f.c[1]! + 2 * f.c[2]! * ue) / f.h;
  const gain = E / Math.max(E - slope, 1e-9 * E);
  const sFit = Math.sqrt(Math.max(0, s2 * lev)) * gain;
  const sE = lineVariance ? Math.abs(slope) * Math.sqrt(Math.max(0, lineVariance(f.at(e)))) * gain : 0;
  // 95 % half-width with Student's t on the window's effective degrees of freedom n(1 − ρ)/(1 + ρ) − 3 (its own ρ).
  const se = Math.hypot(sFit, sE);
  const dof = Math.max(1, (f.n * (1 - own)) / (1 + own) - 3);
  return { ...at, standardError: se, halfWidth95: studentTQuantile(0.975, dof) * se };
}

/** Smallest and largest strain of samples a…b (Math.min/Math.max in index order from ±Infinity, as written before). */
function spanOf(strain: ArrayLike<number>, a: number, b: number): [number, number] {
  let x0 = strain[a]!, x1 = strain[a]!;
  for (let i = a + 1; i <= b; i++) { x0 = Math.min(x0, strain[i]!); x1 = Math.max(x1, strain[i]!); }
  return [x0, x1];
}

/**
 * Power sums S[q] = Σ uᵏ (q = 0…4, u = (e − xm)/h, each power by repeated multiplication from 1, as PolyFit
 * builds them) over samples a…b into S, and the residuals' Σr² and lag-1 Σrᵢrᵢ₋₁ about the parabola
 * c0 + c1·u + c2·u² (evaluated as PolyFit.at does: ((0·u + c2)·u + c1)·u + c0). Returns [Σr², Σrᵢrᵢ₋₁].
 */
function windowMoments(strain: ArrayLike<number>, stress: ArrayLike<number>, a: number, b: number, xm: number, h: number, c0: number, c1: number, c2: number, S: Float64Array): [number, number] {
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, r00 = 0, r01 = 0, prev = 0;
  for (let k = a; k <= b; k++) {
    const e = strain[k]!;
    const u = (e - xm) / h;
    const p2 = u * u, p3 = p2 * u, p4 = p3 * u;
    s0 += 1; s1 += u; s2 += p2; s3 += p3; s4 += p4;
    const w = (e - xm) / h;
    const r = stress[k]! - (((0 * w + c2) * w + c1) * w + c0);
    r00 += r * r; if (k > a) r01 += r * prev; prev = r;
  }
  S[0] = s0; S[1] = s1; S[2] = s2; S[3] = s3; S[4] = s4;
  return [r00, r01];
}

/** xᵀ M⁻¹ x for the symmetric 3×3 moment matrix M[r][c] = S[r + c] (Hankel), by the adjugate; Infinity when singular. */
function quadForm3(S: ArrayLike<number>, x: readonly number[]): number {
  const a = S[0]!, b = S[1]!, c = S[2]!, d = S[3]!, e = S[4]!;
  // M = [[a, b, c], [b, c, d], [c, d, e]]
  const A00 = c * e - d * d, A01 = -(b * e - c * d), A02 = b * d - c * c;
  const A11 = a * e - c * c, A12 = -(a * d - b * c), A22 = a * c - b * b;
  const det = a * A00 + b * A01 + c * A02;
  if (!(Math.abs(det) > 0)) return Infinity;
  const [x0, x1, x2] = x as [number, number, number];
  return (A00 * x0 * x0 + A11 * x1 * x1 + A22 * x2 * x2 + 2 * (A01 * x0 * x1 + A02 * x0 * x2 + A12 * x1 * x2)) / det;
}

/**
 * Proof strength, total extension Rt (ISO 6892-1 §3.10.3.3): the stress where the total extension
 * (toe-compensated) first reaches `total`, linearly interpolated. Rt0.5: total = 0.005.
 * Units: strain fraction, stress MPa. @returns MPa, or null when never reached.
 * @example totalExtensionStrength([0, 0.004, 0.006], [0, 400, 420], 0, 0.005) // 410
 */
export function totalExtensionStrength(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, total: number, toIndex = strain.length): number | null {
  for (let i = 1; i < toIndex; i++) {
    const a = strain[i - 1]! - toe, b = strain[i]! - toe;
    if (a < total && b >= total) return stress[i - 1]! + ((total - a) / (b - a)) * (stress[i]! - stress[i - 1]!);
  }
  return null;
}

/**
 * Proof strength where the offset line meets a yield plateau (discontinuous yielding, ISO 6892-1 §3.10.3.1
 * construction). On a serrated plateau the offset line, far steeper than the serrations, first meets the curve
 * where the curve is lowest near the crossing: at the local level when the serrations are slow (a smooth of the
 * samples follows them), at the troughs when they are too fast for the smooth. So: a moving average over w
 * samples (w from the noise, so its sd is about 0.15 % of the level, at most a quarter of the plateau) read at the
 * crossing, minus half the spread of the serrations the average cannot follow — √(3·excess) with excess the mean
 * square of the samples about the average beyond the noise's share σ̂²·(1 − 1/w), used when it is clear of a
 * variance's sampling error 2·σ̂²·√(2/m) and of a quarter of σ̂² (the noise estimate's own error; a spread under
 * 1.7σ̂ is not corrected) (a sawtooth or triangle caught at scattered phases is uniform over its
 * width A: variance A²/12). The range also reaches the serrations' band about an average of an eighth of the plateau
 * (serrations faster than the sampling look slow to the w-sample average; see the code). Units: MPa. Valid: a plateau
 * [from, to) of at least 10 samples holding `at`.
 * @returns MPa, or null when the plateau is too short.
 * @example plateauProofStrength(strain, stress, 120, 80, 400, 1.5)?.stress // the plateau's level at sample 120, MPa
 */
export function plateauProofStrength(strain: ArrayLike<number>, stress: ArrayLike<number>, at: number, from: number, to: number, noise: number): { stress: number; range: [number, number] } | null {
  const m = to - from;
  if (m < 10 || at < from || at >= to) return null;
  void strain;
  let mean = 0;
  for (let i = from; i < to; i++) mean += stress[i]!;
  mean /= m;
  const w = Math.max(3, Math.min(Math.ceil((noise / (0.0015 * Math.abs(mean))) ** 2), Math.floor(m / 4))) | 1;
  const ma = movingAverage(stress, from, to, w);
  let v = 0;
  for (let i = from; i < to; i++) v += (stress[i]! - ma[i - from]!) ** 2;
  v /= m;
  // The noise's share of that scatter, measured where there are no serrations: the same moving average on the
  // hardening branch right after the plateau (as long as the plateau, at least 3 windows). Load noise that is
  // correlated from sample to sample (a filter in the machine) scatters about a moving average more than the
  // white-noise estimate σ̂ says; without this its excess would be taken for serrations.
  let share = noise * noise * (1 - 1 / w);
  const nh = Math.min(m, stress.length - to);
  if (nh >= Math.max(10, 3 * w)) {
    const mh = movingAverage(stress, to, to + nh, w);
    let vh = 0;
    for (let i = 0; i < nh; i++) vh += (stress[to + i]! - mh[i]!) ** 2;
    share = Math.max(share, vh / nh);
  }
  const clear = Math.max(2 * Math.sqrt(2 / m), 0.25) * noise * noise;
  const excess = v - share;
  const half = excess > clear ? Math.sqrt(3 * excess) : 0;
  const c = ma[at - from]!, se = noise / Math.sqrt(w);
  const range: [number, number] = [c - half - 3 * se, c + half + 3 * se];
  // The serrations' whole spread, about an average too wide to follow them: a sawtooth faster than the sampling is
  // caught at phases that drift slowly from sample to sample, looks slow to the w-sample average, and that average
  // follows part of it (an INVENTED plateau, serrations of 2.3 % at a period of one sample spacing: the excess about
  // it read 5.4 MPa² against 12 of a uniform band, and Rp0.2 1.6 % above the troughs, where the noise-free curve
  // meets the offset line, with no warning). The record cannot tell such a band from serrations as slow as they look,
  // which the offset line meets at the local level: the value stays the local reading, and the range reaches the
  // band's edges, the wide average's level ± √(3·excess).
  const W = Math.max(w, Math.floor(m / 8)) | 1;
  if (W > w) {
    const wa = movingAverage(stress, from, to, W);
    let vw = 0;
    for (let i = from; i < to; i++) vw += (stress[i]! - wa[i - from]!) ** 2;
    const excessW = vw / m - Math.max(share, noise * noise * (1 - 1 / W));
    // For the range alone a smaller excess counts: three standard errors of the difference of two mean squares of m
    // samples (each σ̂²·√(2/m): 3·√2·√(2/m)·σ̂² = 6σ̂²/√m), and a tenth of σ̂² for the noise estimate's own error (an
    // INVENTED plateau under 0.85 % noise: serrations of 2.2 %, a band of 5.6 MPa² against 19.7 of noise, Rp0.2 read
    // 1.35 % above the troughs with no warning).
    const clearW = Math.max(6 / Math.sqrt(m), 0.1) * noise * noise;
    if (excessW > clearW) {
      const hw = Math.sqrt(3 * excessW), cw = wa[at - from]!;
      range[0] = Math.min(range[0], cw - hw - 3 * se);
      range[1] = Math.max(range[1], cw + hw + 3 * se);
    }
  }
  return { stress: c - half, range };
}
