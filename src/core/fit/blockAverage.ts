/** Defaults of the reduction of oversampled curves, stated once. */
export const REDUCTION_DEFAULTS = {
  /** Curves of at most this many points are fitted point by point (no reduction). */
  fitAllUpTo: 4000,
  /** Larger curves are fitted on about this many block averages. */
  blocks: 2000,
  /**
   * Curves of at least this many points (unweighted) take RMSE, R², AIC, BIC and the lag-1
   * autocorrelation from block moments (curveResidualStats) instead of one law value per point.
   */
  momentStatsFrom: 20_000,
  /** Points per block of those moments. */
  momentBlock: 128,
  /** Blocks whose local quadratic may be off by more than this fraction of the RMSE are summed point by point. */
  momentRelTol: 1e-8,
  /**
   * A fit on more than twice this many points (or block averages) is first solved on about this many weighted
   * averages of them, and that solution starts the fit proper (fitLaw's coarse stage).
   */
  coarseBlocks: 250,
} as const;

/** A curve reduced to averages of consecutive blocks of points. */
export interface BlockAverages {
  /** Mean strain of each block. */
  x: Float64Array;
  /** Mean stress of each block, MPa. */
  y: Float64Array;
  /** Number of original points in each block (the weight of the block in the fit). */
  w: Float64Array;
  /** Points per block (the last block may have fewer). */
  blockSize: number;
}

/**
 * Averages consecutive blocks of `blockSize` points: x̄_b = mean of x over the block, ȳ_b likewise,
 * weight w_b = the number of points. A weighted least-squares fit to (x̄_b, ȳ_b, w_b) minimises
 * Σ_b w_b(σ(x̄_b) − ȳ_b)², which differs from the full Σᵢ(σ(xᵢ) − yᵢ)² only by a constant (the
 * scatter within the blocks) and by terms of second order in the block's strain span (σ curved
 * within a block); this is what a slower data logger averaging over its interval would record.
 * Source: the decomposition of a sum of squares into within- and between-group parts (common
 * practice; e.g. any analysis-of-variance text). With weights `w` (points that are themselves averages)
 * the means are weighted, x̄_b = Σwᵢxᵢ/Σwᵢ, and w_b = Σwᵢ: the same decomposition with counts.
 * Units: those of x and y. Valid: blockSize ≥ 1, weights > 0.
 * @example blockAverage([1, 2, 3, 4], [10, 20, 30, 40], 2) // x [1.5, 3.5], y [15, 35], w [2, 2]
 * @example blockAverage([1, 3], [10, 30], 2, [3, 1]) // x [1.5], y [15], w [4]
 */
export function blockAverage(x: ArrayLike<number>, y: ArrayLike<number>, blockSize: number, w: ArrayLike<number> | null = null): BlockAverages {
  const n = x.length;
  const B = Math.max(1, Math.floor(blockSize));
  const k = Math.ceil(n / B);
  const bx = new Float64Array(k), by = new Float64Array(k), bw = new Float64Array(k);
  if (w) {
    for (let b = 0; b < k; b++) {
      const from = b * B, to = Math.min(n, from + B);
      let sw = 0, sx = 0, sy = 0;
      for (let i = from; i < to; i++) { const wi = w[i]!; sw += wi; sx += wi * x[i]!; sy += wi * y[i]!; }
      bx[b] = sx / sw; by[b] = sy / sw; bw[b] = sw;
    }
    return { x: bx, y: by, w: bw, blockSize: B };
  }
  for (let b = 0; b < k; b++) {
    const from = b * B, to = Math.min(n, from + B);
    let sx = 0, sy = 0;
    for (let i = from; i < to; i++) { sx += x[i]!; sy += y[i]!; }
    const c = to - from;
    bx[b] = sx / c; by[b] = sy / c; bw[b] = c;
  }
  return { x: bx, y: by, w: bw, blockSize: B };
}

/** Block size for a curve of n points under REDUCTION_DEFAULTS: 1 (no reduction) or ceil(n / blocks). */
export function reductionBlockSize(n: number): number {
  return n <= REDUCTION_DEFAULTS.fitAllUpTo ? 1 : Math.ceil(n / REDUCTION_DEFAULTS.blocks);
}
