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
 * Cost: one pass over 0…iMax, one log1p per envelope point and two logarithms per kept point.
 * @example flowColumns([0, 0.01, 0.02], [0, 300, 320], 0, 200000, 2, 0, 0.002).strain.length // 2
 */
export function flowColumns(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, E: number, iMax: number, fromIndex: number, fromTrue: number): FlowColumns {
  const m = iMax + 1;
  const xs = new Float64Array(m), ys = new Float64Array(m), lxs = new Float64Array(m), lys = new Float64Array(m);
  let nf = 0;
  // A flag, not runMax = −Infinity: that start made V8 box every new envelope value (one heap number a point).
  let runMax = 0, any = false;
  // lawDataLogged's range and first bad point, its comparisons on the kept values (flags, not ±Infinity starts).
  let lo = 0, hi = 0, seenLo = false, seenHi = false, bad = -1;
  for (let i = 0; i <= iMax; i++) {
    const e = strain[i]! - toe;
    if (any && e <= runMax) continue;
    any = true;
    runMax = e;
    if (e <= -1 || i < fromIndex) continue; // no true strain, or before the proof point: not on the flow curve
    const s = stress[i]! * (1 + e);
    const ep = Math.log1p(e) - s / E;
    if (ep >= fromTrue && ep > 0) {
      if (bad < 0 && (!(ep > 0) || !(ep < Infinity) || !(s > 0) || !(s < Infinity))) bad = nf;
      if (seenLo ? ep < lo : ep < Infinity) { lo = ep; seenLo = true; }
      if (seenHi ? ep > hi : ep > -Infinity) { hi = ep; seenHi = true; }
      xs[nf] = ep;
      ys[nf] = s;
      lxs[nf] = Math.log(ep);
      lys[nf++] = Math.log(s);
    }
  }
  return {
    strain: xs.subarray(0, nf), stress: ys.subarray(0, nf), logStrain: lxs.subarray(0, nf), logStress: lys.subarray(0, nf),
    lo: seenLo ? lo : Infinity, hi: seenHi ? hi : -Infinity, bad,
  };
}
