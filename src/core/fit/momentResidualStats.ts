import type { LawName } from '../flow/types.js';
import { REDUCTION_DEFAULTS } from './blockAverage.js';
import { blockMoments, MOMENT_STRIDE, NODES, type BlockMoments } from './blockMoments.js';
import { lawResidualStats, lawValues, type LawData } from './lawNormalEquations.js';

/** SSR, SST and lag-1 sum of a law on the full curve, and how they were found. */
export interface CurveResidualStats {
  /** Σ rᵢ², rᵢ = σ(xᵢ; p) − yᵢ over every point of the curve, MPa². */
  ssr: number;
  /** Σ (yᵢ − ȳ)², MPa². */
  sst: number;
  /** Σ rᵢrᵢ₋₁ over every consecutive pair, MPa². */
  lag1: number;
  ok: boolean;
}

/** {@link momentResidualStats}'s result: the statistics and what the moments left to exact evaluation. */
export interface MomentResidualStats {
  ssr: number;
  lag1: number;
  ok: boolean;
  /** Blocks evaluated point by point (the local quadratic was not accurate enough there, or a value not finite). */
  exactBlocks: number;
  /** Points in those blocks. */
  exactPoints: number;
  /** Estimated bound on |SSR(moments) − SSR(every point)| / SSR; the same bounds |Δ lag-1 sum| / SSR. */
  bound: number;
  /** Points in the blocks summed (all of them unless `fromX` or `toX` left some out). */
  points: number;
}

/**
 * SSR, SST and lag-1 residual sum of `law` at `p` on the FULL curve `d` (every point, whatever the
 * fit was made on). Curves of at least REDUCTION_DEFAULTS.momentStatsFrom points without weights use
 * {@link momentResidualStats} (block moments, five law values per block; agrees with the point-by-point
 * sums to about REDUCTION_DEFAULTS.momentRelTol of SSR); shorter curves use the exact pass
 * {@link lawResidualStats}, unchanged. SST is law-independent and comes with the moments (once per curve).
 * Units MPa². Valid: d packed by lawData with finite, positive x and y.
 * @example curveResidualStats('voce', lawData(x, y), Float64Array.of(300, 200, 12)).ssr
 */
export function curveResidualStats(law: LawName, d: LawData, p: Float64Array): CurveResidualStats {
  const n = d.x.length;
  if (n < REDUCTION_DEFAULTS.momentStatsFrom || d.w) return lawResidualStats(law, d, p);
  const mom = (d.moments ??= blockMoments(d.x, d.y, REDUCTION_DEFAULTS.momentBlock));
  const r = momentResidualStats(law, d, p, mom);
  return { ssr: r.ssr, sst: mom.sst, lag1: r.lag1, ok: r.ok };
}

/**
 * Σ rᵢ² of `law` at `p` over the points of `d` whose strain lies in [from, to] (rᵢ = σ(xᵢ; p) − yᵢ), and how many
 * points that is: the misfit of a law over part of a curve (the part before its end, which decides where the law
 * puts maximum force: lawUniformElongation). Curves of at least REDUCTION_DEFAULTS.momentStatsFrom points without
 * weights: from the block moments ({@link momentResidualStats} with fromX = from, toX = to; a block counts when its
 * strain midpoint lies in the range, so each boundary is one block wide); shorter ones point by point (weighted,
 * wᵢrᵢ² and Σwᵢ, where d has weights). Units: MPa², strain as d.x. Valid: d packed by lawData. Returns points 0
 * (and ssr 0) when no point lies in the range.
 * @example upperResidualSquares('voce', lawData(x, y), Float64Array.of(300, 200, 12), 0.1, 0.3) // { ssr, points }
 */
export function upperResidualSquares(law: LawName, d: LawData, p: Float64Array, from: number, to: number): { ssr: number; points: number } {
  const n = d.x.length;
  if (n >= REDUCTION_DEFAULTS.momentStatsFrom && !d.w) {
    const mom = (d.moments ??= blockMoments(d.x, d.y, REDUCTION_DEFAULTS.momentBlock));
    const r = momentResidualStats(law, d, p, mom, REDUCTION_DEFAULTS.momentRelTol, from, to);
    return { ssr: r.ssr, points: r.points };
  }
  const v = new Float64Array(n);
  lawValues(law, d.x, d.lx, p, v);
  const { x, y, w } = d;
  let ssr = 0, points = 0;
  for (let i = 0; i < n; i++) {
    if (!(x[i]! >= from && x[i]! <= to)) continue;
    const r = v[i]! - y[i]!, wi = w ? w[i]! : 1;
    ssr += wi * r * r;
    points += wi;
  }
  return { ssr, points };
}

/**
 * SSR = Σ rᵢ² and the lag-1 sum Σ rᵢrᵢ₋₁ of `law` at `p` over every point of `d`, from the curve's
 * law-independent block moments ({@link blockMoments}) and five values of the law per block.
 *
 * In block b (midpoint m, half-width h, mean stress ȳ; dᵢ = xᵢ − m, eᵢ = yᵢ − ȳ) the law is replaced by
 * the quadratic P(d) = f₀ + s·d + q·d² through its values at the block's smallest strain, m and its
 * largest strain. With A = f₀ − ȳ the residual is rᵢ ≈ A + s·dᵢ + q·dᵢ² − eᵢ, so
 *   SSR_b = n·A² + s²Σd² + q²Σd⁴ + 2AsΣd + 2AqΣd² + 2sqΣd³ − 2(AΣe + sΣde + qΣd²e) + Σe²,
 * and, from Σ rᵢrᵢ₋₁ = ½[Σ(rᵢ² + rᵢ₋₁²) − Σ(rᵢ − rᵢ₋₁)²] over the pairs inside the block,
 *   lag_b = SSR_b − ½(r_first² + r_last²) − ½(s²ΣΔd² + q²ΣΔq² + ΣΔe² + 2sqΣΔdΔq − 2sΣΔdΔe − 2qΣΔqΔe),
 * plus r_last(b−1)·r_first(b) across each block boundary (both from their blocks' quadratics).
 * Exact algebra; the only approximation is P for the law. Its error within the block is the cubic
 * interpolation remainder f‴(ξ)/6·(d − d_lo)·d·(d − d_hi), at most about f‴h³/15.6; it is measured by
 * the law's own values at m ∓ h/2 (where that remainder is 0.375/0.385 of its largest value), and
 * β_b = 2·max of the two differences is taken as the block's bound on |σ − P|. Then, by
 * Cauchy–Schwarz, |ΔSSR_b| ≤ 2β_b·sqrt(n_b·SSR_b) + n_b·β_b² (the lag-1 sum alike). A block whose β_b
 * exceeds relTol·RMSE (RMSE estimated from the blocks), whose sums could lose more than that to
 * rounding, or whose law values are not finite is summed point by point instead; so the whole SSR
 * and lag-1 sum agree with the point-by-point sums to about 2·relTol·SSR (returned as `bound`).
 * Near yield, where the curvature of a power law is largest, the blocks are narrow in strain anyway
 * (the strain rate of a test is nearly constant) and any that are not are evaluated exactly.
 * Sources: Taylor/Lagrange interpolation remainder (any numerical analysis text, e.g. Burden & Faires
 * §3.1 — from memory); the sum-of-squares algebra is exact. With `fromX` and `toX`, only the blocks whose
 * strain midpoint lies in [fromX, toX] are summed (the lag-1 sum across a boundary only between two of them; `points` says how
 * many points that is). Units: MPa². Valid: d unweighted, x > 0.
 * @example momentResidualStats('voce', d, p, blockMoments(d.x, d.y, 128)).bound // e.g. 3e-10
 */
export function momentResidualStats(law: LawName, d: LawData, p: Float64Array, mom: BlockMoments, relTol: number = REDUCTION_DEFAULTS.momentRelTol, fromX = -Infinity, toX = Infinity): MomentResidualStats {
  const { x, y } = d;
  const { count, size, data } = mom;
  const F = new Float64Array(count * NODES);
  lawValues(law, mom.nodes, mom.lnNodes, p, F);
  const ssrB = new Float64Array(count), lagB = new Float64Array(count), rFirst = new Float64Array(count), rLast = new Float64Array(count);
  const beta = new Float64Array(count), round = new Float64Array(count);
  // Blocks whose strain midpoint lies outside [fromX, toX] are left out (upperResidualSquares); with the defaults
  // none is, and every sum below is the one made before that option existed, in the same order.
  const used = new Uint8Array(count);
  let ssrEst = 0, nUsed = 0, blocks = 0;
  for (let b = 0; b < count; b++) {
    const mid = data[b * MOMENT_STRIDE + 1]!;
    if (mid < fromX || mid > toX) continue;
    used[b] = 1; blocks++; nUsed += data[b * MOMENT_STRIDE]!;
    const v = blockStats(data, b * MOMENT_STRIDE, mom.nodes, F, b * NODES, x, y, b * size, Math.min(x.length, b * size + size));
    ssrB[b] = v.ssr; lagB[b] = v.lag; rFirst[b] = v.r0; rLast[b] = v.r1; beta[b] = v.beta; round[b] = v.round;
    ssrEst += v.ssr;
  }
  const n = x.length;
  const rmse = Math.sqrt(Math.max(0, ssrEst) / nUsed);
  const limit = relTol * rmse, roundLimit = relTol * Math.max(0, ssrEst) / blocks;
  let exactBlocks = 0, exactPoints = 0, err = 0;
  let scratch: Float64Array | null = null, lnScratch: Float64Array | null = null;
  for (let b = 0; b < count; b++) {
    if (!used[b]) continue;
    if (beta[b]! <= limit && round[b]! <= roundLimit) {
      const nb = data[b * MOMENT_STRIDE]!;
      err += 2 * beta[b]! * Math.sqrt(nb * Math.max(0, ssrB[b]!)) + nb * beta[b]! ** 2 + round[b]!;
      continue;
    }
    const a = b * size, z = Math.min(n, a + size);
    scratch ??= new Float64Array(size);
    lnScratch ??= new Float64Array(size);
    const out = scratch.subarray(0, z - a), lnx = lnScratch.subarray(0, z - a);
    // ln x of the block's points here, not d.lx: on a long flow curve (lawDataRanged) that column is made only when
    // read, and these few blocks need only their own (the same numbers: Math.log of the same x).
    for (let i = a; i < z; i++) lnx[i - a] = Math.log(x[i]!);
    lawValues(law, x.subarray(a, z), lnx, p, out);
    const e = exactBlock(out, y, a, z);
    ssrB[b] = e.ssr; lagB[b] = e.lag; rFirst[b] = e.r0; rLast[b] = e.r1;
    exactBlocks++; exactPoints += z - a;
  }
  let ssr = 0, lag1 = 0;
  for (let b = 0; b < count; b++) {
    if (!used[b]) continue;
    ssr += ssrB[b]!;
    lag1 += lagB[b]!;
    if (b > 0 && used[b - 1]) lag1 += rLast[b - 1]! * rFirst[b]!;
  }
  const ok = Number.isFinite(ssr) && Number.isFinite(lag1);
  return { ssr, lag1, ok, exactBlocks, exactPoints, points: nUsed, bound: ssr > 0 ? err / ssr : err === 0 ? 0 : Infinity };
}

const EPS = Number.EPSILON;

/** One block from its moments and the law's five values F[k…k+5) (see momentResidualStats). */
function blockStats(M: Float64Array, o: number, nodes: Float64Array, F: Float64Array, k: number, x: Float64Array, y: Float64Array, a: number, z: number) {
  const nb = M[o]!, m = M[o + 1]!, ym = M[o + 3]!;
  const s1 = M[o + 4]!, s2 = M[o + 5]!, s3 = M[o + 6]!, s4 = M[o + 7]!;
  const se = M[o + 8]!, see = M[o + 9]!, sde = M[o + 10]!, sqe = M[o + 11]!;
  const pdd = M[o + 12]!, pdq = M[o + 13]!, pqq = M[o + 14]!, pee = M[o + 15]!, pde = M[o + 16]!, pqe = M[o + 17]!;
  const f0 = F[k + 1]!;
  // Quadratic through (d_lo, F0), (0, f0), (d_hi, F2), d = x − m (the ends are the block's own extremes).
  const dl = nodes[k]! - m, dh = nodes[k + 2]! - m;
  let s = 0, q = 0, beta = 0;
  if (dh > dl) {
    const u0 = dl < 0 ? (F[k]! - f0) / dl : 0, u2 = dh > 0 ? (F[k + 2]! - f0) / dh : 0;
    q = dl < 0 && dh > 0 ? (u2 - u0) / (dh - dl) : 0;
    s = dl < 0 ? u0 - q * dl : u2 - q * dh;
    const c3 = nodes[k + 3]! - m, c4 = nodes[k + 4]! - m;
    beta = 2 * Math.max(Math.abs(F[k + 3]! - (f0 + s * c3 + q * c3 * c3)), Math.abs(F[k + 4]! - (f0 + s * c4 + q * c4 * c4)));
  } else if (!Number.isFinite(f0)) beta = NaN;
  const A = f0 - ym;
  const tA = nb * A * A, tS = s * s * s2, tQ = q * q * s4, tAS = 2 * A * s * s1, tAQ = 2 * A * q * s2, tSQ = 2 * s * q * s3;
  const tE = -2 * (A * se + s * sde + q * sqe);
  const ssr = tA + tS + tQ + tAS + tAQ + tSQ + tE + see;
  const d0 = x[a]! - m, e0 = y[a]! - ym, d1 = x[z - 1]! - m, e1 = y[z - 1]! - ym;
  const r0 = A + s * d0 + q * d0 * d0 - e0, r1 = A + s * d1 + q * d1 * d1 - e1;
  const dr2 = s * s * pdd + q * q * pqq + pee + 2 * s * q * pdq - 2 * s * pde - 2 * q * pqe;
  const lag = ssr - 0.5 * (r0 * r0 + r1 * r1) - 0.5 * dr2;
  // What rounding may cost: a few ulps of the largest terms summed (their sizes, not their sum).
  const round = 16 * EPS * (Math.abs(tA) + Math.abs(tS) + Math.abs(tQ) + Math.abs(tAS) + Math.abs(tAQ) + Math.abs(tSQ) + Math.abs(tE) + see +
    s * s * pdd + q * q * pqq + pee + Math.abs(2 * s * q * pdq) + Math.abs(2 * s * pde) + Math.abs(2 * q * pqe));
  return { ssr, lag, r0, r1, beta: Number.isFinite(ssr) ? beta : NaN, round };
}

/** SSR, in-block lag-1 sum and end residuals of one block from the law's values `f` at its points a…z−1. */
function exactBlock(f: Float64Array, y: Float64Array, a: number, z: number) {
  let ssr = 0, lag = 0, prev = 0;
  for (let i = a; i < z; i++) {
    const r = f[i - a]! - y[i]!;
    ssr += r * r;
    if (i > a) lag += r * prev;
    prev = r;
  }
  return { ssr, lag, r0: f[0]! - y[a]!, r1: prev };
}
