import { fitLaw } from '../fit/fitLaw.js';
import { studentTQuantile } from '../fit/studentT.js';
import type { LawName, LawSpec } from '../flow/types.js';
import { makeLaw } from '../flow/makeLaw.js';
import { solveSmall } from './localFit.js';
import type { LawFit } from '../fit/types.js';

/**
 * What findRateChange reads as a change of the test rate on the plastic part of a record, and how rateStep measures
 * the step of the flow stress there. Each constant is a choice of this project, tried on the ten open 42CrMoS4 records
 * and the 240 invented records of the property test (one rate each: no change found), on hold-out B (151 of its 200
 * records change rate ×2–27 with no step of the stress: 124 found, where they are, and no step taken out) and on
 * invented and open records with a step put in (test/core/tensile/rate-change.test.ts).
 */
export const RATE_CHANGE = {
  /** Smallest ratio of the strain per sample after and before (either way) read as a change: twice. */
  minRatio: 2,
  /**
   * The strain per sample steady on each side: the ratio between the window next to the change and the one
   * before it (after it) at most the jump's ratio to this power. A gradual change (the strain speeding up as the
   * curve leaves the elastic line under a constant crosshead speed or stress rate) fails it.
   */
  steady: 0.25,
  /** The secant slope over the two windows before the change at most this fraction of E: the curve is plastic there. */
  plasticSlope: 0.1,
  /** Fewest samples in each window of the search (two windows on each side of a change). */
  minWindow: 3,
  /**
   * The change of strain per sample must stand this many standard errors clear of the strain channel's noise (each
   * side's mean advance over its window errs by √2·σx/w, σx from the channel's second differences): near the end of
   * the search the windows shrink to a few samples, where an extensometer noisier than its step (2.9 µε against 1.7 µε
   * a sample on an invented 55,883-point record) read a "change" of 2.2× three samples before maximum force.
   */
  strainSigmas: 5,
  /** Fewest samples from the search's start to its end. */
  minSamples: 24,
  /**
   * A step is acted on (the flow curve after it scaled) when it is at least this many 95 % half-widths from 0
   * (about three standard errors) and at least `minStep` of the flow stress. A step scaled wrongly moves the laws and
   * Ag; one left unscaled only bends the laws as a record without this check did. Measured on hold-out B (151
   * records with a change of rate and no step): an earlier form (the local fit's step and half-width alone, taken out
   * at one half-width, no floor) read a step of 0.1–0.9 % from the noise or the laws' misfit on 13 noisy and 99
   * noise-free records; as made now, on none.
   */
  clearWidths: 1.5,
  minStep: 0.005,
  /** The second law's factor widens the interval only where its RMSE is at most this times the best law's. */
  comparableFit: 1.1,
  /** Fewest flow points on each side of the change for rateStep. */
  minSide: 10,
  /** Strain span on each side of the change of the local fit that reads the step (true plastic strain), at least `minPoints` points each side. */
  span: 0.005,
  minPoints: 8,
  /** The factor searched within [1 − range, 1 + range] (a step of up to 15 % either way). */
  range: 0.15,
  /** Flow points at most: a longer flow curve is taken as block means (each value of the step tried is a law fit). */
  maxPoints: 1000,
  /** The laws whose shape carries the curve across the step: the one that fits better is used. */
  laws: ['hockettSherby', 'swift'] as readonly LawName[],
} as const;

/** A change of the strain per sample on the plastic part of a record ({@link findRateChange}). */
export interface RateJump {
  /** Index (of the arrays searched) of the first sample at the new rate; `strain` its engineering strain (fraction). */
  index: number;
  strain: number;
  /** Strain per sample after the change over that before it (> 1: faster). With sampling uniform in time, the ratio of the rates. */
  ratio: number;
}

/**
 * A change of the test rate on the plastic part of a record: the strain per sample jumps by at least
 * RATE_CHANGE.minRatio between two steady runs. ISO 6892-1 method A lets the strain rate be raised once the yield
 * or proof strength is determined (from memory); the record's samples, uniform in time, then step apart. A change of
 * the logging rate alone looks the same (no step of the stress follows it: {@link rateStep}).
 *
 * Searched over samples [from, to] (the plastic part up to maximum force): the change is where the ratio of the
 * strain advanced per sample over the w samples after and before it is largest (w = a twelfth of the samples, fewer
 * near the ends, at least RATE_CHANGE.minWindow), accepted when the windows beyond those advance at the rates next to
 * them (steady), and the curve before it is plastic (secant below RATE_CHANGE.plasticSlope · E).
 *
 * Units: engineering strain (fraction), stress and E MPa. Valid: finite strain and stress. Cost: one pass over
 * [from, to], no logarithm.
 * @example
 * // 60 samples 0.0002 apart from 1 % strain, then 60 samples 0.0016 apart:
 * findRateChange(e, s, 0, 119, 200000) // { index: 60, strain: e[60], ratio: 8 }
 */
export function findRateChange(strain: ArrayLike<number>, stress: ArrayLike<number>, from: number, to: number, E: number): RateJump | null {
  const a0 = Math.max(0, Math.ceil(from)), b0 = Math.min(strain.length - 1, Math.floor(to));
  const n = b0 - a0;
  if (!(n >= RATE_CHANGE.minSamples) || !(E > 0)) return null;
  const w = Math.max(RATE_CHANGE.minWindow, Math.floor(n / 12));
  const at = largestRateJump(strain, a0, b0, w);
  if (at < 0) return null;
  const wb = Math.min(w, Math.floor((at - a0) / 2)), wa = Math.min(w, Math.floor((b0 - at) / 2));
  const before = (strain[at]! - strain[at - wb]!) / wb, after = (strain[at + wa]! - strain[at]!) / wa;
  const ratio = after / before;
  const jump = ratio >= 1 ? ratio : 1 / ratio;
  if (!(jump >= RATE_CHANGE.minRatio)) return null;
  const bb = (strain[at - wb]! - strain[at - 2 * wb]!) / wb, aa = (strain[at + 2 * wa]! - strain[at + wa]!) / wa;
  const limit = jump ** RATE_CHANGE.steady;
  if (!(bb > 0 && aa > 0) || Math.max(before / bb, bb / before) > limit || Math.max(after / aa, aa / after) > limit) return null;
  const sx = strainNoise(strain, a0, b0);
  if (!(Math.abs(after - before) >= RATE_CHANGE.strainSigmas * sx * Math.sqrt(2 / (wb * wb) + 2 / (wa * wa)))) return null;
  // Up to the sample before the change (the stress may already step at the change's own sample).
  const secant = (stress[at - 1]! - stress[at - 2 * wb]!) / (strain[at - 1]! - strain[at - 2 * wb]!);
  if (!(secant <= RATE_CHANGE.plasticSlope * E)) return null;
  return { index: at, strain: strain[at]!, ratio };
}

/** The step of the flow stress at a change of rate ({@link rateStep}). */
export interface RateStep {
  /** The factor f that brings the flow curve after the change to the level before it (σ·f), and its 95 % half-width. */
  factor: number;
  halfWidth95: number;
  /** True when the step is to be taken out: |factor − 1| at least RATE_CHANGE.clearWidths half-widths and RATE_CHANGE.minStep. */
  clear: boolean;
  /** The law whose shape carried the curve across the step, its RMSE (MPa) on the curve brought to one level. */
  law: LawName;
  rmse: number;
  /** True stress of that law at the change's plastic strain, MPa (the flow stress just before the change, at the first rate). */
  stressAt: number;
}

/**
 * The step of the flow stress at plastic strain `from` on a flow curve (true plastic strain, true stress, in the
 * record's order; the points from the first at or past `from` on are after the change):
 * 1. the factor f such that the curve with its part after the change multiplied by f is best fitted by one hardening
 *    law — the law taken with the step as a parameter, so that it need not bend to bridge it: the minimum of the law
 *    fit's residual sum of squares S(f) within [1 − range, 1 + range] by successive parabolas (Press et al.,
 *    *Numerical Recipes*, 3rd ed., §10.3), the law refitted at each f from the last fit, for each of
 *    RATE_CHANGE.laws; the one with the lower RMSE gives f. Straight lines or parabolas fitted next to the change
 *    alone mistook the bend of the curve near yield for a step on coarse records (46NT71 with a ×5 change and no step:
 *    +0.8 %).
 * 2. its 95 % half-width, three parts in quadrature: S's curvature at f (profile least squares with one parameter,
 *    S(f) − S(f̂) = t²·s², s² = S/(n − k − 1); Bates & Watts, *Nonlinear Regression Analysis*, §6.1, from memory),
 *    widened for correlated residuals (FitBasis.inflation); the other law's f, where it fits about as well
 *    (RATE_CHANGE.comparableFit); and a local fit at the change (one parabola with a step, over RATE_CHANGE.span of
 *    strain each side) of what the law leaves, whose standard error says how well the samples there pin a jump.
 * The step is `clear` (to be taken out) when |f − 1| is at least RATE_CHANGE.clearWidths half-widths and
 * RATE_CHANGE.minStep. Long curves are taken as block means (at most RATE_CHANGE.maxPoints, none across the change).
 *
 * Units: strain dimensionless, stress and `noise` (the record's, a floor of the local fit's scatter) MPa. Valid: at
 * least RATE_CHANGE.minSide points each side, every point finite with σ > 0 and εp > 0. Returns null when a side has
 * too few points or no law fits. Cost: about 15 law fits on at most maxPoints points.
 * @example rateStep(ep, sigma, 0.01, 0.5) // { factor ≈ 0.979, clear: true, law: 'hockettSherby', … } for a Voce curve 2.1 % higher from εp = 1 %
 */
export function rateStep(flowStrain: ArrayLike<number>, flowStress: ArrayLike<number>, from: number, noise = 0): RateStep | null {
  const nAll = flowStrain.length;
  // The points after the change: from the first at or past `from` on (the flow curve is in the record's order; a
  // noisy εp near the change does not move a point to the other side).
  const split = firstAtOrPast(flowStrain, from);
  // Block means of `size` consecutive points, no block across the change (the noise of each mean falls as 1/√size).
  const size = Math.max(1, Math.ceil(nAll / RATE_CHANGE.maxPoints));
  const xs: number[] = [], ys: number[] = [];
  let nb = 0, na = 0;
  for (let i = 0; i < nAll;) {
    const end = Math.min(i + size, i < split ? split : nAll);
    let sx = 0, sy = 0;
    for (let j = i; j < end; j++) { sx += flowStrain[j]!; sy += flowStress[j]!; }
    xs.push(sx / (end - i)); ys.push(sy / (end - i));
    if (i < split) nb++; else na++;
    i = end;
  }
  if (nb < RATE_CHANGE.minSide || na < RATE_CHANGE.minSide) return null;
  const n = xs.length;
  // Samples within `span` of the change on each side (at least minPoints each).
  let i0 = nb - 1;
  while (i0 > 0 && (from - xs[i0 - 1]! <= RATE_CHANGE.span || nb - i0 < RATE_CHANGE.minPoints)) i0--;
  let j1 = nb;
  while (j1 < n && (xs[j1]! - from <= RATE_CHANGE.span || j1 - nb < RATE_CHANGE.minPoints)) j1++;
  // 1. One law with the step as a parameter (the better of RATE_CHANGE.laws): the factor f whose curve, its part past
  // the change times f, the law fits best — the minimum of the fit's residual sum of squares S(f) by successive
  // parabolas (the law refitted at each f from the last fit; S is close to a parabola). A law fitted across an
  // unscaled step bends toward it; here it need not.
  const cur = new Float64Array(n);
  const scaleTo = (f: number) => { for (let i = 0; i < n; i++) cur[i] = i >= nb ? ys[i]! * f : ys[i]!; };
  const byLaw: { f: number; fit: LawFit; hw: number }[] = [];
  for (const name of RATE_CHANGE.laws) {
    let start: Record<string, number> | undefined;
    const ssr = (f: number): { s: number; fit: LawFit | null } => {
      scaleTo(f);
      try {
        const fit = fitLaw(name, xs, cur, start ? { start } : {});
        if (!(fit.rmse < Infinity)) return { s: Infinity, fit: null };
        start = fit.params;
        return { s: fit.rmse * fit.rmse * n, fit };
      } catch { return { s: Infinity, fit: null }; }
    };
    let f = 1, d = 0.02, curv = NaN;
    for (let round = 0; round < 4; round++) {
      const s0 = ssr(f).s, sp = ssr(f + d).s, sm = ssr(f - d).s;
      curv = (sp - 2 * s0 + sm) / (d * d);
      if (!(curv > 0 && curv < Infinity && s0 < Infinity)) break;
      const next = Math.min(1 + RATE_CHANGE.range, Math.max(1 - RATE_CHANGE.range, f - (sp - sm) / (2 * d * curv)));
      const moved = Math.abs(next - f);
      f = next;
      d = Math.max(1e-3, Math.min(d, 2 * moved));
      if (moved < 1e-4) break;
    }
    const at = ssr(f);
    if (!at.fit || !(curv > 0 && curv < Infinity)) continue;
    // Profile least squares with one parameter (Bates & Watts, *Nonlinear Regression Analysis*, §6.1, from memory):
    // S(f) − S(f̂) = t²·s² at the interval's ends, s² = S/(n − k − 1), widened for correlated residuals.
    const k = Object.keys(at.fit.params).length + 1;
    if (n - k < 1) continue;
    const hw = studentTQuantile(0.975, n - k) * Math.sqrt((2 * at.s) / (n - k) / curv) * (at.fit.basis.inflation || 1);
    byLaw.push({ f, fit: at.fit, hw });
  }
  if (!byLaw.length) return null;
  byLaw.sort((p, q) => p.fit.rmse - q.fit.rmse);
  const best = byLaw[0]!;
  // 2. How well the samples next to the change pin a jump: a local fit to what the law leaves (its misfit, smooth,
  // and any step it did not take up), whose half-width joins the interval. Its value is not used: on noisy
  // records the law's misfit near the start of the flow curve moved it by 2 standard errors (seed 6 of the property
  // test's cases: 2.0 % from the law, 1.4 % with the local fit's value, the truth 2.1 %).
  scaleTo(best.f);
  const L = makeLaw({ law: best.fit.law, ...best.fit.params } as LawSpec).stress;
  const res = new Float64Array(n);
  for (let i = 0; i < n; i++) res[i] = cur[i]! - L(xs[i]!);
  const local = stepFit(xs, res, i0, nb, nb, j1, from, noise / Math.sqrt(size));
  if (!local) return null;
  const before = L(from) + local.before; // the flow stress just before the change, from the law and the local fit
  if (!(before > 0)) return null;
  const factor = best.f;
  const hwLocal = (factor * studentTQuantile(0.975, local.dof) * local.se) / before;
  // The laws' shapes disagree where the curve near the change is short or bent: the other law's difference is added in
  // quadrature where it fits about as well (RMSE within RATE_CHANGE.comparableFit of the best's); a clearly worse
  // fit's factor says little (seed 6 of the property test's cases: Swift, RMSE 1.36 times Hockett–Sherby's, read a
  // 0.8 % step for a 2.1 % one).
  const other = byLaw[1];
  const hwLaw = other && other.fit.rmse <= RATE_CHANGE.comparableFit * best.fit.rmse ? Math.hypot(best.hw, best.f - other.f) : best.hw;
  // The two half-widths measure different things (the law's profile over the whole curve; how well the samples next
  // to the change pin a jump): added in quadrature. Their larger alone left the truth just outside on seed 13 of the
  // property test's cases (1.78 ± 0.31 % against 2.10 %).
  const hw = Math.hypot(hwLaw, hwLocal);
  const clear = Math.abs(factor - 1) >= Math.max(RATE_CHANGE.clearWidths * hw, RATE_CHANGE.minStep);
  return { factor, halfWidth95: hw, clear, law: best.fit.law, rmse: best.fit.rmse, stressAt: L(from) };
}

/** Index of the first value ≥ x (the length when none). */
export function firstAtOrPast(v: ArrayLike<number>, x: number): number {
  let i = 0;
  while (i < v.length && !(v[i]! >= x)) i++;
  return i;
}

/**
 * Least-squares fit over [b0, b1) (before a change) and [a0, a1) (after it) of one quadratic in x with a step δ added
 * after: y = c0 + c1·u + c2·u² + δ·[after], u = (x − x0)/h (x0 the change, h the largest |x − x0|): the bend is
 * taken from both sides and the step read at x0 (Draper & Smith, *Applied Regression Analysis*, 3rd ed., ch. 5 and
 * §14, a dummy variable). Returns δ, c0 (the value just before x0), δ's standard error s·√((XᵀX)⁻¹_δδ) with s the
 * residual standard deviation but at least `floor`, and the degrees of freedom; null when singular or too few points.
 */
function stepFit(x: ArrayLike<number>, y: ArrayLike<number>, b0: number, b1: number, a0: number, a1: number, x0: number, floor: number): { step: number; before: number; se: number; dof: number } | null {
  const K = 4, n = b1 - b0 + a1 - a0;
  if (n < K + 2) return null;
  let h = 0;
  for (let i = b0; i < b1; i++) h = Math.max(h, Math.abs(x[i]! - x0));
  for (let i = a0; i < a1; i++) h = Math.max(h, Math.abs(x[i]! - x0));
  if (!(h > 0)) return null;
  const S = new Float64Array(K * K), T = new Float64Array(K), row = new Float64Array(K);
  const add = (i: number, after: number) => {
    const u = (x[i]! - x0) / h;
    row[0] = 1; row[1] = u; row[2] = u * u; row[3] = after;
    for (let r = 0; r < K; r++) { T[r]! += row[r]! * y[i]!; for (let q = 0; q < K; q++) S[r * K + q]! += row[r]! * row[q]!; }
  };
  for (let i = b0; i < b1; i++) add(i, 0);
  for (let i = a0; i < a1; i++) add(i, 1);
  const c = solveSmall(S, T, K, 1e-12);
  const unit = solveSmall(S, new Float64Array([0, 0, 0, 1]), K, 1e-12);
  if (!c || !unit) return null;
  let ssr = 0;
  const res = (i: number, after: number) => { const u = (x[i]! - x0) / h; ssr += (y[i]! - (c[0]! + c[1]! * u + c[2]! * u * u + c[3]! * after)) ** 2; };
  for (let i = b0; i < b1; i++) res(i, 0);
  for (let i = a0; i < a1; i++) res(i, 1);
  const dof = n - K;
  const s = Math.max(Math.sqrt(ssr / dof), floor);
  // Residuals correlated from point to point (filtered noise, the law's misfit) carry fewer independent points: the
  // AR(1) variance factor (1 + ρ)/(1 − ρ) from the lag-1 autocorrelation of each side's residuals, ρ in [0, 0.9].
  let num = 0;
  const lag = (from: number, to: number, after: number) => {
    let prev = NaN;
    for (let i = from; i < to; i++) { const u = (x[i]! - x0) / h, r = y[i]! - (c[0]! + c[1]! * u + c[2]! * u * u + c[3]! * after); if (prev === prev) num += r * prev; prev = r; }
  };
  lag(b0, b1, 0); lag(a0, a1, 1);
  const rho = ssr > 0 ? Math.min(0.9, Math.max(0, num / ssr)) : 0;
  return { step: c[3]!, before: c[0]!, se: s * Math.sqrt(Math.max(0, unit[3]!) * (1 + rho) / (1 - rho)), dof };
}

/**
 * The c in [a0, b0] where the strain advanced per sample over the w samples after c and over the w before it differ
 * most in ratio (either way), both advances > 0; −1 when none. A function of its own: a record-long loop (see
 * analyzeRecord's note on such loops).
 */
function largestRateJump(strain: ArrayLike<number>, a0: number, b0: number, w: number): number {
  const m = RATE_CHANGE.minWindow;
  let best = 1, at = -1;
  for (let c = a0 + 2 * m; c <= b0 - 2 * m; c++) {
    // Windows of w samples, fewer near either end of the search (at least minWindow, two of them on each side).
    const wb = Math.min(w, (c - a0) >> 1), wa = Math.min(w, (b0 - c) >> 1);
    const e = strain[c]!, b = (e - strain[c - wb]!) * wa, a = (strain[c + wa]! - e) * wb;
    if (!(b > 0 && a > 0)) continue;
    const r = a > b ? a / b : b / a;
    if (r > best) { best = r; at = c; }
  }
  return at;
}

/**
 * The strain channel's noise sd over samples [a, b] from its second differences (steps that change smoothly leave
 * only the noise in them): σx = median |x[i+1] − 2x[i] + x[i−1]| / (0.6745·√6), the median for robustness (a change
 * of rate is one large second difference; MAD of a normal sample, common practice), over at most 20,001 evenly spread
 * differences. 0 for a noise-free or quantised channel whose second differences are mostly zero.
 */
function strainNoise(strain: ArrayLike<number>, a: number, b: number): number {
  const m = b - a - 1;
  if (m < 3) return 0;
  const step = Math.max(1, Math.floor(m / 20001));
  const d: number[] = [];
  for (let i = a + 1; i < b; i += step) d.push(Math.abs(strain[i + 1]! - 2 * strain[i]! + strain[i - 1]!));
  d.sort((x, y) => x - y);
  const med = d.length % 2 ? d[(d.length - 1) / 2]! : 0.5 * (d[d.length / 2 - 1]! + d[d.length / 2]!);
  return med / (0.6745 * Math.sqrt(6));
}
