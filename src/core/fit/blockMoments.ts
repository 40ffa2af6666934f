/**
 * Law-independent moments of consecutive blocks of a curve, for {@link momentResidualStats}: with
 * them the SSR and the lag-1 residual sum of ANY law on the full curve follow from five values of the
 * law per block instead of one per point.
 *
 * Block b holds points a…z−1 (a = b·size). With its strain midpoint m = (min x + max x)/2, half-width
 * h = (max x − min x)/2, mean stress ȳ, and dᵢ = xᵢ − m, qᵢ = dᵢ², eᵢ = yᵢ − ȳ, it keeps
 * (stride MOMENT_STRIDE, in this order):
 *   n, m, h, ȳ, Σd, Σq, Σdq, Σq², Σe, Σe², Σde, Σqe,
 * and over the consecutive pairs (i, i−1) inside the block, with Δ the difference of the pair:
 *   ΣΔd², ΣΔdΔq, ΣΔq², ΣΔe², ΣΔdΔe, ΣΔqΔe.
 * Sums in index order; d and e are taken about the block's own centre so that no sum cancels
 * (the stresses of a block differ by far less than their size). Cost: one pass, no transcendental
 * function. Source: power sums about a local origin, the standard way to keep moments exact in
 * floating point (e.g. Chan, Golub & LeVeque, Am. Stat. 37 (1983) 242–247 — from memory).
 * Units: strain and stress as given (dimensionless, MPa). Valid: size ≥ 1; x, y finite.
 * @example blockMoments(Float64Array.of(1, 2, 3), Float64Array.of(10, 20, 30), 3).data[3] // 20 (ȳ of the block)
 */
export function blockMoments(x: Float64Array, y: Float64Array, size: number): BlockMoments {
  const n = x.length;
  const B = Math.max(1, Math.floor(size));
  const count = Math.ceil(n / B);
  const data = new Float64Array(count * MOMENT_STRIDE);
  // The five places each law is evaluated at per block (see momentResidualStats), and their logs.
  const nodes = new Float64Array(count * NODES), lnNodes = new Float64Array(count * NODES);
  // meanY: Σ yᵢ/n in index order, carried from block to block (the comparison of the laws needs the curve's mean
  // stress; taken here, in a pass that reads every y anyway, instead of in a pass of its own; speed follow-up K).
  let meanY = 0;
  for (let b = 0; b < count; b++) meanY = blockInto(x, y, b * B, Math.min(n, b * B + B), data, b * MOMENT_STRIDE, nodes, b * NODES, n, meanY);
  for (let i = 0; i < nodes.length; i++) lnNodes[i] = Math.log(nodes[i]!);
  return { size: B, count, points: n, data, nodes, lnNodes, sst: totalSquares(data, count, n), meanY };
}

/** Values kept per block by {@link blockMoments}. */
export const MOMENT_STRIDE = 18;
/** Law evaluations per block: m − h, m, m + h (the interpolation nodes), m − h/2, m + h/2 (the checks). */
export const NODES = 5;

/** The moments of {@link blockMoments}: `count` blocks of `size` consecutive points (the last may be shorter). */
export interface BlockMoments {
  size: number;
  count: number;
  /** Points of the curve. */
  points: number;
  /** MOMENT_STRIDE values per block, see blockMoments. */
  data: Float64Array;
  /** NODES strains per block where the laws are evaluated, and their natural logs. */
  nodes: Float64Array;
  lnNodes: Float64Array;
  /** Σ(yᵢ − ȳ)² of the whole curve from the blocks: Σ_b [Σe² + n_b(ȳ_b − ȳ)²] (the within/between split; exact algebra). */
  sst: number;
  /** Mean stress Σ yᵢ/n, each term divided by n and added in index order (the bits of that loop), MPa. */
  meanY: number;
}

/** SST from the blocks' counts, means and Σe² (saves a pass over the curve; equal to the direct sum up to rounding). */
function totalSquares(data: Float64Array, count: number, n: number): number {
  let sy = 0;
  for (let b = 0; b < count; b++) sy += data[b * MOMENT_STRIDE]! * data[b * MOMENT_STRIDE + 3]!;
  const ym = sy / n;
  let sst = 0;
  for (let b = 0; b < count; b++) {
    const o = b * MOMENT_STRIDE, d = data[o + 3]! - ym;
    sst += data[o + 9]! + data[o]! * d * d;
  }
  return sst;
}

/**
 * One block's moments into data[o…o + MOMENT_STRIDE); returns meanAcc + Σ y[i]/n over the block, added in index
 * order. In a function of its own so the engine optimises the loop at once.
 */
function blockInto(x: Float64Array, y: Float64Array, a: number, z: number, data: Float64Array, o: number, nodes: Float64Array, k: number, n: number, meanAcc: number): number {
  // lo, hi from the block's first strain (finite: fitLaw refuses other data), not from ±Infinity: such a start
  // made V8 box every new extreme.
  let lo = 0, hi = 0, sy = 0, acc = meanAcc;
  lo = hi = x[a]!;
  for (let i = a; i < z; i++) {
    const v = x[i]!, yi = y[i]!;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
    sy += yi;
    acc += yi / n;
  }
  const c = z - a, m = (lo + hi) / 2, h = (hi - lo) / 2, ym = sy / c;
  let s1 = 0, s2 = 0, s3 = 0, s4 = 0, se = 0, see = 0, sde = 0, sqe = 0;
  let pdd = 0, pdq = 0, pqq = 0, pee = 0, pde = 0, pqe = 0;
  let dp = x[a]! - m, qp = dp * dp, ep = y[a]! - ym;
  s1 = dp; s2 = qp; s3 = qp * dp; s4 = qp * qp; se = ep; see = ep * ep; sde = dp * ep; sqe = qp * ep;
  for (let i = a + 1; i < z; i++) {
    const d = x[i]! - m, q = d * d, e = y[i]! - ym;
    s1 += d; s2 += q; s3 += q * d; s4 += q * q; se += e; see += e * e; sde += d * e; sqe += q * e;
    const Dd = d - dp, Dq = q - qp, De = e - ep;
    pdd += Dd * Dd; pdq += Dd * Dq; pqq += Dq * Dq; pee += De * De; pde += Dd * De; pqe += Dq * De;
    dp = d; qp = q; ep = e;
  }
  // The ends are the block's own smallest and largest strain (inside the data, so inside every law's domain).
  nodes[k] = lo; nodes[k + 1] = m; nodes[k + 2] = hi; nodes[k + 3] = m - h / 2; nodes[k + 4] = m + h / 2;
  data[o] = c; data[o + 1] = m; data[o + 2] = h; data[o + 3] = ym;
  data[o + 4] = s1; data[o + 5] = s2; data[o + 6] = s3; data[o + 7] = s4;
  data[o + 8] = se; data[o + 9] = see; data[o + 10] = sde; data[o + 11] = sqe;
  data[o + 12] = pdd; data[o + 13] = pdq; data[o + 14] = pqq; data[o + 15] = pee; data[o + 16] = pde; data[o + 17] = pqe;
  return acc;
}
