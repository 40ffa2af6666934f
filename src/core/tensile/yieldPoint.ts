import { blockAverage } from '../fit/blockAverage.js';
import { linearFit } from '../fit/linearFit.js';
import { lineResidualLag1, movingAverage, polynomialFit, solveSmall } from './localFit.js';

export interface YieldPointResult {
  upperYield: number;
  /**
   * Bounds on ReH as the record can show it (the highest noise-free sample), MPa: ±3 noise sd of the reading, and
   * on a coarse record from the line's value down to where the peak sample would be if it were already part-way
   * down the fall. Wider than ±1.5 % of ReH: the record cannot place ReH that closely (`uncertainReH`).
   */
  upperYieldRange: [number, number];
  lowerYield: number;
  /** Index of the upper yield point, of the first plateau sample after the initial transient, and of the end of the yield-point plateau. */
  peakIndex: number;
  plateauFrom: number;
  endIndex: number;
  /** Ae, engineering strain from ReH to the start of uniform work hardening, %. */
  elongationPct: number;
  /** The fall from ReH to the plateau level and the smallest fall that would have counted, MPa. */
  drop: number;
  dropThreshold: number;
}

/** Thresholds of the yield-drop test, stated once. */
export const YIELD_DROP = {
  /** The fall must exceed this fraction of ReH (a floor only: rounded knees are told apart by the knee and step tests, so the floor sits below the smallest drops of interest, common practice)… */
  minRelDrop: 0.01,
  /** …and this many standard errors of (ReH estimate − plateau level). */
  sigmas: 4,
  /** A departure from the elastic line: this many noise sd below it, two samples in a row. */
  departSigmas: 4,
  /** Strain over which the plateau level after the drop is taken (median), fraction. */
  plateauStrain: 0.003,
  /** The peak must lie within this plastic strain of the elastic line. */
  maxPeakPlastic: 0.005,
  /** The plateau ends at the last point where the smoothed stress is within this fraction of its median (or 3 sd of the smooth, if more). */
  plateauBand: 0.003,
  /** Strain of the hardening branch past the plateau's end taken into the plateau–hardening fit. */
  hardeningStrain: 0.005,
  /**
   * The plateau goes on past its level band while the smoothed stress still falls back clearly (by 8 sd of the smooth,
   * 5 sd of the record's noise and plateauBand of the level) to within this fraction of the level: a serration's fall, which work
   * hardening never shows (Lüders serrations run to 3 % of ReL, the plateau's slope about 1 %, common practice).
   */
  troughRise: 0.03,
  /** The last samples of the rise this many standard errors below the line through the rest: a rounded knee, not a sharp peak. */
  kneeSigmas: 3,
  /**
   * …and by at least this fraction of the peak stress on average: a bend smaller than that moves ReH read on the line
   * by a few tenths of a percent at most, while the moving average used for a rounded knee reads a steep coarse rise
   * a good part of a sample step low. (An elastic line that curves a little over the whole rise — engineering stress
   * from a linear law in true measures bends by about 1.5·e, 0.35 % at e = 0.23 % — read as a knee on quiet records
   * and put ReH 0.5–6 % below the highest sample; hold-out C.)
   */
  kneeMinRel: 0.001,
  /** A fall of at least this many samples is located as a change point; fewer are read as recorded. */
  fallPoints: 3,
  /**
   * Walking back down the rise (to fit the elastic line, or the rise line that ReH is read on), an earlier peak is a
   * sample this many noise sd above the one after it. The difference of two noisy samples has sd √2·σ̂, and a rise
   * logged at a constant stress rate (ISO 6892-1 method B) holds thousands of samples, among which a step back of 3σ̂
   * was sure to occur: the walk stopped a few samples before the peak and the line refitted there was the noise's
   * (an invented 79,008-point record with a 5 % yield drop of evidence 21 went unreported; hold-out C).
   */
  riseStepSigmas: 8,
} as const;

/**
 * Discontinuous yielding: upper yield strength ReH, lower yield strength ReL and yield-point
 * elongation Ae (ISO 6892-1 §3.10.2 and §3.6.5; ASTM E8 §7.6 "YPE"), reported only for a drop that
 * stands clear of the record's noise and is followed by a plateau.
 *
 * - The elastic rise ends at the first of two samples in a row lying more than 4σ̂ (and 0.5 %) below the
 *   elastic line σ = E(e − e0), refitted through the rise; the peak q is the highest sample before it.
 * - ReH is read on a least-squares line through the rise (precise to σ̂·2/√k), unless the rise bends before q
 *   (its last 4, 8 or 16 samples over 3 standard errors and 0.1 % below the line through the rest: a rounded knee), when
 *   the highest moving average of the samples is used. On a finely sampled fall (three or more samples on its
 *   upper half) ReH is the highest modelled sample of "rise line, then a straight fall" with the break located
 *   between samples (change point); on a coarse one the line's value or a sample caught part-way down.
 *   `upperYieldRange` bounds it (±3 σ̂; on a coarse record down to where a falling peak sample would be).
 * - The plateau level is the median stress over 0.3 % strain after the departure. A yield drop is reported
 *   only when ReH − level > max(1 % of ReH, 4 standard errors) — the peak read on the line only when the
 *   peak sample agrees with it within σ̂ — and a step down beats a hinge at the end of the rise by 3² σ̂²
 *   ({@link isStepDown}): a continuous curve bends, a drop steps.
 * - ReL (ISO 6892-1 §3.10.2.2: the lowest stress during plastic yielding, the initial transient ignored): the
 *   transient is the fall and the first trough, ending where a moving average of the plateau first rises back
 *   above its median (ISO 6892-1 practice, from memory: the first minimum is not counted unless it is the only
 *   one). The plateau after it and the start of hardening are fitted together ({@link plateauHinge}); ReL is the
 *   plateau's trough level, Ae ends where the hardening branch leaves it (the ASTM E8 YPE construction takes the
 *   hardening branch's meeting with the plateau, from memory).
 * On a strain column written in coarse steps q, `riseRounding` (MPa: E·q/√12, less where the strain was read between
 * its steps) joins σ̂ in quadrature for the rise — its line, the peak's place on it and the knee test — and the peak
 * sample, a force reading, is ReH where the line read at its rounded strain is less precise.
 * Units: strain fraction (toe-compensated by `toe`), stress MPa; σ̂ = `noise` in MPa. `maxIndex`: the
 * last index to look at (fracture); the plateau ends before the highest stress after the departure.
 * Cost: O(n). @returns null for continuous yielding.
 */
export function yieldPoint(
  strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, fromIndex: number, maxIndex: number, noise: number,
  riseRounding = 0,
): YieldPointResult | null {
  const Y = YIELD_DROP;
  const d = elasticDeparture(strain, stress, E, toe, fromIndex, maxIndex, noise);
  // The scatter of a rise sample about the rise line: the load's noise and, on a strain column written in coarse
  // steps, the strain's rounding seen through the rise's slope (E·q/√12). The rise line, the peak's place on it and
  // the knee test use it; the plateau and the fall, nearly flat in strain, the load's noise alone.
  const noiseR = Math.hypot(noise, riseRounding);
  if (d < 1) return null;
  // Maximum force after the departure (ISO 6892-1: Fm after work hardening begins) bounds the plateau.
  // The search starts where the fall after the departure ends (the first sample that does not fall further
  // by more than the noise): a departure sample still high on the fall may stand above Rm itself when ReH ≥ Rm
  // (low-hardening steels), which would leave no plateau to read.
  let r = d;
  while (r < maxIndex && stress[r + 1]! < stress[r]! + noise) r++;
  r = maxForceSearchStart(strain, stress, r, maxIndex, noise);
  maxIndex = firstHighest(stress, r, maxIndex);
  // The peak: the highest sample from the elastic band to the departure (still on the elastic line).
  let q = Math.max(fromIndex, d - 1);
  for (let i = Math.max(fromIndex, 0); i < d; i++) if (stress[i]! > stress[q]!) q = i;
  if (strain[q]! - toe - stress[q]! / E > Y.maxPeakPlastic) return null;
  // ReH from a line through the rising samples above half the peak stress, read at the peak.
  let k0 = q;
  // (Stopping at an earlier peak, YIELD_DROP.riseStepSigmas: a short line made the knee test below fire on a sharp peak.)
  while (k0 > fromIndex && stress[k0 - 1]! >= 0.5 * stress[q]! && stress[k0 - 1]! < stress[k0]! + Y.riseStepSigmas * noiseR) k0--;
  let reh = stress[q]!;
  let seReh = noiseR;
  let rise: { a: number; b: number } | null = null;
  // Bounds on the highest noise-free sample (ReH as the record shows it), ±3 sd of each reading. On a coarse
  // record the peak sample may sit on the line or already part-way down the fall: one noisy sample cannot tell.
  let lo = reh - 3 * noiseR, hi = reh + 3 * noiseR;
  if (q - k0 >= 3) {
    try {
      // The line through the rise with the peak sample left out, so a sample already on the fall cannot pull
      // the line to itself. A peak within 1.5 noise sd of that line is read on the line (precise to σ̂·2/√k);
      // a peak further below it is already on the fall, and the highest noise-free sample is the larger of
      // the last sample on the line (read on the line) and the peak sample as recorded.
      const k = q - k0;
      const f = linearFit(strain, stress, k0, q);
      rise = { a: f.intercept, b: f.slope };
      const v = f.intercept + f.slope * strain[q]!;
      const before = f.intercept + f.slope * strain[q - 1]!;
      if (stress[q]! >= v - 1.5 * noiseR * Math.sqrt(1 + 4 / k)) {
        // On a strain column in coarse steps the line read at the peak's rounded strain carries that rounding
        // (riseRounding) however many samples it rests on; the peak sample, a force reading, only the load's noise.
        // The more precise of the two is ReH.
        const seLine = Math.hypot(noise * Math.sqrt(4 / k), riseRounding);
        const bySample = riseRounding > 0 && seLine > noise;
        if (bySample) { reh = stress[q]!; seReh = noise; } else { reh = v; seReh = seLine; }
        // The lower bound is the peak sample's own (the highest noise-free sample is at least what q shows, less 3σ̂),
        // not the line at q − 1: on a fall gentle against the noise the highest sample may lie two or more samples
        // past the peak, and the line there stands above every noise-free sample. The upper bound holds both readings.
        lo = Math.min(v, stress[q]!) - 3 * noiseR; hi = bySample ? Math.max(v + 3 * seLine, reh + 3 * noise) : v + 3 * seReh;
      } else {
        reh = Math.max(before, stress[q]!);
        // As above: q − 1 may be past the peak too, so the line there bounds nothing (hold-out A 1002: ReH read on it
        // 2.3 % high, with a range 157.2–159.7 MPa wholly above the truth, 153.6).
        lo = Math.min(before, stress[q]! - 3 * noiseR); hi = stress[q]! + 3 * noiseR;
      }
      // A rounded knee is not a sharp peak: when the last m samples of the rise (m = 4, 8, 16 and a quarter of
      // the rise, each tried) lie below the line through the samples before them by more than 3 standard errors,
      // the rise bends before the peak and reading the line at the peak would put ReH above every sample. The
      // peak is then read from the samples: the highest moving average (over m samples) around it.
      // The peak sample q itself is left out of this test, as out of the line: a peak sample already part-way down
      // the fall is not a bend of the rise (it made clean records with a sample just past the peak read ReH at the
      // moving average, 0.5–0.7 % low). The noise is floored at 10⁻⁹ of the stress, the arithmetic's own
      // resolution, so the rounding of an exact line does not read as a bend on a noise-free record.
      const noiseK = Math.max(noiseR, 1e-9 * Math.abs(stress[q]!));
      for (const m of new Set([4, 8, 16, Math.min(20, Math.round(k / 4))])) {
        // The line the run is compared with rests on at least as many samples as the run (a run of 16 against a line
        // through 9, extrapolated under correlated noise, read a sharp 3.5 % drop as a rounded knee).
        if (!(m >= 2 && k - m >= Math.max(3, m))) continue;
        const g = linearFit(strain, stress, k0, q - m);
        let res = 0;
        for (let i = q - m; i < q; i++) res += stress[i]! - (g.intercept + g.slope * strain[i]!);
        res /= m;
        // Noise correlated from sample to sample moves a mean of m samples by more than σ̂/√m: the standard error is
        // widened by √((1 + ρ)/(1 − ρ)), ρ the lag-1 autocorrelation of the line's residuals (ρ < 0 taken as 0).
        const corr = lag1Factor(strain, stress, k0, q - m, g.intercept, g.slope);
        if (res < -Math.max(Y.kneeSigmas * noiseK * Math.sqrt(corr * (1 / m + 4 / (k - m))), Y.kneeMinRel * Math.abs(stress[q]!))) {
          rise = null;
          const ma = movingAverage(stress, q - m + 1, Math.min(maxIndex, q + m) + 1, m | 1);
          reh = -Infinity;
          for (let i = 0; i < ma.length; i++) reh = Math.max(reh, ma[i]!);
          seReh = noise / Math.sqrt(m);
          lo = reh - 3 * seReh; hi = reh + 3 * noise;
          break;
        }
      }
    } catch { /* keep the sample */ }
  }
  // Plateau level after the departure: median over 0.3 % strain (robust to the fall's samples at its start).
  const pEnd = windowEnd(strain, d, maxIndex, Y.plateauStrain, 5);
  const nLevel = pEnd - d;
  if (nLevel < 3) return null;
  const level = medianOf(stress, d, pEnd);
  // The fall: samples from the departure until the stress first comes within 3 noise sd of the level.
  // (three samples in a row, so one noisy sample part-way down the fall does not end it).
  const below = (i: number, v: number) => stress[i]! <= v && (i + 1 > maxIndex || stress[i + 1]! <= v) && (i + 2 > maxIndex || stress[i + 2]! <= v);
  let r0 = d;
  while (r0 < maxIndex && !below(r0, level + 3 * noise)) r0++;
  // Samples on the upper half of the fall (above the middle between the line at the peak and the level), in a
  // run after the peak: several of them mean a finely sampled fall, one or two a coarse one.
  // The drop test reads the peak on the line only when the peak sample agrees with it within one noise sd: a
  // sample further below may be just past a sharp knee (a continuous curve), where the line overshoots every sample.
  let testReh = reh, testSe = seReh;
  if (rise && reh === rise.a + rise.b * strain[q]! && stress[q]! < reh - noise) { testReh = stress[q]! + noise; testSe = noise; }
  let fallTop = rise ? rise.a + rise.b * strain[q]! : reh;
  for (let i = q + 1; i < r0; i++) fallTop = Math.max(fallTop, stress[i]!);
  const mid = level + 0.5 * (fallTop - level);
  let lastUpper = q, nUpper = 0;
  for (let i = q + 1; i < r0; i++) { if (stress[i]! > mid) { nUpper++; lastUpper = i; } else if (stress[i]! < mid - 3 * noise) break; }
  if (nUpper >= Y.fallPoints && rise) {
    // Finely sampled fall: the peak is where the rise line turns into the fall, found as a change point —
    // least squares of "rise line, then a straight fall from it" over the break position (grid over the
    // samples from the last few on the rise to the last on the upper half of the fall). ReH is the rise line at
    // the break.
    const cp = riseFallBreak(strain, stress, rise.a, rise.b, Math.max(k0, q - Math.max(3, lastUpper - q)), lastUpper + 1, noise);
    if (cp !== null) {
      // ReH as the record shows it: the highest modelled sample — the last on the rise line before the break
      // or the first on the fall after it.
      const top = rise.a + rise.b * cp.xb;
      let before = -Infinity, after = -Infinity;
      for (let i = Math.max(k0, q - Math.max(3, lastUpper - q)); i <= lastUpper + 1 && i < maxIndex; i++) {
        const xi = strain[i]!;
        if (xi <= cp.xb) before = Math.max(before, rise.a + rise.b * xi);
        else if (after === -Infinity) after = top + cp.slope * (xi - cp.xb);
      }
      reh = testReh = Math.max(before, after, -Infinity) > -Infinity ? Math.max(before, after) : top;
      seReh = testSe = noise * Math.sqrt(4 / Math.max(2, q - k0));
      // The range also holds the rise line over every break position the samples allow (its profile interval): on
      // a slow fall a break placed a few samples late reads the line several noise sd above the peak.
      lo = Math.min(reh, rise.a + rise.b * cp.xbLo) - 3 * seReh; hi = Math.max(reh, rise.a + rise.b * cp.xbHi) + 3 * seReh;
    }
  } else {
    // Coarse: at most a couple of samples on the fall. The highest noise-free sample may be one of them (caught
    // part-way down): read them as recorded (noise σ̂ each).
    // The test below keeps the more precise of the two (the line's value when a sample on the fall is not
    // clearly higher).
    for (let i = q + 1; i <= lastUpper; i++) {
      if (stress[i]! > reh) {
        if (stress[i]! > reh + 2 * noise) { testReh = stress[i]!; testSe = noise; }
        reh = stress[i]!;
        lo = Math.max(lo, reh - 3 * noise); hi = Math.max(hi, reh + 3 * noise);
      }
    }
  }
  // The plateau's lower level (its troughs): see plateauTroughs.
  const seDiff = Math.sqrt(testSe * testSe + (1.57 * noise * noise) / nLevel);
  const threshold = Math.max(Y.minRelDrop * testReh, Y.sigmas * seDiff);
  const drop = testReh - level;
  if (!(drop > threshold)) return null;
  // A drop is a step down, not a bend: after the rise line ends, a segment that starts lower than the line (a
  // step) must fit the samples clearly better than one that starts on it (a hinge, as a continuous curve bends at
  // its knee) — by more than 5² noise variances of the residual sum (common practice for a change-point test).
  // A fall that a soft machine draws out over tenths of a percent of strain bends like a knee to that test, but no
  // continuous curve comes down from its knee: a clear fall of the smoothed stress, followed by a rise, is a drop too.
  if (rise && !isStepDown(strain, stress, rise.a, rise.b, Math.max(k0, q - 50), pEnd, Math.max(k0 + 1, q - 10), Math.min(pEnd - 3, Math.max(d, lastUpper) + 10), noise, q, lastUpper) &&
    !clearFall(strain, stress, q, maxIndex, noise * Math.sqrt(lag1Factor(strain, stress, k0, q, rise.a, rise.b)))) return null;
  const { end, pa, h } = plateauExtent(strain, stress, d, r0, maxIndex, level, noise);
  let rel = level, endStrain = strain[end]!;
  if (h) { rel = h.lowerYield; endStrain = h.hardeningStart; }
  return { upperYield: reh, upperYieldRange: [Math.min(lo, reh), Math.max(hi, reh)], lowerYield: Math.min(rel, reh), peakIndex: q, plateauFrom: pa, endIndex: end, elongationPct: (endStrain - strain[q]!) * 100, drop, dropThreshold: threshold };
}

/** A yield plateau with no upper yield point clear of the noise ({@link yieldPlateau}). */
export interface YieldPlateau {
  /** Departure from the elastic line (the plateau's start) and the plateau's end (where the hardening leaves it), sample indices. */
  startIndex: number;
  endIndex: number;
  /** The plateau's level (median over its first 0.3 % strain), MPa. */
  level: number;
  /** Engineering strain from the start to the end, %. */
  lengthPct: number;
  /** Slope of the hardening after the plateau (over a stretch as long as the plateau, at least 0.5 % strain) over the plateau's own slope (null for a level or falling plateau: no finite ratio). */
  kneeRatio: number | null;
}

/** Thresholds of {@link yieldPlateau}, stated once. */
export const YIELD_PLATEAU = {
  /** The plateau spans at least this engineering strain (the window its level is read over; Lüders strains of mild steels run 0.5–4 %, common practice). */
  minStrain: 0.003,
  /** The hardening after it is at least this many times steeper than the plateau… */
  kneeRatio: 3,
  /** …by this many standard errors of the difference (serrations counted through the residuals' lag-1 correlation). */
  sigmas: 4,
} as const;

/**
 * A yield plateau (yielding at about constant force, ISO 6892-1 §3.10.2) whose upper yield point the record does not
 * show clear of its noise — a coarse or noisy record that missed the short peak, or steel that yields without one.
 * ReH, ReL and Ae are not reported for it ({@link yieldPoint} reports them only for a drop that stands clear of the
 * noise), but the plateau is no part of work hardening: the hardening laws fitted through it bend to bridge a flat
 * stretch their forms cannot hold (an invented Swift steel with a 2.8 % plateau: the best law 4.4 % off at 3 % strain).
 *
 * The plateau is found as yieldPoint finds it after a drop ({@link plateauExtent}: from the departure from the elastic
 * line to the later of where its moving average leaves the band about its level and where the plateau–hardening
 * hinge's branch leaves it) and counted only when it spans at least
 * YIELD_PLATEAU.minStrain and the curve turns upward at its end: the hardening over the next stretch (as long as the
 * plateau, at least 0.5 % strain) at least YIELD_PLATEAU.kneeRatio times steeper than the plateau
 * by YIELD_PLATEAU.sigmas standard errors (least-squares slopes, Draper & Smith ch. 1; the standard errors widened by
 * √((1 + ρ)/(1 − ρ)) for the lag-1 correlation ρ of each line's residuals). A continuous curve's hardening falls as
 * the strain grows (every law here is concave), so the test cannot pass on one, whatever its noise.
 * Units: strain fraction (toe by `toe`), stress MPa, noise MPa. Cost O(maxIndex − fromIndex).
 * @returns null when there is no such plateau.
 * @example yieldPlateau(e, s, 205000, 0, 0, e.length - 1, 2)?.endIndex
 */
export function yieldPlateau(strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, fromIndex: number, maxIndex: number, noise: number): YieldPlateau | null {
  const Y = YIELD_DROP, P = YIELD_PLATEAU;
  const d = elasticDeparture(strain, stress, E, toe, fromIndex, maxIndex, noise);
  if (d < 1) return null;
  let r = d;
  while (r < maxIndex && stress[r + 1]! < stress[r]! + noise) r++;
  r = maxForceSearchStart(strain, stress, r, maxIndex, noise);
  maxIndex = firstHighest(stress, r, maxIndex);
  const pEnd = windowEnd(strain, d, maxIndex, Y.plateauStrain, 5);
  if (pEnd - d < 5) return null;
  const level = medianOf(stress, d, pEnd);
  // Cheap refusal first (most curves are continuous; the smooth below costs 10–30 ms on 1,000,000 rows): a plateau
  // at least minStrain long keeps the median of the next half window within 1 % of its level (a sloping plateau rises
  // a few tenths of a percent over its whole length; serrations are symmetric about it).
  const w1 = windowEnd(strain, pEnd, maxIndex, 0.5 * Y.plateauStrain, 0);
  if (w1 - pEnd >= 3 && medianOf(stress, pEnd, w1) > 1.01 * level + (3 * noise) / Math.sqrt(w1 - pEnd)) return null;
  let r0 = d;
  while (r0 < maxIndex && !(stress[r0]! <= level + 3 * noise && (r0 + 1 > maxIndex || stress[r0 + 1]! <= level + 3 * noise))) r0++;
  const ext = plateauExtent(strain, stress, d, r0, maxIndex, level, noise);
  // The plateau ends at the later of where the moving average leaves the band about its level and where the hinge's
  // hardening branch leaves the plateau: each came early on some invented plateaus (the band's by 0.4 point on the
  // test's 2 % plateau, the moving average reaching into the hardening; the hinge's by 0.3 point on property-test
  // seed 35, a sawtooth of 1 % period read as the hardening's start), and a plateau left in the flow curve bends the
  // laws far more (seed 35: the best law 3.2 % off) than a few hardening samples left out.
  let end = ext.end;
  if (ext.h) { let j = ext.pa; while (j < maxIndex && strain[j]! < ext.h.hardeningStart) j++; end = Math.max(end, j); }
  if (!(strain[end]! - strain[d]! >= P.minStrain) || end - r0 < 5) return null;
  const span = Math.max(Y.hardeningStrain, strain[end]! - strain[d]!);
  let k = end;
  while (k < maxIndex && strain[k]! - strain[end]! < span) k++;
  if (k - end < 5) return null;
  let fp, fh;
  try { fp = linearFit(strain, stress, r0, end + 1); fh = linearFit(strain, stress, end, k + 1); } catch { return null; }
  const se = Math.hypot(P.kneeRatio * fp.slopeStandardError * Math.sqrt(lag1Factor(strain, stress, r0, end + 1, fp.intercept, fp.slope)),
    fh.slopeStandardError * Math.sqrt(lag1Factor(strain, stress, end, k + 1, fh.intercept, fh.slope)));
  const pSlope = Math.max(0, fp.slope);
  if (!(fh.slope - P.kneeRatio * pSlope > P.sigmas * se)) return null;
  return { startIndex: d, endIndex: end, level, lengthPct: (strain[end]! - strain[d]!) * 100, kneeRatio: pSlope > 0 ? fh.slope / pSlope : null };
}

/**
 * Step or bend at the end of a rise: over the break positions x_b (samples cFrom…cTo), the samples of [from, to)
 * up to x_b are compared with the rise line r(x) = a + b·x, the later ones (x ≤ x_b + 0.3 % strain) with a
 * straight segment that either starts anywhere (step: c + s·(x − x_b)) or on the line (hinge: r(x_b) + s·(x − x_b)).
 * Samples in (skipFrom, skipTo] after the break (the upper half of a fall, caught part-way down) belong to neither.
 * @returns true when the best step beats the best hinge by more than 25·σ̂² in the residual sum and lies below the
 * line carried on to its first sample.
 */
/** The step must beat the hinge by this many noise sd (√ of the residual-sum difference over σ̂²). */
const STEP_SIGMAS = 3;

function isStepDown(x: ArrayLike<number>, y: ArrayLike<number>, a: number, b: number, from: number, to: number, cFrom: number, cTo: number, noise: number, skipFrom: number, skipTo: number): boolean {
  let bestS = Infinity, bestH = Infinity, stepDown = false;
  for (let c = cFrom; c <= cTo; c++) {
    const xb = x[c]!, yb = a + b * xb;
    let left = 0, n = 0, sz = 0, sy = 0, szz = 0, szy = 0, syy = 0, sh = 0, shz = 0, z1 = NaN;
    for (let i = from; i < to; i++) {
      if (i <= c) { const r = y[i]! - (a + b * x[i]!); left += r * r; continue; }
      if (i > skipFrom && i <= skipTo) continue;
      const z = x[i]! - xb, v = y[i]!, h = v - yb;
      if (n === 0) z1 = z;
      n++; sz += z; sy += v; szz += z * z; szy += z * v; syy += v * v; sh += h * h; shz += h * z;
    }
    if (n < 3) continue;
    const den = n * szz - sz * sz;
    if (!(den > 0) || !(szz > 0)) continue;
    const sl = (n * szy - sz * sy) / den, c0 = (sy - sl * sz) / n;
    const ssrStep = left + Math.max(0, syy - c0 * sy - sl * szy);
    const ssrHinge = left + Math.max(0, sh - (shz * shz) / szz);
    // Down: the segment starts below the line carried on to the segment's first sample.
    if (ssrStep < bestS) { bestS = ssrStep; stepDown = c0 + sl * z1 < yb + b * z1; }
    if (ssrHinge < bestH) bestH = ssrHinge;
  }
  return stepDown && bestH - bestS > STEP_SIGMAS ** 2 * noise * noise;
}

/** Samples in the moving average {@link clearFall} compares (odd). */
const FALL_WINDOW = 9;
/** …and the standard errors of a difference of two such averages the fall must exceed. */
const FALL_SIGMAS = 6;

/**
 * A drawn-out yield drop: the moving average (9 samples) falls from its highest around the peak q to a low, within
 * 1 % strain of the peak and before it climbs back above that highest, by more than max(1 % of it, 6·√2·σ̂ₑ/√9)
 * (σ̂ₑ the noise's sd widened for its lag-1 correlation, passed in), and the stress later rises back above that low by
 * at least half the fall (Lüders yielding, then hardening; a necking fall never comes back). A continuous curve rises
 * past its knee, so its average never falls that far. On a machine several times softer than the specimen the fall
 * from ReH to the plateau takes 0.1–0.3 % strain (common practice: the load drops only as fast as the machine
 * springs back), and the step-or-bend test reads it as a bend (an invented record with an 8.8 % drop over 0.27 %
 * strain had been read as a yield plateau with no drop).
 * Units: strain fraction, MPa. Cost O(samples within 1 % strain of q) + O(maxIndex − q).
 */
function clearFall(strain: ArrayLike<number>, stress: ArrayLike<number>, q: number, maxIndex: number, noiseEff: number): boolean {
  const h = FALL_WINDOW >> 1;
  if (q - 2 * h < 0) return false;
  let end = q;
  while (end < maxIndex - h && strain[end + 1]! - strain[q]! <= 0.01) end++;
  if (end - q < 2 * FALL_WINDOW) return false;
  const ma = movingAverage(stress, q - 2 * h, end + h + 1, FALL_WINDOW);
  // ma[k] is the average centred on sample q − 2h + k (full windows from k = h on).
  let top = -Infinity;
  for (let k = h; k <= 3 * h; k++) top = Math.max(top, ma[k]!);
  let low = Infinity, at = -1;
  for (let k = 3 * h; k < ma.length - h; k++) {
    if (ma[k]! > top) break;
    if (ma[k]! < low) { low = ma[k]!; at = q - 2 * h + k; }
  }
  const fall = top - low;
  if (!(at > 0) || !(fall > Math.max(YIELD_DROP.minRelDrop * top, FALL_SIGMAS * Math.SQRT2 * noiseEff / Math.sqrt(FALL_WINDOW)))) return false;
  let later = -Infinity;
  for (let i = at + 1; i <= maxIndex; i++) if (stress[i]! > later) later = stress[i]!;
  return later >= low + 0.5 * fall;
}

/**
 * Break of "rise line, then a straight fall": for each break x_b at a sample strain in [from, to), the samples
 * up to x_b are compared with the rise line r(x) = a + b·x and the later ones with r(x_b) + m·(x − x_b), m by
 * least squares; the x_b with the least residual sum wins (a change-point fit, common practice). O(k²) in the
 * k samples of the window (a few hundred at most on a fall of 2·10⁻⁴ strain).
 * The break is refined between samples (the peak need not be a sample).
 * @returns the break strain, the fall's slope and the break positions within the 95 % profile band (residual sum
 * within 3.84·σ̂² of the least, σ̂ = `noise`), or null for a window of fewer than 3 samples or no falling break.
 */
function riseFallBreak(x: ArrayLike<number>, y: ArrayLike<number>, a: number, b: number, from: number, to: number, noise = 0): { xb: number; slope: number; xbLo: number; xbHi: number } | null {
  if (to - from < 3) return null;
  const ssrAt = (xb: number) => {
    const yb = a + b * xb;
    let ssr = 0, szz = 0, szy = 0, syy = 0;
    for (let i = from; i < to; i++) {
      if (x[i]! <= xb) { const r = y[i]! - (a + b * x[i]!); ssr += r * r; }
      else { const z = x[i]! - xb, v = y[i]! - yb; szz += z * z; szy += z * v; syy += v * v; }
    }
    if (!(szz > 0)) return { ssr: Infinity, m: 0 };
    const m = szy / szz;
    return m < 0 ? { ssr: ssr + syy - m * szy, m } : { ssr: Infinity, m };
  };
  const stride = Math.max(1, Math.floor((to - from) / 400));
  let best = Infinity, at = -1;
  for (let c = from; c < to - 1; c += stride) { const r = ssrAt(x[c]!); if (r.ssr < best) { best = r.ssr; at = c; } }
  if (at < 0) return null;
  // The peak lies between samples: refine the break over the two sample gaps around the best sample.
  const lo = x[Math.max(from, at - stride)]!, hi = x[Math.min(to - 1, at + stride)]!;
  let xb = x[at]!, m = ssrAt(xb).m;
  for (let k = 0; k <= 40; k++) { const t = lo + ((hi - lo) * k) / 40; const r = ssrAt(t); if (r.ssr < best) { best = r.ssr; xb = t; m = r.m; } }
  // Where the break could be: every sample position whose residual sum is within χ²₁(0.95)·σ̂² = 3.84·σ̂² of the
  // least (a profile-likelihood interval for the change point, Bates & Watts §6.1, from memory).
  let xbLo = xb, xbHi = xb;
  const limit = best + 3.84 * noise * noise;
  for (let c = from; c < to - 1; c += stride) { const r = ssrAt(x[c]!); if (r.ssr <= limit) { xbLo = Math.min(xbLo, x[c]!); xbHi = Math.max(xbHi, x[c]!); } }
  return { xb, slope: m, xbLo, xbHi };
}

/**
 * The yield plateau and the start of work hardening, fitted together: a level plateau (ISO 6892-1: yielding at
 * about constant force) that turns into a hardening branch at x_k, continuously — y = m + b₁·z + b₂·z²,
 * z = max(0, x − x_k); or a sloping plateau, y = m + p·(x − x_k) + b₁·z + b₂·z², taken where {@link slopeCounts}
 * finds it borne out (a hinge or
 * segmented regression, common practice; J. D. Toms and M. L. Lesperance, "Piecewise regression", Ecology 84
 * (2003), from memory). For a fixed x_k the model is linear; x_k is found by a grid and golden-section search on
 * the residual sum, over block averages (≤ 1000, {@link blockAverage}) of the samples [from, to).
 *
 * A serrated plateau spends equal time at every level between its troughs and crests, so its samples about the
 * plateau line are uniform over a width A plus the noise: variance A²/12 + σ̂². Hence A = √(12·excess) (the
 * excess of the variance of the raw samples up to x_k over the noise — the larger of σ̂² and the mean square of the
 * raw samples about the hardening branch — used only when it is clear of a variance's sampling error, 2·σ̂²·√(2/m)),
 * and the troughs lie A/2 below the line (method of moments).
 * ReL = the lowest point of the trough line over the plateau (ISO 6892-1 §3.10.2.2: the lowest stress during
 * yielding). Work hardening starts where the hardening branch leaves the trough line: x_k − (A/2)/slope, the
 * slope p + b₁ of the branch at x_k (at most half-way back to the plateau's start). x_k is sought from `earliest` on.
 * @returns null when the samples cannot hold the model (fewer than 12 blocks, or no plateau point before x_k).
 */
function plateauHinge(strain: ArrayLike<number>, stress: ArrayLike<number>, from: number, to: number, noise: number, earliest = -Infinity): { lowerYield: number; hardeningStart: number; level: number; slope: number; spread: number } | null {
  const n = to - from;
  if (n < 12) return null;
  const xs = new Float64Array(n), ys = new Float64Array(n);
  for (let k = 0; k < n; k++) { xs[k] = strain[from + k]!; ys[k] = stress[from + k]!; }
  const bl = blockAverage(xs, ys, Math.ceil(n / 1000));
  const nb = bl.x.length;
  if (nb < 12) return null;
  const x0 = bl.x[0]!, span = bl.x[nb - 1]! - x0;
  if (!(span > 0)) return null;
  const S = new Float64Array(16), T = new Float64Array(4), c = new Float64Array(4);
  const fitCols = (xk: number, sloped: boolean, curved: boolean) => {
    // Normal equations of the columns [1, z, z²] or, for a sloping plateau, [1, u, z, z²] (u = (x − xk)/span,
    // z = max(0, u)), weighted by block size; without z² for a straight branch.
    const K = (sloped ? 4 : 3) - (curved ? 0 : 1);
    S.fill(0); T.fill(0);
    let yy = 0;
    for (let b = 0; b < nb; b++) {
      const u = (bl.x[b]! - xk) / span, z = u > 0 ? u : 0, wt = bl.w[b]!, y = bl.y[b]!;
      if (sloped) { c[0] = 1; c[1] = u; c[2] = z; c[3] = z * z; } else { c[0] = 1; c[1] = z; c[2] = z * z; }
      for (let r = 0; r < K; r++) { T[r]! += wt * c[r]! * y; for (let q = r; q < K; q++) S[r * K + q]! += wt * c[r]! * c[q]!; }
      yy += wt * y * y;
    }
    for (let r = 0; r < K; r++) for (let q = 0; q < r; q++) S[r * K + q] = S[q * K + r]!;
    const coef = solveSmall(S.subarray(0, K * K), T.subarray(0, K), K, 1e-14);
    if (!coef) return null;
    let ssr = yy;
    for (let r = 0; r < K; r++) ssr -= coef[r]! * T[r]!;
    return { coef, ssr };
  };
  const solve = (xk: number, sloped: boolean) => {
    let r = fitCols(xk, sloped, true);
    const o = sloped ? 1 : 0;
    // Work hardening after a Lüders plateau slows as it goes (every hardening law here is concave): a branch that
    // bends upward would leave the plateau almost flat and let the knee slide early along it, so it is fitted straight.
    if (r && r.coef[o + 2]! > 0) r = fitCols(xk, sloped, false);
    if (!r) return null;
    const { coef, ssr } = r;
    // Work hardening rises from the plateau: a branch that leaves it downwards is a serration, not hardening.
    if (!(coef[o + 1]! > 0)) return null;
    return { m: coef[0]!, p: sloped ? coef[1]! / span : 0, b1: coef[o + 1]! / span, c1: coef[o + 1]!, c2: coef[o + 2] ?? 0, ssr };
  };
  const lo0 = Math.max(bl.x[3]!, Math.min(earliest, bl.x[nb - 5]!)), hi0 = bl.x[nb - 4]!;
  const G = 60;
  const search = (sloped: boolean) => {
    let best: { xk: number; f: NonNullable<ReturnType<typeof solve>> } | null = null;
    for (let g = 0; g <= G; g++) {
      const xk = lo0 + ((hi0 - lo0) * g) / G;
      const f = solve(xk, sloped);
      if (f && (!best || f.ssr < best.f.ssr)) best = { xk, f };
    }
    if (!best) return null;
    let a = Math.max(lo0, best.xk - (hi0 - lo0) / G), b = Math.min(hi0, best.xk + (hi0 - lo0) / G);
    const gr = (Math.sqrt(5) - 1) / 2;
    for (let k = 0; k < 40 && b - a > 1e-12; k++) {
      const x1 = b - gr * (b - a), x2 = a + gr * (b - a);
      const f1 = solve(x1, sloped), f2 = solve(x2, sloped);
      if (!f1 || !f2) break;
      if (f1.ssr < f2.ssr) b = x2; else a = x1;
    }
    const xm = 0.5 * (a + b), fm = solve(xm, sloped);
    if (fm && fm.ssr <= best.f.ssr) best = { xk: xm, f: fm };
    return best;
  };
  const level = search(false), sloping = search(true);
  // The sloping hinge only where it passes its tests; where the level one found no knee at all (its residual sum
  // taken as infinite) the knee-ratio test still applies, so a branch that barely leaves a tilted line is no hinge.
  const best = sloping && slopeCounts(bl, span, level ? level.f.ssr : Infinity, sloping.xk, sloping.f) ? sloping : level;
  if (!best) return null;
  const { xk, f } = best;
  // Spread of the raw plateau samples about the plateau line.
  let m = 0, v = 0;
  for (let i = from; i < to && strain[i]! <= xk; i++) { const r = stress[i]! - (f.m + f.p * (strain[i]! - xk)); v += r * r; m++; }
  if (m < 3) return null;
  v /= m - 1;
  // The noise as the hardening branch shows it (the same record, no serrations there): the mean square of the
  // raw samples about the fitted branch. It also holds what σ̂ from second differences misses (noise correlated
  // from sample to sample, a quantised load).
  let vh = 0, mh = 0;
  for (let i = from; i < to; i++) {
    const z = (strain[i]! - xk) / span;
    if (z <= 0) continue;
    const r = stress[i]! - (f.m + f.p * (strain[i]! - xk) + f.c1 * z + f.c2 * z * z);
    vh += r * r; mh++;
  }
  const n2 = mh >= 10 ? Math.max(noise * noise, vh / (mh - 3)) : noise * noise;
  const excess = v - n2;
  const A = excess > 2 * n2 * Math.sqrt(2 / m) ? Math.sqrt(12 * excess) : 0;
  const atStart = f.m + f.p * (strain[from]! - xk);
  const lowerYield = Math.min(atStart, f.m) - A / 2;
  // The branch's slope where it leaves the plateau: the larger of its tangent at x_k and its secant over the first
  // 0.3 % strain (a branch fitted flat at x_k and curving up later would otherwise send the back-step far back).
  const zs = Math.min(0.003, strain[to - 1]! - xk) / span;
  const secant = zs > 0 ? f.p + (f.c1 * zs + f.c2 * zs * zs) / (zs * span) : 0;
  const slope = Math.max(f.p + f.b1, secant);
  const back = slope > 0 ? Math.min(A / 2 / slope, 0.5 * (xk - strain[from]!)) : 0;
  return { lowerYield, hardeningStart: Math.max(strain[from]!, xk - back), level: f.m, slope, spread: A };
}


/** How far a sloping plateau's line is carried above where the level band ended, fraction of the level (Lüders plateaus rise or fall by well under 1 % of ReL — common practice). */
const PLATEAU_RISE = 0.01;
/** A sloping plateau is taken only when the hardening branch leaves it at least this many times steeper than it rises or falls (a knee, not a bend of the plateau). */
const KNEE_RATIO = 3;
/** …and when the slope lowers the residual sum by more than this many residual variances (widened for serially correlated residuals). */
const SLOPE_SIGMAS2 = 9;

/**
 * Whether a sloping plateau (plateauHinge's model with the plateau slope p free) is borne out against a level one:
 * the branch leaves the plateau at least KNEE_RATIO times steeper than |p|, and the residual sum falls by more than
 * SLOPE_SIGMAS2 residual variances, the variance taken from the sloping fit and multiplied by (1 + ρ)/(1 − ρ) for the
 * lag-1 autocorrelation ρ of its residuals (serrations and smooth noise are not independent from block to block;
 * the same n/n_eff as the elastic band's).
 */
function slopeCounts(bl: { x: ArrayLike<number>; y: ArrayLike<number> }, span: number, ssrLevel: number, xk: number, f: { m: number; p: number; c1: number; c2: number; b1: number; ssr: number }): boolean {
  if (!(f.p + f.b1 >= KNEE_RATIO * Math.abs(f.p))) return false;
  const nb = bl.x.length;
  let prev = NaN, s01 = 0, s00 = 0;
  for (let b = 0; b < nb; b++) {
    const u = (bl.x[b]! - xk) / span, z = u > 0 ? u : 0;
    const r = bl.y[b]! - (f.m + f.p * span * u + f.c1 * z + f.c2 * z * z);
    if (b > 0) s01 += prev * r;
    s00 += r * r; prev = r;
  }
  const rho = s00 > 0 ? Math.min(0.95, Math.max(0, s01 / s00)) : 0;
  // The residual sum is weighted by block size, Σ w·r², so its expected value is (blocks − 5)·σ² per sample.
  const variance = (f.ssr / Math.max(1, nb - 5)) * ((1 + rho) / (1 - rho));
  return ssrLevel - f.ssr > SLOPE_SIGMAS2 * variance;
}

/**
 * End of a rising plateau: the least-squares line of the smoothed stress ma over samples [from, to] (relative to
 * d) against strain, and the last sample where ma stays within `band` of that line carried on. Returns d + to when
 * the line does not rise (a level or falling plateau ends where the level band says).
 */
function plateauLineEnd(strain: ArrayLike<number>, ma: ArrayLike<number>, d: number, from: number, to: number, band: number): number {
  const n = to - from + 1;
  if (n < 10) return d + to;
  let sx = 0, sy = 0;
  for (let k = from; k <= to; k++) { sx += strain[d + k]!; sy += ma[k]!; }
  const xb = sx / n, yb = sy / n;
  let sxx = 0, sxy = 0;
  for (let k = from; k <= to; k++) { const dx = strain[d + k]! - xb; sxx += dx * dx; sxy += dx * (ma[k]! - yb); }
  if (!(sxx > 0) || !(sxy > 0)) return d + to;
  const slope = sxy / sxx;
  let end = to;
  for (let k = to; k < ma.length; k++) {
    const line = yb + slope * (strain[d + k]! - xb);
    // A plateau rises by little ("about constant force"): past PLATEAU_RISE of its level above where the level
    // band ended, the line is carried no further (a short plateau's line can be the start of hardening).
    if (line > ma[to]! + PLATEAU_RISE * yb) break;
    if (ma[k]! <= line + band) end = k;
  }
  return d + end;
}

/** (1 + ρ)/(1 − ρ) for the lag-1 autocorrelation ρ of the residuals of the line a + b·x over [from, to), ρ in [0, 0.9]. */
function lag1Factor(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, a: number, b: number): number {
  const rho = lineResidualLag1(x, y, from, to, a, b);
  return (1 + rho) / (1 - rho);
}

/**
 * The yield plateau from the departure d (the fall ending at r0) to its end: a moving average (window from the
 * plateau's scatter) against the band level ± max(3·scatter/√w, 0.3 % of the level), carried on along the plateau's
 * own line where it rises (plateauLineEnd), and the plateau and hardening fitted together (plateauHinge).
 * Units: strain fraction, stress MPa. Cost O(maxIndex − d).
 */
function plateauExtent(strain: ArrayLike<number>, stress: ArrayLike<number>, d: number, r0: number, maxIndex: number, level: number, noise: number): { end: number; pa: number; ib: number; h: ReturnType<typeof plateauHinge> } {
  const Y = YIELD_DROP;
  // Smoothed plateau from the departure to maximum force.
  const to = Math.max(d + 1, maxIndex + 1);
  const wNoise = Math.ceil(((noise / (0.0015 * level)) ** 2));
  // Rough plateau length for the cap: points until the raw stress first passes level + 5 %.
  let rough = r0;
  while (rough < maxIndex && !(stress[rough]! >= 1.05 * level && (rough + 1 > maxIndex || stress[rough + 1]! >= 1.05 * level) && (rough + 2 > maxIndex || stress[rough + 2]! >= 1.05 * level))) rough++;
  const cap = Math.max(1, Math.floor((rough - r0) / 6));
  const w1 = Math.max(1, Math.min(wNoise, cap)) | 1;
  // The window is sized from the scatter of the plateau about a first smooth (noise and serrations too fast
  // for that smooth), so the smoothed plateau's own scatter is about 0.15 % of the level.
  let scatter = noise;
  if (w1 > 1 && rough - r0 >= 10) {
    const ma1 = movingAverage(stress, r0, rough, w1);
    let v = 0;
    for (let i = r0; i < rough; i++) v += (stress[i]! - ma1[i - r0]!) ** 2;
    scatter = Math.max(noise, Math.sqrt((v / (rough - r0)) * (w1 / (w1 - 1))));
  }
  const w = Math.max(1, Math.min(Math.ceil((scatter / (0.0015 * level)) ** 2), cap)) | 1;
  const ma = movingAverage(stress, d, to, w);
  const band = Math.max((3 * scatter) / Math.sqrt(w), Y.plateauBand * level);
  // Only up to maximum force (the highest of the smooth after the fall): the necking side past it comes back down
  // through the plateau's level before fracture (a mild steel breaking at 78 % of Rm), and that is no plateau.
  const f0 = Math.min(ma.length - 1, Math.max(0, r0 - d));
  let top = f0;
  for (let k = f0 + 1; k < ma.length; k++) if (ma[k]! > ma[top]!) top = k;
  let s0 = 0;
  while (s0 < top && ma[s0]! > level + band) s0++;
  // A smooth that never comes within the band of the level before maximum force (a level read in a transient trough
  // narrower than the smooth, on a coarse record: a 3.5 % plateau had been read to 30 %): the band is about the
  // smooth's lowest point after the fall instead.
  let levelTop = level + band;
  if (s0 >= top) {
    s0 = f0;
    for (let k = f0 + 1; k <= top; k++) if (ma[k]! < ma[s0]!) s0 = k;
    levelTop = ma[s0]! + band;
  }
  let endRel = s0;
  for (let k = s0; k <= top; k++) if (ma[k]! <= levelTop) endRel = k;
  // A plateau whose serrations are slower than the smooth (saw-teeth that climb over tenths of a percent of strain
  // and fall back, on a soft machine) leaves the band at its first climb when its troughs sit above the level of its
  // first 0.3 % (the initial transient's): an invented record's 3.8 % plateau ended at 0.4 %. It goes on to the last
  // clear fall back near the level — work hardening does not fall.
  const bandEnd = endRel;
  endRel = lastPlateauFall(ma, endRel, top + 1, Math.max((8 * scatter) / Math.sqrt(w), 5 * noise, Y.plateauBand * level), level * (1 + Y.troughRise));
  const end = d + endRel;
  // ReL (ISO 6892-1 §3.10.2.2: the lowest stress during yielding, the initial transient ignored). The initial
  // transient is the fall and the first trough after it: it ends where the smoothed plateau first rises back
  // above its median after reaching it (ISO 6892-1 practice, from memory: the first minimum is ignored).
  const r0Rel = Math.max(0, r0 - d);
  let up = Math.max(r0Rel, s0);
  while (up < endRel && ma[up]! <= level) up++;
  let pa = d + up;
  if (end + 1 - pa < 10) pa = d + Math.max(r0Rel, s0);
  // A plateau that rises (a sloping Lüders plateau; ISO 6892-1 allows yielding at "about" constant force) passes
  // level + band before it ends: the smoothed plateau is then measured against its own least-squares line, carried
  // on, so that the hinge fit below sees the knee and the hardening after it.
  const sEnd = plateauLineEnd(strain, ma, d, pa - d, endRel, band);
  let ib = Math.max(end, sEnd);
  const hEnd = ib;
  while (ib < maxIndex && strain[ib]! - strain[hEnd]! < Y.hardeningStrain) ib++;
  // The hinge is sought in the second half of the plateau found by the smooth (its first half is plateau).
  // After a clear fall the plateau had not ended: the hinge is sought past its foot, and hardening starts no sooner.
  const fallFoot = endRel > bandEnd ? strain[end]! : -Infinity;
  const h0 = plateauHinge(strain, stress, pa, ib + 1, noise, Math.max(0.5 * (strain[pa]! + strain[end]!), fallFoot));
  const h = h0 && h0.hardeningStart < fallFoot ? { ...h0, hardeningStart: fallFoot } : h0;
  return { end, pa, ib, h };
}

/**
 * The foot of the last clear fall of a smoothed plateau over [from, to): where ma, having fallen by more than
 * `fall` below its highest since the last such foot, reaches its next low at or below `cap`; `from` when there is
 * none. Units: MPa. Cost O(to − from).
 */
function lastPlateauFall(ma: ArrayLike<number>, from: number, to: number, fall: number, cap: number): number {
  let end = from, peak = ma[from]!;
  for (let k = from + 1; k < to; k++) {
    const v = ma[k]!;
    if (v > peak) peak = v;
    else if (peak - v > fall && v <= cap) {
      while (k + 1 < to && ma[k + 1]! <= ma[k]!) k++;
      end = k; peak = ma[k]!;
    }
  }
  return end;
}

/** First index j ≥ from (at most maxIndex) with strain[j] − strain[from] ≥ span and j − from ≥ minCount. */
function windowEnd(strain: ArrayLike<number>, from: number, maxIndex: number, span: number, minCount: number): number {
  let j = from;
  while (j < maxIndex && (strain[j]! - strain[from]! < span || j - from < minCount)) j++;
  return j;
}

/**
 * Where the search for maximum force after a fall starts, given the walk's end r (the first sample past the departure
 * that rises by more than the noise). A fall drawn out over several samples may hold one that rises by more than the
 * noise part-way down: the walk stops there, and where ReH ≥ Rm that sample stood above every later one and bounded the
 * plateau at itself (an INVENTED record, E 69 GPa, an 8.7 % drop over 10 samples, Rm 3 % below ReH: no yield point
 * reported). Where the record rises again past the plateau's window (work hardening: a later sample 3σ̂ above the
 * window's median), the search starts at the lowest sample of that window instead, on or past the fall's foot (on a
 * continuous curve, the walk's end or within the noise of it). A top that necks at once never rises again and keeps
 * the walk's end (its fall is maximum force and necking, not a drop). Used by yieldPoint and yieldPlateau alike.
 */
function maxForceSearchStart(strain: ArrayLike<number>, stress: ArrayLike<number>, r: number, maxIndex: number, noise: number): number {
  const wEnd = windowEnd(strain, r, maxIndex, YIELD_DROP.plateauStrain, 5);
  return wEnd < maxIndex && stress[firstHighest(stress, wEnd, maxIndex)]! > medianOf(stress, r, wEnd + 1) + 3 * noise ? lowestIn(stress, r, wEnd) : r;
}

/** Index of the first lowest of y[from..to] (to included). */
function lowestIn(y: ArrayLike<number>, from: number, to: number): number {
  let k = from;
  for (let i = from + 1; i <= to; i++) if (y[i]! < y[k]!) k = i;
  return k;
}

/** Median (upper of the middle two) of y[from..to). */
function medianOf(y: ArrayLike<number>, from: number, to: number): number {
  const v = Float64Array.from({ length: to - from }, (_, k) => y[from + k]!).sort();
  return v[v.length >> 1]!;
}

/**
 * Where the loading leaves the elastic line for good (the sample index; −1 if it never does): {@link departure} from
 * σ = E(e − toe), the line refitted as below. Units: strain fraction, stress MPa, noise MPa.
 */
function elasticDeparture(strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, fromIndex: number, maxIndex: number, noise: number): number {
  const Y = YIELD_DROP;
  // Departure from the elastic line. The line starts as σ = E(e − e0); a modulus a few per cent off (few
  // elastic samples, or a band that reached into the knee) makes the line leave the data early, so the line is
  // refitted through the rising samples before the departure found (above a fifth of the stress there) and
  // the search repeated, until the departure stays put (at most 4 rounds).
  let lineA = -E * toe, lineB = E;
  // The line is known only to about σ̂·√(4/k) at the end of the k samples it rests on (prediction error just
  // past a least-squares line's range): the departure tolerance includes it, so a good sample at the peak of
  // a short rise is not taken for the fall.
  let lineFrom = fromIndex;
  const depart = (start: number) => departure(strain, stress, lineA, lineB, lineFrom, Y.departSigmas * noise, start, maxIndex);
  let d = depart(fromIndex);
  for (let round = 0; round < 4 && d > 0; round++) {
    // Back down the rise to a fifth of the stress, stopping at an earlier peak (YIELD_DROP.riseStepSigmas).
    let a = d;
    while (a > fromIndex && stress[a - 1]! >= 0.2 * stress[d - 1]! && stress[a - 1]! <= stress[a]! + Y.riseStepSigmas * noise) a--;
    if (d - a < 3) break;
    let f;
    try { f = linearFit(strain, stress, a, d); } catch { break; }
    if (!(f.slope > 0)) break;
    lineA = f.intercept; lineB = f.slope; lineFrom = a;
    const nd = depart(a);
    if (nd === d || nd < 1) break;
    d = nd;
  }
  return d;
}

// yieldPoint's record-long loops as small functions without closures (the same operations in the same order, so
// the same numbers): yieldPoint runs once per record and is long, and its search for the departure (a closure per
// sample for the tolerance) and for the highest stress ran unoptimised (speed follow-up J).

/**
 * The departure from the line σ = lineA + lineB·e: the first i ≥ max(1, start), i < maxIndex − 1, where samples i
 * and i + 1 both lie more than tol below the line, tol(k) = max(sn·√(1 + 4/max(2, k − lineFrom)), 0.005·line(k))
 * with sn = departSigmas·σ̂, and no sample of the next ten comes back within tol/2 of it; −1 if none.
 */
function departure(strain: ArrayLike<number>, stress: ArrayLike<number>, lineA: number, lineB: number, lineFrom: number, sn: number, start: number, maxIndex: number): number {
  for (let i = Math.max(1, start); i < maxIndex - 1; i++) {
    if (stress[i]! < lineA + lineB * strain[i]! - departTol(strain, lineA, lineB, lineFrom, sn, i) &&
      stress[i + 1]! < lineA + lineB * strain[i + 1]! - departTol(strain, lineA, lineB, lineFrom, sn, i + 1)) {
      // A departure lasts: past a real one the line rises away from the samples for good. Correlated load
      // noise (which the white-noise estimate reads low) can put two samples below the line in mid-rise; when
      // a sample of the next ten comes back to the line, it was such an excursion.
      let back = false;
      for (let j = i + 2; j <= Math.min(i + 11, maxIndex - 1) && !back; j++) back = stress[j]! >= lineA + lineB * strain[j]! - 0.5 * departTol(strain, lineA, lineB, lineFrom, sn, j);
      if (!back) return i;
    }
  }
  return -1;
}

/** The departure tolerance at sample k (see {@link departure}). */
function departTol(strain: ArrayLike<number>, lineA: number, lineB: number, lineFrom: number, sn: number, k: number): number {
  return Math.max(sn * Math.sqrt(1 + 4 / Math.max(2, k - lineFrom)), 0.005 * (lineA + lineB * strain[k]!));
}

/** Index of the first highest stress in [r, maxIndex] (r itself unless a later sample is strictly higher). */
function firstHighest(stress: ArrayLike<number>, r: number, maxIndex: number): number {
  let top = r;
  for (let i = r + 1; i <= maxIndex; i++) if (stress[i]! > stress[top]!) top = i;
  return top;
}
