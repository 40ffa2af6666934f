/** The plastic flow curve of a record as typed columns, with what the law fits and the n-value need of it. */
export interface FlowColumns {
  /** True plastic strain εp of each kept sample (dimensionless). */
  strain: Float64Array;
  /** True stress σ, MPa. */
  stress: Float64Array;
  /** Math.log(εp) and Math.log(σ) of the same points. */
  logStrain: Float64Array;
  logStress: Float64Array;
  /**
   * Smallest and largest εp and the first point whose εp or σ is not finite and > 0 (−1 if none): what
   * `lawDataLogged` finds in a pass of its own, taken here in the same comparisons on the same values.
   */
  lo: number;
  hi: number;
  bad: number;
}

/**
 * The flow curve in one pass: the monotone envelope of samples 0…iMax (cycles left out; a sample counts
 * only when its toe-compensated strain passes every earlier one), from `fromIndex` on, as true plastic
 * strain εp = ln(1 + e) − σ/E and true stress σ = s(1 + e) (Dowling, *Mechanical Behavior of Materials*,
 * §4.5, valid to maximum force), keeping εp ≥ fromTrue and εp > 0; ln(1 + e) only for envelope points.
 * Also ln εp and ln σ of each kept point (for the law fits and the n-value) and the range and first bad
 * point of the kept εp and σ that `lawDataLogged` would find (so the fits' packing needs no pass of its own).
 * Every value is computed by the operations of the former separate passes in the same order: the same bits
 * (test/core/tensile/flowColumns.test.ts). Units: engineering strain (fraction) and stress (MPa) in, toe
 * strain (fraction), E MPa; true values out. Valid: iMax < strain.length, E > 0.
 * Cost: a pass over 0…iMax (one log1p per envelope point) and one over the kept points (two logarithms each).
 * @example flowColumns([0, 0.01, 0.02], [0, 300, 320], 0, 200000, 2, 0, 0.002).strain.length // 2
 */
export function flowColumns(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, E: number, iMax: number, fromIndex: number, fromTrue: number): FlowColumns {
  const m = iMax + 1;
  const xs = new Float64Array(m), ys = new Float64Array(m), lxs = new Float64Array(m), lys = new Float64Array(m);
  // Two loops in functions of their own (the envelope, then the logarithms with the range), each with nothing after
  // it but a few stores: as one loop with the range tests in it the pass ran about 5 ms longer on a 1,000,000-row
  // record in a fresh process (speed follow-up K).
  const st = new Float64Array(4);
  envelopePass(strain, stress, toe, E, iMax, fromIndex, fromTrue, xs, ys, st);
  const nf = st[0]!, bad = st[1]!;
  logPass(xs, ys, lxs, lys, nf, st);
  // The plain min and max are lawDataLogged's range: a kept εp is > 0 and not NaN, so the only value its flags pass
  // over is +∞ for the smallest, which a plain minimum passes over too unless every εp is +∞ (then both give +∞).
  const lo = nf > 0 ? st[2]! : Infinity, hi = nf > 0 ? st[3]! : -Infinity;
  return { strain: xs.subarray(0, nf), stress: ys.subarray(0, nf), logStrain: lxs.subarray(0, nf), logStress: lys.subarray(0, nf), lo, hi, bad };
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

/** ln εp and ln σ of the nf kept points, and st[2], st[3] = the smallest and largest εp (plain comparisons from the first). */
function logPass(xs: Float64Array, ys: Float64Array, lxs: Float64Array, lys: Float64Array, nf: number, st: Float64Array): void {
  let lo = xs[0]!, hi = lo;
  for (let i = 0; i < nf; i++) {
    const ep = xs[i]!;
    if (ep < lo) lo = ep; else if (ep > hi) hi = ep;
    lxs[i] = Math.log(ep);
    lys[i] = Math.log(ys[i]!);
  }
  st[2] = lo;
  st[3] = hi;
}
