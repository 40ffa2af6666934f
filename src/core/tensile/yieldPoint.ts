import { linearFit } from '../fit/linearFit.js';

export interface YieldPointResult {
  upperYield: number;
  lowerYield: number;
  /** Index of the upper yield point and of the end of the yield-point plateau. */
  peakIndex: number;
  endIndex: number;
  /** Ae, engineering strain from ReH to the start of uniform work hardening, %. */
  elongationPct: number;
}

/**
 * Discontinuous yielding: upper yield strength ReH, lower yield strength ReL and yield-point
 * elongation Ae (ISO 6892-1 §3.10.2 and §3.6.5; ASTM E8 §7.6 "YPE").
 *
 * ReH is the first stress peak that lies within 0.5 % plastic strain of the elastic line and is
 * followed by a fall of at least max(0.5 % of the peak, 6 × the elastic-fit noise) before the stress
 * passes the peak again (a first fall of force, ISO 6892-1 §3.10.2.1). The plateau level is the median
 * stress over 0.2 % strain after the first minimum; the plateau ends at the last point before Rm whose
 * stress is within max(4 × noise, 0.5 %) of that level (our reading of "start of uniform work
 * hardening", §3.6.5). ReL is the
 * lowest stress on the plateau after the first local minimum (the initial transient ignored, §3.10.2.2)
 * when the plateau goes on past it, else that minimum.
 * Units: strain fraction (toe-compensated), stress MPa. @returns null for continuous yielding.
 */
export function yieldPoint(
  strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, fromIndex: number, maxIndex: number, noise: number,
): YieldPointResult | null {
  let peak = -1;
  for (let i = Math.max(1, fromIndex); i < maxIndex; i++) {
    const s = stress[i]!;
    if (!(s >= stress[i - 1]! && s > stress[i + 1]!)) continue;
    const plastic = strain[i]! - toe - s / E;
    if (plastic > 0.005) break;
    const tol = Math.max(0.005 * s, 6 * noise);
    let fell = false;
    for (let j = i + 1; j <= maxIndex; j++) {
      if (stress[j]! > s) break;
      if (stress[j]! < s - tol) { fell = true; break; }
    }
    if (fell) { peak = i; break; }
  }
  if (peak < 0) return null;
  const reh = stress[peak]!;
  // First local minimum after the peak (the end of the initial transient).
  let m1 = peak + 1;
  while (m1 + 1 <= maxIndex && stress[m1 + 1]! <= stress[m1]!) m1++;
  // Plateau level: median stress over 0.2 % strain after that minimum (at least 3 points).
  const lv: number[] = [];
  for (let k = m1; k <= maxIndex && (lv.length < 3 || strain[k]! - strain[m1]! < 0.002); k++) lv.push(stress[k]!);
  lv.sort((a, b) => a - b);
  const level = lv[Math.floor(lv.length / 2)]!;
  const band = Math.max(4 * noise, 0.005 * level);
  // End of the plateau: the last point at or below level + band before Rm.
  let end = m1;
  for (let k = m1; k <= maxIndex; k++) if (stress[k]! <= level + band) end = k;
  // Ae ends where work hardening starts: the intersection of the mean plateau level with a straight line
  // fitted to the first 0.5 % strain of the hardening branch (the construction of ASTM E8 for YPE).
  let endStrain = strain[end]!;
  {
    let j = end;
    while (j < maxIndex && strain[j]! - strain[end]! < 0.005) j++;
    let mean = 0, cnt = 0;
    for (let k = m1; k <= end; k++) { mean += stress[k]!; cnt++; }
    mean /= cnt;
    if (j - end >= 3) {
      try {
        const h = linearFit(strain, stress, end, j + 1);
        const x = (mean - h.intercept) / h.slope;
        if (h.slope > 0 && x >= strain[m1]! && x <= strain[j]!) endStrain = x;
      } catch { /* keep the last plateau point */ }
    }
  }
  let rel = stress[m1]!;
  if (end > m1 + 1) {
    rel = Infinity;
    for (let k = m1 + 1; k <= end; k++) rel = Math.min(rel, stress[k]!);
  }
  return { upperYield: reh, lowerYield: Math.min(rel, reh), peakIndex: peak, endIndex: end, elongationPct: (endStrain - strain[peak]!) * 100 };
}
