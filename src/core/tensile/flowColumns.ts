/** The plastic flow curve of a record as typed columns, with what the law fits and the n-value need of it. */
export interface FlowColumns {
  /** True plastic strain εp of each kept sample (dimensionless). */
  strain: Float64Array;
  /** True stress σ, MPa. */
  stress: Float64Array;
  /**
   * Smallest and largest εp and the first point whose εp or σ is not finite and > 0 (−1 if none): what
   * `lawDataLogged` finds in a pass of its own, taken here in the same comparisons on the same values.
   */
  lo: number;
  hi: number;
  bad: number;
  /** The n-value's sums of ln εp and ln σ over every kept point (meaningful when bad < 0): see {@link LogSums}. */
  logSums: LogSums;
}

/**
 * Sums for the regression of ln σ on ln εp, about a centre (cx, cy) = (ln εp, ln σ) of the middle kept point:
 * with dx = ln εp − cx and dy = ln σ − cy, sx = Σdx, sy = Σdy, sxx = Σdx², sxy = Σdx·dy, syy = Σdy² over k points.
 * About a point near the data's mean the one-pass sums lose no more than the two-pass form's rounding (the
 * centring of Chan, Golub & LeVeque, Am. Stat. 37 (1983) 242–247 — from memory). Read by `nValueFromSums`.
 */
export interface LogSums { k: number; cx: number; cy: number; sx: number; sy: number; sxx: number; sxy: number; syy: number }

/**
 * The flow curve in one pass: the monotone envelope of samples 0…iMax (cycles left out; a sample counts
 * only when its toe-compensated strain passes every earlier one), from `fromIndex` on, as true plastic
 * strain εp = ln(1 + e) − σ/E and true stress σ = s(1 + e) (Dowling, *Mechanical Behavior of Materials*,
 * §4.5, valid to maximum force), keeping εp ≥ fromTrue and εp > 0; ln(1 + e) only for envelope points.
 * Also the n-value's sums of ln εp and ln σ over the kept points ({@link LogSums}; the logarithms are not kept: two
 * columns of them were 12 MB on a 1,000,000-row record, and fresh memory costs a page fault per 4 KiB — 11 µs each on
 * the machines this project is measured on; the law fits take ln εp where they need it) and the range and first bad
 * point of the kept εp and σ that `lawDataLogged` would find (so the fits' packing needs no pass of its own).
 * εp and σ are computed by the operations of the former separate passes in the same order: the same bits
 * (test/core/tensile/flowColumns.test.ts). Units: engineering strain (fraction) and stress (MPa) in, toe
 * strain (fraction), E MPa; true values out. Valid: iMax < strain.length, E > 0.
 * Cost: a pass over 0…iMax (one log1p per envelope point) and one over the kept points (two logarithms each, nothing stored).
 * @example flowColumns([0, 0.01, 0.02], [0, 300, 320], 0, 200000, 2, 0, 0.002).strain.length // 2
 */
export function flowColumns(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, E: number, iMax: number, fromIndex: number, fromTrue: number): FlowColumns {
  const m = iMax + 1;
  const xs = new Float64Array(m), ys = new Float64Array(m);
  // Two loops in functions of their own (the envelope, then the logarithms with the range), each with nothing after
  // it but a few stores: as one loop with the range tests in it the pass ran about 5 ms longer on a 1,000,000-row
  // record in a fresh process (speed follow-up K).
  const st = new Float64Array(4);
  envelopePass(strain, stress, toe, E, iMax, fromIndex, fromTrue, xs, ys, st);
  const nf = st[0]!, bad = st[1]!;
  const sums = new Float64Array(7);
  logPass(xs, ys, nf, st, sums);
  // The plain min and max are lawDataLogged's range: a kept εp is > 0 and not NaN, so the only value its flags pass
  // over is +∞ for the smallest, which a plain minimum passes over too unless every εp is +∞ (then both give +∞).
  const lo = nf > 0 ? st[2]! : Infinity, hi = nf > 0 ? st[3]! : -Infinity;
  const logSums: LogSums = { k: nf, cx: sums[0]!, cy: sums[1]!, sx: sums[2]!, sy: sums[3]!, sxx: sums[4]!, sxy: sums[5]!, syy: sums[6]! };
  return { strain: xs.subarray(0, nf), stress: ys.subarray(0, nf), lo, hi, bad, logSums };
}

/**
 * The envelope: kept points' εp and σ into xs, ys; st[0] = their count, st[1] = the first kept point whose εp or σ is
 * not finite or whose σ is ≤ 0 (lawDataLogged's test; a kept εp is > 0), or −1.
 */
function envelopePass(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, E: number, iMax: number, fromIndex: number, fromTrue: number, xs: Float64Array, ys: Float64Array, st: Float64Array): void {
  let nf = 0, bad = -1;
  // Samples before fromIndex only raise the envelope (none is kept): their running maximum comes from a loop of its
  // own. In one loop, the engine compiled it while every sample was still before fromIndex, without the stress
  // reads, and dropped that code when the first one came (measured: a deoptimisation and a second compilation on
  // every 1,000,000-row record).
  const start = Math.max(0, Math.min(Math.ceil(fromIndex), iMax + 1)); // the first i ≥ fromIndex (an index may be fractional)
  // A flag, not runMax = −Infinity: that start made V8 box every new envelope value (one heap number a point).
  let runMax = start > 0 ? prefixTop(strain, toe, start) : 0, any = start > 0;
  for (let i = start; i <= iMax; i++) {
    const e = strain[i]! - toe;
    if (any && e <= runMax) continue;
    any = true;
    runMax = e;
    if (e <= -1) continue; // no true strain: not on the flow curve
    const s = stress[i]! * (1 + e);
    const ep = Math.log1p(e) - s / E;
    if (ep >= fromTrue && ep > 0) {
      if (!(ep < Infinity && s > 0 && s < Infinity) && bad < 0) bad = nf;
      xs[nf] = ep;
      ys[nf++] = s;
    }
  }
  st[0] = nf;
  st[1] = bad;
}

/** The largest strain[i] − toe over i < to (to ≥ 1): the envelope's height where envelopePass starts keeping points. */
function prefixTop(strain: ArrayLike<number>, toe: number, to: number): number {
  let top = strain[0]! - toe;
  for (let i = 1; i < to; i++) { const e = strain[i]! - toe; if (e > top) top = e; }
  return top;
}

/**
 * The smallest and largest εp of the nf kept points into st[2], st[3] (plain comparisons from the first), and the
 * n-value's sums about the middle point's logarithms into sums (cx, cy, Σdx, Σdy, Σdx², Σdx·dy, Σdy²; LogSums).
 */
function logPass(xs: Float64Array, ys: Float64Array, nf: number, st: Float64Array, sums: Float64Array): void {
  let lo = xs[0]!, hi = lo;
  const c = nf >> 1, cx = nf > 0 ? Math.log(xs[c]!) : 0, cy = nf > 0 ? Math.log(ys[c]!) : 0;
  let sx = 0, sy = 0, sxx = 0, sxy = 0, syy = 0;
  for (let i = 0; i < nf; i++) {
    const ep = xs[i]!;
    if (ep < lo) lo = ep; else if (ep > hi) hi = ep;
    const dx = Math.log(ep) - cx, dy = Math.log(ys[i]!) - cy;
    sx += dx; sy += dy; sxx += dx * dx; sxy += dx * dy; syy += dy * dy;
  }
  st[2] = lo;
  st[3] = hi;
  sums[0] = cx; sums[1] = cy; sums[2] = sx; sums[3] = sy; sums[4] = sxx; sums[5] = sxy; sums[6] = syy;
}
