import { ComputationError } from '../errors.js';
import { movingAverage } from './localFit.js';

/** Where the maximum of force is and how it was read. */
export interface ForceMaximum {
  /** Rm: the maximum of the local least-squares parabola, MPa. */
  stress: number;
  /** Engineering strain (as recorded, toe not removed) where Ag is read: the vertex, or the middle of a top flat within the noise. */
  strain: number;
  /** Sample nearest to that strain. */
  index: number;
  /** Samples in the parabola fit and its strain span. */
  points: number;
  span: [number, number];
  /** True when the top is flat within the noise, so Ag is read at the middle of the flat part. */
  flat: boolean;
  /**
   * 95 % interval of the strain at maximum force (as `strain`, toe not removed), from the profile of the
   * residual sum over the vertex position: every xv whose best fit has ssr ≤ ssr_min + 3.84·s², with
   * s² = max(σ̂², ssr_min/(bins − 4)) (profile-likelihood interval for one parameter, χ²₁(0.95) = 3.84;
   * Bates & Watts, *Nonlinear Regression Analysis and Its Applications*, §6.1, from memory).
   */
  strainInterval95: [number, number];
}

/**
 * Maximum force from a local smooth fit around the top, not the highest raw sample (the highest of
 * many noisy samples is biased high by 2–3 noise standard deviations).
 *
 * A centred moving average (window n/50, odd, 5 to 20001 samples) finds the top. The outermost samples
 * whose average lies within δ = max(3σ̂/√w, 1 % of the top) of it, widened by w/4 samples on each side
 * (the average blunts the top) and to at least 9 samples, form the span. On the span (binned to at most
 * 2000 groups of consecutive samples) a model of two half-parabolas joined at the vertex is fitted by
 * least squares, the vertex position found by a grid and golden-section search: the necking side bends
 * much more sharply than the hardening side. Rm is the model's maximum. Ag is read at the middle of the
 * part of the span where the model lies within 4σ̂/√m of Rm (m samples in the fit): for a curved top
 * that is the vertex; where the top is flat within the noise it is the middle of the flat part (ASTM
 * E8/E8M practice for flat tops, from memory). ISO 6892-1 §3.10.1: for a record with a yield drop, Fm is
 * the highest force after work hardening begins — the caller passes `from` after the yield plateau.
 * Units: strain fraction, stress MPa, σ̂ = `noise` MPa. Valid: `to − from` ≥ 3. Cost: O(to − from).
 * @example forceMaximum([0, 1, 2, 3, 4], [0, 3, 4, 3, 0], 0, 0, 5).stress // 4.0
 */
export function forceMaximum(strain: ArrayLike<number>, stress: ArrayLike<number>, noise: number, from: number, to: number): ForceMaximum {
  const n = to - from;
  if (!(n >= 3)) throw new ComputationError('record.maximumForce', `${n} samples between index ${from} and ${to}; at least 3 are needed to fit the top of the record`);
  let w = Math.max(5, Math.min(20001, Math.round(n / 50))) | 1;
  if (w > n) w = Math.max(1, n) | 1;
  const ma = movingAverage(stress, from, to, w);
  let j = 0;
  for (let k = 1; k < n; k++) if (ma[k]! > ma[j]!) j = k;
  const delta = Math.max((3 * noise) / Math.sqrt(w), 0.01 * Math.abs(ma[j]!));
  // Outermost samples whose average is within delta of the top (a contiguous scan would stop at the first
  // noise dip of the average).
  let a = 0, b = n - 1;
  while (a < j && ma[a]! < ma[j]! - delta) a++;
  while (b > j && ma[b]! < ma[j]! - delta) b--;
  // The averaging window blunts the top: widen the span by w/4 samples on each side.
  a = Math.max(0, a - (w >> 2)); b = Math.min(n - 1, b + (w >> 2));
  while (b - a + 1 < 9 && (a > 0 || b < n - 1)) { if (a > 0) a--; if (b < n - 1) b++; }
  const i0 = from + a, i1 = from + b + 1;
  const xa = strain[i0]!, xb = strain[i1 - 1]!;
  // Two half-parabolas joined at the vertex xv: s = Rm − aL(x − xv)² left of it, Rm − aR(x − xv)² right of it.
  // For a fixed xv the model is linear in (Rm, aL, aR); xv minimises the residual sum (grid, then golden section).
  const h = Math.max(xb - xa, 1e-300);
  // Bin the span to at most 2000 groups of consecutive samples (mean strain, mean stress, count): a weighted
  // least-squares fit to the group means has the same minimiser in xv as the fit to every sample, up to the
  // few groups the vertex splits, and each trial xv costs O(2000) instead of O(samples).
  const m = i1 - i0, nb = Math.min(m, 2000);
  const bx = new Float64Array(nb), by = new Float64Array(nb), bw = new Float64Array(nb);
  for (let b = 0; b < nb; b++) {
    const s0 = i0 + Math.floor((b * m) / nb), s1 = i0 + Math.floor(((b + 1) * m) / nb);
    let sx = 0, sy = 0;
    for (let i = s0; i < s1; i++) { sx += strain[i]!; sy += stress[i]!; }
    bx[b] = sx / (s1 - s0); by[b] = sy / (s1 - s0); bw[b] = s1 - s0;
  }
  const solve = (xv: number) => {
    // Columns: 1, −u² (left), −u² (right), u³ (left): a cubic term lets the long hardening side bend.
    // Sums of the 4×4 normal equations, accumulated in scalars (no allocation per sample).
    let s00 = 0, s01 = 0, s02 = 0, s03 = 0, s11 = 0, s13 = 0, s22 = 0, s33 = 0, t0 = 0, t1 = 0, t2 = 0, t3 = 0, tt = 0;
    for (let b = 0; b < nb; b++) {
      const u = (bx[b]! - xv) / h, y = by[b]!, wt = bw[b]!, u2 = u * u;
      s00 += wt; t0 += wt * y; tt += wt * y * y;
      if (u < 0) { const c1 = -u2, c3 = u2 * u; s01 += wt * c1; s03 += wt * c3; s11 += wt * c1 * c1; s13 += wt * c1 * c3; s33 += wt * c3 * c3; t1 += wt * c1 * y; t3 += wt * c3 * y; }
      else { const c2 = -u2; s02 += wt * c2; s22 += wt * c2 * c2; t2 += wt * c2 * y; }
    }
    const S = [s00, s01, s02, s03, 0, s11, 0, s13, 0, 0, s22, 0, 0, 0, 0, s33], T = [t0, t1, t2, t3];
    const idx = [0, 1, 2, 3].filter((k) => k === 0 || S[k * 4 + k]! > 0);
    if (idx.includes(3) && idx.filter((k) => k === 1 || k === 3).length < 2) idx.splice(idx.indexOf(3), 1);
    const M = idx.map((r) => [...idx.map((c) => S[Math.min(r, c) * 4 + Math.max(r, c)]!), T[r]!]);
    const m = M.length;
    for (let c = 0; c < m; c++) {
      let piv = c;
      for (let r = c + 1; r < m; r++) if (Math.abs(M[r]![c]!) > Math.abs(M[piv]![c]!)) piv = r;
      [M[c], M[piv]] = [M[piv]!, M[c]!];
      if (!(Math.abs(M[c]![c]!) > 1e-12 * Math.abs(M[0]![0]!) * 1e-6)) return null;
      for (let r = 0; r < m; r++) {
        if (r === c) continue;
        const f = M[r]![c]! / M[c]![c]!;
        for (let k = c; k <= m; k++) M[r]![k]! -= f * M[c]![k]!;
      }
    }
    const coef = [0, 0, 0, 0];
    idx.forEach((k, r) => { coef[k] = M[r]![m]! / M[r]![r]!; });
    let ssr = tt;
    for (let k = 0; k < 4; k++) ssr -= coef[k]! * T[k]!;
    return { Rm: coef[0]!, aL: coef[1]!, aR: coef[2]!, ssr };
  };
  let bestX = strain[from + j]!, bestF = solve(bestX);
  const G = 48;
  for (let g = 0; g <= G; g++) {
    const xv = xa + ((xb - xa) * g) / G;
    const f = solve(xv);
    if (f && (!bestF || f.ssr < bestF.ssr)) { bestF = f; bestX = xv; }
  }
  let lo = Math.max(xa, bestX - (xb - xa) / G), hi = Math.min(xb, bestX + (xb - xa) / G);
  const gr = (Math.sqrt(5) - 1) / 2;
  for (let k = 0; k < 30 && hi - lo > 1e-12; k++) {
    const x1 = hi - gr * (hi - lo), x2 = lo + gr * (hi - lo);
    const f1 = solve(x1), f2 = solve(x2);
    if (!f1 || !f2) break;
    if (f1.ssr < f2.ssr) hi = x2; else lo = x1;
  }
  const xm = 0.5 * (lo + hi);
  const fm = solve(xm);
  if (fm && bestF && fm.ssr <= bestF.ssr) { bestF = fm; bestX = xm; }
  let best = from + j;
  if (!bestF) return { stress: ma[j]!, strain: strain[best]!, index: best, points: i1 - i0, span: [xa, xb], flat: false, strainInterval95: [xa, xb] };
  // Profile interval of the vertex: scan xv over the span (G2 steps), keep the outermost xv still within the
  // χ²₁(0.95) band of the minimum; an end of the span still inside the band is reported as the span's end.
  const s2 = Math.max(noise * noise, bestF.ssr / Math.max(1, nb - 4));
  const limit = bestF.ssr + 3.84 * s2;
  let ciLo = bestX, ciHi = bestX;
  const G2 = 200;
  for (let g = 0; g <= G2; g++) {
    const xv = xa + ((xb - xa) * g) / G2;
    const f = solve(xv);
    if (f && f.ssr <= limit) { if (xv < ciLo) ciLo = xv; if (xv > ciHi) ciHi = xv; }
  }
  // Widen by one grid step on each side that the scan left unresolved.
  ciLo = Math.max(xa, ciLo - (xb - xa) / G2); ciHi = Math.min(xb, ciHi + (xb - xa) / G2);
  // Flat top: neither side falls by more than the fit's noise over the span.
  const fallL = bestF.aL * ((bestX - xa) / h) ** 2, fallR = bestF.aR * ((xb - bestX) / h) ** 2;
  const tolFit = (4 * noise) / Math.sqrt(i1 - i0);
  const flat = !(fallL > tolFit) && !(fallR > tolFit);
  const xAg = flat ? 0.5 * (xa + xb) : bestX;
  const topStress = bestF.Rm;
  // Nearest sample (strain rises through the top; scan the span).
  let bd = Infinity;
  for (let i = i0; i < i1; i++) { const dd = Math.abs(strain[i]! - xAg); if (dd < bd) { bd = dd; best = i; } }
  return { stress: topStress, strain: xAg, index: best, points: i1 - i0, span: [xa, xb], flat, strainInterval95: [Math.min(ciLo, xAg), Math.max(ciHi, xAg)] };
}
