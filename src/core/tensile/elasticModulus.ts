import { InputError } from '../errors.js';
import { linearFit } from '../fit/linearFit.js';
import { studentTQuantile } from '../fit/studentT.js';
import { lineResidualLag1, polynomialFit } from './localFit.js';
import { proofStrength } from './proofStrength.js';
import { initialTangent } from './initialTangent.js';
import { recordNoiseWide } from './recordNoise.js';
import type { ElasticWindow } from './types.js';

/**
 * How E is found, stated once.
 * - `band`: the final least-squares band, fractions of the record's own Rp0.2 estimate. ISO 6892-1:2016
 *   Annex G practice is a band between about 10 % and 40 % (some editions and ASTM E111 practice go to
 *   50 %) of the proof strength — from memory, not checked against the printed standard; we start at 10–40 % and
 *   widen the top to 70 % where the band stays straight (curvature test), for more points and leverage.
 * - `starts`/`widths`: the coarse bands (fractions of the highest stress) searched for a first line.
 * - `minPoints`: fewest points in a band for a line with a residual check (4: two degrees of freedom).
 * - `plausible`: Young's moduli of engineering metals lie between about 40 GPa (magnesium alloys about
 *   45) and 450 GPa (tungsten about 410) — common practice; outside it E is not a metal's E.
 * - `fewPoints`, `maxRelInterval`: below 8 points in the band, or a 95 % interval wider than ±10 % of E,
 *   the modulus is reported as uncertain.
 * - `toeResidual`: points of the initial rise more than this many noise standard deviations above the
 *   line are the toe (slack); the band starts at twice the highest such stress.
 */
export const ELASTIC_WINDOW = {
  band: [0.1, 0.4] as readonly [number, number],
  /** Upper ends tried, in order, when the 10–40 % band holds too few points. */
  widerTops: [0.5, 0.6, 0.7] as readonly number[],
  starts: [0.02, 0.05, 0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.5, 0.6] as readonly number[],
  widths: [0.1, 0.15, 0.2, 0.3, 0.4, 0.6, 0.8] as readonly number[],
  maxTop: 0.9,
  minPoints: 4,
  plausible: [40_000, 450_000] as readonly [number, number],
  fewPoints: 8,
  maxRelInterval: 0.1,
  toeResidual: 3,
  /** The band starts at this multiple of the toe's top stress: a toe bends into the line gradually, its last points lie within the noise of the line but still pull the slope down. */
  toeMargin: 2,
  /** A band whose parabola beats its line by more than this many noise sd (√ of the drop of the residual sum over σ̂²) is bent: trimmed at the bent end. */
  curvatureSigmas: 3,
  /** Top of the wide band over which a bend from low stress (gradual yielding) is looked for, fraction of Rp0.2. */
  gradualTop: 0.7,
  /** …and only when the band starts at or below this fraction of Rp0.2. */
  gradualFrom: 0.2,
} as const;

export interface ElasticResult {
  modulus: number;
  toeStrain: number;
  window: ElasticWindow;
  /** Noise of the record's stress estimated from the data ({@link recordNoiseWide}), MPa. */
  noise: number;
  /** Problems with E, in words (empty when E is a plausible, well-determined metal modulus). */
  issues: { code: 'implausibleModulus' | 'fewElasticPoints' | 'uncertainModulus' | 'elasticBandFallback' | 'gradualYield'; message: string }[];
}

interface Line { slope: number; intercept: number; n: number; se: number; ssr: number; r2: number }

/**
 * Least-squares line over [from, to) by the shared {@link linearFit}; a band of many samples is thinned to
 * every `stride`-th sample first (copied into a small scratch array: the coarse band search stays O(n) on a
 * 1,000,000-row record). `se` is the slope's standard error with the residual scale floored at the record's
 * noise: max(σ̂, s)/√Sxx, so 4 points that happen to lie on a line do not claim a tiny interval.
 */
function line(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, noise: number, stride = 1, xNoise = 0): Line | null {
  let xs: ArrayLike<number> = x, ys: ArrayLike<number> = y, a = from, b = to;
  if (stride > 1) {
    const m = Math.ceil((to - from) / stride);
    const tx = new Float64Array(m), ty = new Float64Array(m);
    for (let k = 0, i = from; k < m; k++, i += stride) { tx[k] = x[i]!; ty[k] = y[i]!; }
    xs = tx; ys = ty; a = 0; b = m;
  }
  if (b - a < 2) return null;
  let f;
  try { f = linearFit(xs, ys, a, b); } catch { return null; }
  const s = f.n > 2 ? Math.sqrt(f.ssr / (f.n - 2)) : 0;
  // SE = s/√Sxx, so 1/√Sxx = SE/s; with s = 0 (an exact line) only the noise floor is left, and it needs Sxx.
  let invRootSxx = s > 0 ? f.slopeStandardError / s : NaN;
  if (!(invRootSxx >= 0)) {
    let mx = 0, sxx = 0;
    for (let i = a; i < b; i++) mx += xs[i]!;
    mx /= b - a;
    for (let i = a; i < b; i++) sxx += (xs[i]! - mx) ** 2;
    invRootSxx = 1 / Math.sqrt(sxx);
  }
  // The strain's own rounding (xNoise, a coarse column's) moves each sample off the line by slope·xNoise as well.
  return { slope: f.slope, intercept: f.intercept, n: f.n, ssr: f.ssr, r2: f.r2, se: Math.max(Math.hypot(noise, f.slope * xNoise), s) * invRootSxx };
}

/**
 * Trims a band until the line fits it: a parabola that lowers the residual sum by more than 3² noise
 * variances (a 3-sigma curvature, F-test form with σ̂ known) shows a bent band; convex means the toe's
 * slack still in its lower end (its lower end is raised), concave means plastic flow at its top (its top is
 * lowered), by 15 % of the band's points each time, down to 8 points.
 */
function trimCurvature(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, noise: number): [number, number] {
  for (let round = 0; round < 12 && to - from > ELASTIC_WINDOW.fewPoints; round++) {
    const q = polynomialFit(x, y, from, to, 2);
    const l = line(x, y, from, to, noise);
    if (!q || !l) break;
    const s2 = Math.max(noise * noise, q.ssr / Math.max(1, q.n - 3));
    if (!(l.ssr - q.ssr > ELASTIC_WINDOW.curvatureSigmas ** 2 * s2)) break;
    const cut = Math.max(1, Math.round(0.15 * (to - from)));
    if (q.c[2]! > 0) from += cut; else to -= cut;
  }
  return [from, to];
}

/**
 * Young's modulus E by least squares over a stress band tied to the record's own proof strength, robust
 * to noise, to a toe and to an elastic rise of few samples.
 *
 * 1. Noise σ̂ of the stress from the data ({@link recordNoiseWide}).
 * 2. A first line: every band [a, a + w]·Smax (a from 0.02 to 0.6, w from 0.1 to 0.8, top ≤ 0.9·Smax)
 *    on the first rise (points before the stress first exceeds the band's top); the band with the highest
 *    lower confidence bound E − 2·SE(E), SE from max(σ̂, residual scatter)/√Sxx, wins. A plastic or toe
 *    band has a lower slope; a band of few noisy points has a large SE: neither wins.
 * 3. Rp0.2 with that line (offset construction, {@link proofStrength}).
 * 4. The final band: from 10 % of that Rp0.2 (ISO 6892-1 Annex G practice, from memory), its lower end
 *    raised to twice the top of the toe (points more than 3σ̂ above the line), up to 40, 50, 60 or 70 %; each
 *    band trimmed while a parabola beats its line by more than 3σ̂ (convex: toe, lower end cut; concave: plastic
 *    flow, top cut; {@link trimCurvature}); of the bands with 8 points (else 4) the one with the smallest
 *    standard error of the slope wins; Rp0.2 recomputed and the band refitted once if it moved by over 2 %.
 *    When no band holds 4 points, the first line is kept (`elasticBandFallback`).
 * 5. Toe compensation (ISO 6892-1 and ASTM E8 practice): e0 of the line of slope E through the band's samples up to
 *    40 % of Rp0.2 ({@link lowBandToe}; −intercept/E of the band's line when fewer than 3 lie there), where a
 *    round-house curve has no microplastic strain yet.
 * 6. Gradual yielding (no straight part): when the band starts at ≤ 20 % of Rp0.2, a Ramberg–Osgood-form
 *    curve is fitted from there to 70 % of Rp0.2 ({@link initialTangent}); a significant bend that agrees with
 *    the band's lowest part and whose initial tangent is above the line's slope makes the tangent E
 *    (`gradualYield`), its interval reaching down to the line's secant.
 * With `strainRounding` (sd of a coarse strain column's rounding, strain fraction: q/√12 for steps of q, less where
 * the strain was read between its steps) every line's noise floor is √(σ̂² + (slope·strainRounding)²), and the toe,
 * curvature and bend tests use that scatter: a band of four rounded samples no longer wins on a lucky slope.
 * The 95 % interval is E ± t(0.975, n − 2)·SE (Student t), SE widened for noise correlated from sample to sample
 * (the larger of the band residuals' lag-1 correlation and `noiseLag1`, the record's, 0–0.9). Issues are returned, not thrown: E outside
 * 40–450 GPa (common practice), fewer than 8 points, an interval wider than ±10 %.
 * Units: strain fraction, stress MPa, E MPa. Valid: at least 4 points on the rising branch.
 * Cost: O(n) per band, 55 coarse bands on the initial rise only.
 * @throws InputError when no band holds 4 points.
 * @example elasticModulus([0, 0.001, 0.002, 0.003, 0.004, 0.005], [0, 200, 400, 600, 800, 1000]).modulus // 200000
 */
export function elasticModulus(strain: ArrayLike<number>, stress: ArrayLike<number>, rm?: number, noiseIn?: number, strainRounding = 0, noiseLag1 = 0): ElasticResult {
  const n = stress.length;
  let top = rm ?? 0;
  if (rm === undefined) for (let i = 0; i < n; i++) top = Math.max(top, stress[i]!);
  if (!(top > 0)) throw new InputError('stress', top, 'a record whose highest stress is above 0 MPa');
  const noise = noiseIn ?? recordNoiseWide(stress);
  // The first index of the first rise at or above a level, by bisection over its blocks' running maxima.
  const iTop = Math.min(n, firstBelowNot(stress, n, 0.98 * top) + 1);
  const firstAt = firstAtOrAbove(stress, iTop);
  const seOf = (f: Line) => f.se;
  const W = ELASTIC_WINDOW;
  // 2. First line.
  let best: { score: number; f: Line; i0: number; i1: number } | null = null;
  for (const a of W.starts) {
    for (const w of W.widths) {
      const b = a + w;
      if (b > W.maxTop + 1e-12) continue;
      const i0 = firstAt(a * top), i1 = firstAt(b * top);
      if (i1 - i0 < W.minPoints) continue;
      // A first line only: bands of many samples are thinned to about 2000 (keeps the search O(n) overall).
      const f = line(strain, stress, i0, i1, noise, Math.max(1, Math.floor((i1 - i0) / 2000)), strainRounding);
      if (!f || !(f.slope > 0)) continue;
      const score = f.slope - 2 * seOf(f);
      if (!best || score > best.score) best = { score, f, i0, i1 };
    }
  }
  if (!best) throw new InputError('strain', n, `a rising branch with at least ${W.minPoints} points between 2 % and 90 % of the highest stress (elastic band)`);
  const issues: ElasticResult['issues'] = [];
  let fit = best.f, i0 = best.i0, i1 = best.i1, bandLo = NaN, bandHi = NaN, proofEst = NaN;
  let fallback = true;
  // 3–4. Final band tied to Rp0.2, refitted once if Rp0.2 moves.
  for (let pass = 0; pass < 2; pass++) {
    const E1 = fit.slope, toe1 = -fit.intercept / E1;
    // The scatter of a rise sample about the line: the load's noise and the strain's rounding through the slope.
    const noiseX = Math.hypot(noise, E1 * strainRounding);
    const p = proofStrength(strain, stress, E1, toe1, 0.002, i0, n);
    const P = p ? p.stress : top;
    if (pass === 1 && Math.abs(P - proofEst) <= 0.02 * proofEst) break;
    proofEst = P;
    // Toe: the run of samples from the start lying clearly above the line (ends at the first two in a row
    // that do not); a single noisy sample higher up is not a toe.
    let toeTop = 0;
    const tol = W.toeResidual * Math.max(noiseX, 1e-9 * top);
    const lim = firstAt(W.band[1] * P);
    for (let i = 0; i < lim; i++) {
      const above = stress[i]! - E1 * (strain[i]! - toe1) > tol;
      const nextAbove = i + 1 < lim && stress[i + 1]! - E1 * (strain[i + 1]! - toe1) > tol;
      if (!above && !nextAbove && stress[i]! > 0) break;
      if (above) toeTop = Math.max(toeTop, stress[i]!);
    }
    const lo = Math.max(W.band[0] * P, W.toeMargin * toeTop);
    let chosen: { f: Line; i0: number; i1: number; hi: number } | null = null;
    // Tops from 40 % to 70 % of Rp0.2, each band trimmed while it is measurably bent (toe below, plastic flow
    // above); the straight band with the smallest standard error of the slope wins. Bands of `fewPoints` first;
    // only if none holds that many, `minPoints`.
    for (const need of [W.fewPoints, W.minPoints]) {
      for (const frac of [W.band[1], ...W.widerTops]) {
        const hi = Math.max(frac * P, lo + 0.1 * P);
        const [j0, j1] = trimCurvature(strain, stress, firstAt(lo), firstAt(hi), noiseX);
        if (j1 - j0 < need) continue;
        const f = line(strain, stress, j0, j1, noise, 1, strainRounding);
        if (f && f.slope > 0 && (!chosen || f.se < chosen.f.se)) chosen = { f, i0: j0, i1: j1, hi: stress[j1 - 1]! };
      }
      if (chosen) break;
    }
    // A band that reaches past the knee has a far lower slope than the first line: keep the first line then.
    if (!chosen || chosen.f.slope < 0.5 * best.f.slope) break;
    fallback = false;
    fit = chosen.f; i0 = chosen.i0; i1 = chosen.i1; bandLo = lo; bandHi = chosen.hi;
  }
  let E = fit.slope;
  // Load noise correlated from sample to sample (a filter in the machine) makes the band's residuals alike, and
  // least squares then claims more precision than the samples hold: SE is widened by √((1 + ρ)/(1 − ρ)), ρ the lag-1
  // autocorrelation of the band's residuals (ρ < 0 taken as 0), and the degrees of freedom shrink to the effective
  // number of points n(1 − ρ)/(1 + ρ) (the AR(1) variance factor of a mean; the law fits' `effectivePoints` does
  // the same). The band's own residuals read the correlation low (a line through 20 samples takes up part of it):
  // the record-wide figure (`noiseLag1`) is the floor of ρ in the variance; the degrees of freedom stay the band's
  // (those of its residual scatter). With the band's own ρ alone the interval held the truth on 68 of 80 invented
  // records with AR(1) noise of ρ 0.85, 73 at 0.7 (78 with white noise; test/core/tensile/correlated-noise.test.ts).
  const rhoOwn = lineResidualLag1(strain, stress, i0, i1, fit.intercept, fit.slope);
  const rho = Math.min(0.9, Math.max(rhoOwn, noiseLag1));
  const corr = (1 + rho) / (1 - rho);
  let se = seOf(fit) * Math.sqrt(corr);
  let dof = Math.max(1, (fit.n * (1 - rhoOwn)) / (1 + rhoOwn) - 2);
  let toeStrain = -fit.intercept / E;
  let nUsed = fit.n;
  let r2 = fit.r2;
  let method: string | null = null;
  // 6. A rise that bends from low stress on (gradual yielding) has no straight band: every line over it is a
  // secant below E, which lets Rp0.2 come out high. Over the wide band (its lower end to 70 % of Rp0.2) a
  // Ramberg–Osgood-form curve is fitted ({@link initialTangent}); when the bend is significant AND the line's
  // slope lies below the bent fit's initial tangent, the tangent is E (a bend only lowers a secant).
  let secant: number | null = null;
  // Only where the band reaches down to low stress (≤ 20 % of Rp0.2): a band raised by a toe starts where a
  // bend from low stress cannot be told from the toe's end and the knee's microplasticity (on the 42CrMoS4
  // open records such a band gave tangents 4–6 % above the producers' E).
  if (!fallback && bandLo <= W.gradualFrom * proofEst) {
    const ia = firstAt(bandLo), ib = firstAt(W.gradualTop * proofEst);
    const noiseX = Math.hypot(noise, E * strainRounding);
    const tg = initialTangent(strain, stress, ia, ib, noiseX, W.curvatureSigmas);
    // The bent fit must also agree with the band's lowest part (10–30 % of Rp0.2): the slope of a line through
    // its own values there must match the data's line within 3 SE; a tangent far above the data is the bend
    // term fitting noise, not the material.
    const jb = Math.min(ib, Math.max(ia + W.fewPoints, firstAt(0.3 * proofEst)));
    const low = line(strain, stress, ia, jb, noise, 1, strainRounding);
    let agrees = true;
    if (tg && low) {
      const xm = new Float64Array(jb - ia);
      for (let i = ia; i < jb; i++) xm[i - ia] = tg.strainAt(stress[i]!);
      const ys = Float64Array.from({ length: jb - ia }, (_, k) => stress[ia + k]!);
      const lm = line(xm, ys, 0, jb - ia, 0);
      agrees = lm !== null && Math.abs(lm.slope - low.slope) <= 3 * Math.hypot(low.se, tg.standardError);
    }
    if (tg && agrees && tg.modulus > E && tg.modulus <= W.plausible[1]) {
      issues.push({ code: 'gradualYield', message: `the rise bends from low stress on (no straight elastic part, as in austenitic stainless steels and many aluminium alloys): E = ${(tg.modulus / 1000).toFixed(1)} GPa is the initial tangent of a Ramberg–Osgood-form curve (exponent ${tg.power.toFixed(1)}) fitted over ${bandLo.toFixed(0)}–${stress[ib - 1]!.toFixed(0)} MPa; a straight line gives ${(E / 1000).toFixed(1)} GPa, which would overstate Rp0.2. Give the modulus if it is known` });
      secant = E;
      E = tg.modulus; se = tg.standardError; r2 = tg.r2; dof = Math.max(1, tg.points - 4); toeStrain = tg.toeStrain; nUsed = tg.points; i0 = ia; i1 = ib; bandHi = stress[ib - 1]!;
      method = `initial tangent of ε = a + σ/E + d·(σ/S)^${tg.power.toFixed(1)} (Ramberg–Osgood form) fitted from the band's lower end to ${W.gradualTop * 100} % of the record's Rp0.2 estimate; toe-compensated`;
    }
  }
  const t = studentTQuantile(0.975, dof);
  // With a bend from low stress, E lies between the straight line's secant (a bend only lowers a secant) and
  // the tangent's upper bound: the interval's lower end reaches down to the secant.
  const interval: [number, number] = [secant === null ? E - t * se : Math.min(E - t * se, secant), E + t * se];
  if (fallback) {
    bandLo = stress[i0]!; bandHi = stress[i1 - 1]!;
    issues.push({ code: 'elasticBandFallback', message: `the band 10–40 % of Rp0.2 holds fewer than ${W.minPoints} points of the initial rise; E is taken from the straightest band found (${fit.n} points, ${bandLo.toFixed(0)}–${bandHi.toFixed(0)} MPa)` });
  }
  const [pLo, pHi] = W.plausible;
  if (!(E >= pLo && E <= pHi)) {
    issues.push({ code: 'implausibleModulus', message: `E = ${(E / 1000).toFixed(1)} GPa from the elastic band (${fit.n} points, ${bandLo.toFixed(0)}–${bandHi.toFixed(0)} MPa) is outside the range of metals (${pLo / 1000}–${pHi / 1000} GPa, common practice): the strain is probably not from an extensometer, or the record has too few elastic points; give the modulus (--modulus, or the record bench's modulus field)` });
  } else if (nUsed < W.fewPoints) {
    issues.push({ code: 'fewElasticPoints', message: `only ${nUsed} points in the elastic band; E = ${(E / 1000).toFixed(1)} GPa, 95 % interval ${(interval[0] / 1000).toFixed(1)}–${(interval[1] / 1000).toFixed(1)} GPa; give the modulus if it is known` });
  } else if ((interval[1] - interval[0]) / 2 / E > W.maxRelInterval) {
    issues.push({ code: 'uncertainModulus', message: `E = ${(E / 1000).toFixed(1)} GPa is uncertain: 95 % interval ±${((100 * (interval[1] - interval[0])) / 2 / E).toFixed(0)} % (${nUsed} points, noise ${noise.toPrecision(2)} MPa); give the modulus if it is known` });
  }
  // 5. The strain origin from the band's samples up to 40 % of Rp0.2 (the least-squares line's own intercept, or the
  // initial tangent's, where fewer than 3 lie there): on a round-house curve the band's upper part already carries
  // microplastic strain, which would move the offset line and read Rp0.2 high. Noise-free hold-out B: Rp0.2 off by
  // more than a quarter of the tolerance on 6 → 2 records; the property test and hold-out A unchanged.
  toeStrain = lowBandToe(strain, stress, i0, i1, W.band[1] * proofEst, E) ?? toeStrain;
  return {
    modulus: E,
    toeStrain,
    noise,
    issues,
    window: {
      fromStress: bandLo,
      toStress: bandHi,
      fromIndex: i0,
      toIndex: i1,
      points: nUsed,
      r2,
      standardError: se,
      interval95: interval,
      proofEstimate: proofEst,
      method: method ?? (fallback
        ? 'least squares over the band of the initial rise with the highest lower confidence bound of the slope; toe-compensated'
        : 'least squares over 10–40 % of the record\'s Rp0.2 estimate (ISO 6892-1 Annex G practice), above the toe, widened when too few points; toe-compensated'),
    },
  };
}


// The record-long loops of elasticModulus in small functions of their own (the same operations, the same
// numbers): elasticModulus runs once per record and is long, so the engine ran its loops unoptimised, with a
// heap number per running maximum (the first rise of a 1,000,000-row record is most of the record; speed
// follow-up J).

/** The first i < n with !(stress[i] < level) (n when none). */
function firstBelowNot(stress: ArrayLike<number>, n: number, level: number): number {
  let i = 0;
  while (i < n && stress[i]! < level) i++;
  return i;
}

/** Samples per block of {@link firstAtOrAbove}'s running maxima. */
const TOP_BLOCK = 64;

/**
 * The first i < m with stress[i] ≥ level (m if none), for any number of levels: bisection over the running maxima of
 * blocks of TOP_BLOCK samples, then a scan inside the block found. The same index as a bisection over the running
 * maximum of every sample (the first sample at or above a level is where that maximum first reaches it), with a
 * column of m/64 values instead of m (3.9 MB on a 1,000,000-row record: fresh memory costs a page fault per 4 KiB,
 * 11 µs each on the machines this project is measured on). Valid: finite stresses (analyzeRecord refuses others).
 * @example firstAtOrAbove([1, 3, 2, 5], 4)(2.5) // 1
 */
export function firstAtOrAbove(stress: ArrayLike<number>, m: number): (level: number) => number {
  const nb = Math.ceil(m / TOP_BLOCK), tops = new Float64Array(nb);
  let top = m > 0 ? stress[0]! : 0; // the first value, not −Infinity (V8 boxed every new maximum from such a start)
  for (let b = 0; b < nb; b++) {
    for (let i = b * TOP_BLOCK, z = Math.min(m, i + TOP_BLOCK); i < z; i++) if (stress[i]! > top) top = stress[i]!;
    tops[b] = top;
  }
  return (level: number) => {
    let lo = 0, hi = nb;
    while (lo < hi) { const mid = (lo + hi) >> 1; if (tops[mid]! >= level) hi = mid; else lo = mid + 1; }
    if (lo === nb) return m;
    let i = lo * TOP_BLOCK;
    while (!(stress[i]! >= level)) i++;
    return i;
  };
}

/**
 * Variance of the elastic line's strain at a stress s (inverse prediction from the band's least-squares line,
 * Draper & Smith ch. 3): Var ê(s) = SE(E)²·Sxx/(E²·n) + (s − s̄)²·SE(E)²/E⁴, with n, Sxx and s̄ of the band's samples and
 * SE(E) as reported (already floored at the noise and widened for correlated residuals); σ² = SE(E)²·Sxx is the
 * scatter the slope's error came from. Units: strain² for s in MPa. Used to carry the uncertainty of E and of the toe
 * into the offset construction of Rp.
 * @example elasticLineVariance(strain, stress, el.window, el.modulus)(300) // strain², ≥ 0
 */
export function elasticLineVariance(strain: ArrayLike<number>, stress: ArrayLike<number>, w: { fromIndex: number; toIndex: number; standardError: number }, E: number): (s: number) => number {
  const n = w.toIndex - w.fromIndex;
  if (!(n >= 2) || !(w.standardError >= 0)) return () => 0;
  let mx = 0, ms = 0;
  for (let i = w.fromIndex; i < w.toIndex; i++) { mx += strain[i]!; ms += stress[i]!; }
  mx /= n; ms /= n;
  let sxx = 0;
  for (let i = w.fromIndex; i < w.toIndex; i++) sxx += (strain[i]! - mx) ** 2;
  const se2 = w.standardError ** 2;
  return (s) => (se2 * sxx) / (E * E * n) + ((s - ms) ** 2 * se2) / E ** 4;
}

/**
 * Toe compensation e0 of a line of slope E through the centroid of the samples in [a, b) whose stress is at most
 * `limit`: e0 = mean(e) − mean(σ)/E (ISO 6892-1 and ASTM E8 practice: the strain origin where the elastic line meets
 * zero stress). Null when fewer than `least` (≥ 1) samples qualify. Units: strain fraction, MPa, E in MPa.
 * @example lowBandToe([0.0015, 0.002, 0.0025], [200, 300, 400], 0, 3, 500, 200000) // ≈ 0.0005
 */
export function lowBandToe(strain: ArrayLike<number>, stress: ArrayLike<number>, a: number, b: number, limit: number, E: number, least = 3): number | null {
  let mx = 0, my = 0, k = 0;
  for (let i = a; i < b; i++) if (stress[i]! <= limit) { mx += strain[i]!; my += stress[i]!; k++; }
  return k >= Math.max(1, least) ? (mx - my / E) / k : null;
}
