import { linearFit } from '../fit/linearFit.js';
import { movingAverage } from './localFit.js';

export interface YieldPointResult {
  upperYield: number;
  lowerYield: number;
  /** Index of the upper yield point and of the end of the yield-point plateau. */
  peakIndex: number;
  endIndex: number;
  /** Ae, engineering strain from ReH to the start of uniform work hardening, %. */
  elongationPct: number;
  /** The fall from ReH to the plateau level and the smallest fall that would have counted, MPa. */
  drop: number;
  dropThreshold: number;
}

/** Thresholds of the yield-drop test, stated once. */
export const YIELD_DROP = {
  /** The fall must exceed this fraction of ReH (common practice: drops under ~2 % are hard to tell from a rounded knee in a noisy record)… */
  minRelDrop: 0.02,
  /** …and this many standard errors of (ReH estimate − plateau level). */
  sigmas: 4,
  /** A departure from the elastic line: this many noise sd below it, two samples in a row. */
  departSigmas: 4,
  /** Strain over which the plateau level after the drop is taken (median), fraction. */
  plateauStrain: 0.003,
  /** The peak must lie within this plastic strain of the elastic line. */
  maxPeakPlastic: 0.005,
} as const;

/**
 * Discontinuous yielding: upper yield strength ReH, lower yield strength ReL and yield-point
 * elongation Ae (ISO 6892-1 §3.10.2 and §3.6.5; ASTM E8 §7.6 "YPE"), reported only for a drop that
 * stands clear of the record's noise and is followed by a plateau.
 *
 * - The elastic rise ends at the first of two samples in a row lying more than 4σ̂ (and 0.5 %) below the
 *   elastic line σ = E(e − e0); the peak q is the last sample before it still within 2σ̂ of the line.
 * - ReH is the value at q of a least-squares line through the rising samples above half the peak stress
 *   (noise of the estimate about σ̂·2/√k for k samples, not the noise of one sample).
 * - The plateau level is the median stress over 0.3 % strain after the departure. A yield drop is
 *   reported only when ReH − level > max(2 % of ReH, 4 standard errors of that difference).
 *   A continuous curve has level ≥ the curve at the knee and never passes.
 * - ReL (ISO 6892-1 §3.10.2.2: the lowest stress during plastic yielding, the initial transient
 *   ignored) is the lowest value of a moving average (window chosen from σ̂ so its noise is about 0.15 %
 *   of the level, at most a sixth of the plateau) from where the average first reaches the plateau level
 *   to the end of the plateau. The plateau ends at the last averaged point within max(3 noise sd of the
 *   average, 1 %) of the level before Rm; Ae ends where the level meets a line fitted to the first 0.5 %
 *   strain of the hardening branch (the ASTM E8 construction for YPE, from memory).
 * Units: strain fraction (toe-compensated by `toe`), stress MPa; σ̂ = `noise` in MPa. `maxIndex`: the
 * last index to look at (fracture); the plateau ends before the highest stress after the departure.
 * Cost: O(n). @returns null for continuous yielding.
 */
export function yieldPoint(
  strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, fromIndex: number, maxIndex: number, noise: number,
): YieldPointResult | null {
  const Y = YIELD_DROP;
  // Departure from the elastic line. The line starts as σ = E(e − e0); a modulus a few per cent off (few
  // elastic samples, or a band that reached into the knee) makes the line leave the data early, so the line is
  // refitted through the rising samples before the departure found (above a fifth of the stress there) and
  // the search repeated, until the departure stays put (at most 4 rounds).
  let lineA = -E * toe, lineB = E;
  const lineAt = (i: number) => lineA + lineB * strain[i]!;
  // The line is known only to about σ̂·√(4/k) at the end of the k samples it rests on (prediction error just
  // past a least-squares line's range): the departure tolerance includes it, so a good sample at the peak of
  // a short rise is not taken for the fall.
  let lineFrom = fromIndex;
  const depart = (start: number) => {
    for (let i = Math.max(1, start); i < maxIndex - 1; i++) {
      const tol = (k: number) => Math.max(Y.departSigmas * noise * Math.sqrt(1 + 4 / Math.max(2, k - lineFrom)), 0.005 * lineAt(k));
      if (stress[i]! < lineAt(i) - tol(i) && stress[i + 1]! < lineAt(i + 1) - tol(i + 1)) return i;
    }
    return -1;
  };
  let d = depart(fromIndex);
  for (let round = 0; round < 4 && d > 0; round++) {
    let a = d;
    while (a > fromIndex && stress[a - 1]! >= 0.2 * stress[d - 1]! && stress[a - 1]! <= stress[a]! + 3 * noise) a--;
    if (d - a < 3) break;
    let f;
    try { f = linearFit(strain, stress, a, d); } catch { break; }
    if (!(f.slope > 0)) break;
    lineA = f.intercept; lineB = f.slope; lineFrom = a;
    const nd = depart(a);
    if (nd === d || nd < 1) break;
    d = nd;
  }
  if (d < 1) return null;
  // Maximum force after the departure (ISO 6892-1: Fm after work hardening begins) bounds the plateau.
  let top = d;
  for (let i = d + 1; i <= maxIndex; i++) if (stress[i]! > stress[top]!) top = i;
  maxIndex = top;
  // The peak: the highest sample from the elastic band to the departure (still on the elastic line).
  let q = Math.max(fromIndex, d - 1);
  for (let i = Math.max(fromIndex, 0); i < d; i++) if (stress[i]! > stress[q]!) q = i;
  if (strain[q]! - toe - stress[q]! / E > Y.maxPeakPlastic) return null;
  // ReH from a line through the rising samples above half the peak stress, read at the peak.
  let k0 = q;
  while (k0 > fromIndex && stress[k0 - 1]! >= 0.5 * stress[q]! && stress[k0 - 1]! < stress[k0]! + 3 * noise) k0--;
  let reh = stress[q]!;
  let seReh = noise;
  if (q - k0 >= 3) {
    try {
      // The line through the rise with the peak sample left out, so a sample already on the fall cannot pull
      // the line to itself. A peak within 1.5 noise sd of that line is read on the line (precise to σ̂·2/√k);
      // a peak further below it is already on the fall, and the highest noise-free sample is the larger of
      // the last sample on the line (read on the line) and the peak sample as recorded.
      const k = q - k0;
      const f = linearFit(strain, stress, k0, q);
      const v = f.intercept + f.slope * strain[q]!;
      if (stress[q]! >= v - 1.5 * noise * Math.sqrt(1 + 4 / k)) { reh = v; seReh = noise * Math.sqrt(4 / k); }
      else { reh = Math.max(f.intercept + f.slope * strain[q - 1]!, stress[q]!); }
    } catch { /* keep the sample */ }
  }
  // Plateau level after the departure.
  let pEnd = d;
  while (pEnd < maxIndex && (strain[pEnd]! - strain[d]! < Y.plateauStrain || pEnd - d < 5)) pEnd++;
  const nLevel = pEnd - d;
  if (nLevel < 3) return null;
  const lv = Float64Array.from({ length: nLevel }, (_, k) => stress[d + k]!).sort();
  const level = lv[nLevel >> 1]!;
  const seDiff = Math.sqrt(seReh * seReh + (1.57 * noise * noise) / nLevel);
  const threshold = Math.max(Y.minRelDrop * reh, Y.sigmas * seDiff);
  const drop = reh - level;
  if (!(drop > threshold)) return null;
  // Smoothed plateau from the departure to maximum force.
  const to = Math.max(d + 1, maxIndex + 1);
  const wNoise = Math.ceil(((noise / (0.0015 * level)) ** 2));
  // Rough plateau length for the cap: points until the raw stress first passes level + 5 %.
  // It starts where the raw stress first reaches the level (after the fall from ReH, which can take several
  // samples on a finely sampled record: counting from the departure would stop inside the fall).
  let r0 = d;
  while (r0 < maxIndex && stress[r0]! > level + 3 * noise) r0++;
  let rough = r0;
  while (rough < maxIndex && stress[rough]! < 1.05 * level) rough++;
  const w = Math.max(1, Math.min(wNoise, Math.floor((rough - r0) / 6))) | 1;
  const ma = movingAverage(stress, d, to, w);
  const band = Math.max((3 * noise) / Math.sqrt(w), 0.01 * level);
  let s0 = 0;
  while (s0 < ma.length - 1 && ma[s0]! > level + band) s0++;
  let endRel = s0;
  for (let k = s0; k < ma.length; k++) if (ma[k]! <= level + band) endRel = k;
  const end = d + endRel;
  let rel = Infinity;
  const from = Math.min(s0 + (w >> 1), endRel);
  for (let k = from; k <= Math.max(from, endRel - (w >> 1)); k++) rel = Math.min(rel, ma[k]!);
  if (!Number.isFinite(rel)) rel = level;
  // Ae ends where work hardening starts: plateau mean level meets a line through the first 0.5 % strain of hardening.
  let endStrain = strain[end]!;
  {
    let mean = 0;
    for (let k = s0; k <= endRel; k++) mean += ma[k]!;
    mean /= endRel - s0 + 1;
    let j = end;
    while (j < maxIndex && strain[j]! - strain[end]! < 0.005) j++;
    if (j - end >= 3) {
      try {
        const h = linearFit(strain, stress, end, j + 1);
        const x = (mean - h.intercept) / h.slope;
        if (h.slope > 0 && x >= strain[d]! && x <= strain[j]!) endStrain = x;
      } catch { /* keep the last plateau point */ }
    }
  }
  return { upperYield: reh, lowerYield: Math.min(rel, reh), peakIndex: q, endIndex: end, elongationPct: (endStrain - strain[q]!) * 100, drop, dropThreshold: threshold };
}
