import { ComputationError } from '../errors.js';
import { blockAverage } from '../fit/blockAverage.js';
import { movingAverage, solveSmall } from './localFit.js';

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

/** Block averages the top is fitted on (at most): 1000 keep every fit O(1000) on a 1,000,000-row record; 2000 gave the same Rm and Ag on the property test and cost twice the time. */
const TOP_BLOCKS = 1000;

/**
 * Maximum force from a local smooth fit around the top, not the highest raw sample (the highest of
 * many noisy samples is biased high by 2–3 noise standard deviations).
 *
 * A centred moving average (window n/50, odd, 5 to 20001 samples) finds the top. The outermost samples
 * whose average lies within δ = max(3σ̂/√w, 1 % of the top) of it, widened by w/4 samples on each side
 * (the average blunts the top) and to at least 9 samples, form the span. On the span (binned to at most
 * 1000 block averages, {@link blockAverage}) a model of two half-cubics joined at the vertex with zero slope
 * (s = Rm − a·u² + b·u³ on each side, its own a and b) is fitted by least squares, the vertex position found
 * by a grid and golden-section search: the necking side bends more sharply than the hardening side, and
 * neither side is a mirror of the other (a model without the right-hand cubic put Ag 0.3–1 point late on
 * necking branches that are not parabolas). Rm is the model's maximum. Ag is read at the middle of the
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
  // Two half-cubics joined at the vertex xv: s = Rm − aL·u² + bL·u³ left of it, Rm − aR·u² + bR·u³ right of it.
  // For a fixed xv the model is linear in (Rm, aL, bL, aR, bR); xv minimises the residual sum (grid, then golden
  // section).
  const h = Math.max(xb - xa, 1e-300);
  // Bin the span to at most 1000 groups of consecutive samples (mean strain, mean stress, count): a weighted
  // least-squares fit to the group means has the same minimiser in xv as the fit to every sample, up to the
  // few groups the vertex splits, and each trial xv costs O(1000) instead of O(samples).
  const m = i1 - i0;
  const xs = new Float64Array(m), ys = new Float64Array(m);
  for (let k = 0; k < m; k++) { xs[k] = strain[i0 + k]!; ys[k] = stress[i0 + k]!; }
  const blocks = blockAverage(xs, ys, Math.ceil(m / TOP_BLOCKS));
  const bx = blocks.x, by = blocks.y, bw = blocks.w, nb = bx.length;
  const K = 5, S = new Float64Array(K * K), T = new Float64Array(K), col = new Float64Array(K);
  const solve = (xv: number, rightCubic = true) => {
    // Columns: 1, then −u² and u³ on the left (hardening) side, −u² and u³ on the right (necking) side: each side
    // a quadratic with a cubic term that lets it bend on its own (the two sides of a top are not mirror images).
    // Normal equations accumulated over the bins, no allocation per bin.
    S.fill(0); T.fill(0);
    let tt = 0, nL = 0, nR = 0;
    for (let b = 0; b < nb; b++) {
      const u = (bx[b]! - xv) / h, y = by[b]!, wt = bw[b]!, u2 = u * u;
      col.fill(0); col[0] = 1;
      if (u < 0) { col[1] = -u2; col[2] = u2 * u; nL++; } else { col[3] = -u2; col[4] = u2 * u; nR++; }
      for (let r = 0; r < K; r++) { if (col[r] === 0) continue; T[r]! += wt * col[r]! * y; for (let c = r; c < K; c++) S[r * K + c]! += wt * col[r]! * col[c]!; }
      tt += wt * y * y;
    }
    // A side with fewer than 3 bins keeps its quadratic only; a side with none has neither.
    const idx = [0];
    if (nL >= 1) idx.push(1);
    if (nL >= 3) idx.push(2);
    if (nR >= 1) idx.push(3);
    if (nR >= 3 && rightCubic) idx.push(4);
    const m = idx.length;
    const Ss = new Float64Array(m * m), Ts = new Float64Array(m);
    idx.forEach((r, i) => { idx.forEach((c, j) => { Ss[i * m + j] = S[Math.min(r, c) * K + Math.max(r, c)]!; }); Ts[i] = T[r]!; });
    const sol = solveSmall(Ss, Ts, m, 1e-18);
    if (!sol) return null;
    const coef = [0, 0, 0, 0, 0];
    idx.forEach((k, r) => { coef[k] = sol[r]!; });
    let ssr = tt;
    for (let k = 0; k < K; k++) ssr -= coef[k]! * T[k]!;
    // A top must fall away from its vertex over the whole span: slope ≥ 0 on the left, ≤ 0 on the right
    // (the slope of −a·u² + b·u³ is monotone in u on each side from the vertex, so the span's ends decide).
    // A cubic that turns back up inside the span would put a second top there: such a vertex is refused.
    const uL = (xa - xv) / h, uR = (xb - xv) / h;
    if (uL < 0 && -2 * coef[1]! * uL + 3 * coef[2]! * uL * uL < 0) return null;
    if (uR > 0 && -2 * coef[3]! * uR + 3 * coef[4]! * uR * uR > 0) return null;
    return { Rm: coef[0]!, aL: coef[1]!, aR: coef[3]!, ssr };
  };
  // Vertex by the least residual sum: grid over the span, then golden section around the best grid point.
  const vertex = (rightCubic: boolean) => {
    let bx0 = strain[from + j]!, bf = solve(bx0, rightCubic);
    const G = 48;
    for (let g = 0; g <= G; g++) {
      const xv = xa + ((xb - xa) * g) / G;
      const f = solve(xv, rightCubic);
      if (f && (!bf || f.ssr < bf.ssr)) { bf = f; bx0 = xv; }
    }
    let lo = Math.max(xa, bx0 - (xb - xa) / G), hi = Math.min(xb, bx0 + (xb - xa) / G);
    const gr = (Math.sqrt(5) - 1) / 2;
    for (let k = 0; k < 30 && hi - lo > 1e-12; k++) {
      const x1 = hi - gr * (hi - lo), x2 = lo + gr * (hi - lo);
      const f1 = solve(x1, rightCubic), f2 = solve(x2, rightCubic);
      if (!f1 || !f2) break;
      if (f1.ssr < f2.ssr) hi = x2; else lo = x1;
    }
    const xm = 0.5 * (lo + hi);
    const fm = solve(xm, rightCubic);
    if (fm && bf && fm.ssr <= bf.ssr) { bf = fm; bx0 = xm; }
    return { x: bx0, f: bf };
  };
  // Ag from the full model (each side its own cubic); Rm from the model without the necking side's cubic term,
  // whose maximum has the smaller variance (the top is flat: Rm hardly depends on where the vertex sits, and one
  // parameter fewer halves the scatter of Rm on noisy coarse records, measured on the property test).
  const full = vertex(true);
  let bestX = full.x, bestF = full.f;
  const rmVertex = vertex(false), rmFit = rmVertex.f;
  let best = from + j;
  if (!bestF) return { stress: ma[j]!, strain: strain[best]!, index: best, points: i1 - i0, span: [xa, xb], flat: false, strainInterval95: [xa, xb] };
  // Profile interval of the vertex: scan xv over the span (G2 steps), keep the outermost xv still within the
  // χ²₁(0.95) band of the minimum; an end of the span still inside the band is reported as the span's end.
  // Both top models are scanned and the interval is their union with both vertices: where the necking side's
  // shape is in doubt, so is the vertex (model uncertainty joins the noise).
  let ciLo = bestX, ciHi = bestX;
  const G2 = 120;
  const simple = rmFit ? rmVertex : null;
  for (const [rightCubic, ref] of [[true, bestF], [false, simple?.f ?? null]] as const) {
    if (!ref) continue;
    const s2 = Math.max(noise * noise, ref.ssr / Math.max(1, nb - (rightCubic ? 6 : 5)));
    const limit = ref.ssr + 3.84 * s2;
    for (let g = 0; g <= G2; g++) {
      const xv = xa + ((xb - xa) * g) / G2;
      const f = solve(xv, rightCubic);
      if (f && f.ssr <= limit) { if (xv < ciLo) ciLo = xv; if (xv > ciHi) ciHi = xv; }
    }
  }
  if (simple) { ciLo = Math.min(ciLo, simple.x); ciHi = Math.max(ciHi, simple.x); }
  // Widen by one grid step on each side that the scan left unresolved.
  ciLo = Math.max(xa, ciLo - (xb - xa) / G2); ciHi = Math.min(xb, ciHi + (xb - xa) / G2);
  // Flat top: neither side falls by more than the fit's noise over the span.
  const fallL = bestF.aL * ((bestX - xa) / h) ** 2, fallR = bestF.aR * ((xb - bestX) / h) ** 2;
  const tolFit = (4 * noise) / Math.sqrt(i1 - i0);
  const flat = !(fallL > tolFit) && !(fallR > tolFit);
  const xAg = flat ? 0.5 * (xa + xb) : bestX;
  const topStress = rmFit ? rmFit.Rm : bestF.Rm;
  // Nearest sample (strain rises through the top; scan the span).
  let bd = Infinity;
  for (let i = i0; i < i1; i++) { const dd = Math.abs(strain[i]! - xAg); if (dd < bd) { bd = dd; best = i; } }
  return { stress: topStress, strain: xAg, index: best, points: i1 - i0, span: [xa, xb], flat, strainInterval95: [Math.min(ciLo, xAg), Math.max(ciHi, xAg)] };
}
