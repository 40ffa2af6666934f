import { InputError } from '../errors.js';
import { linearFit } from '../fit/linearFit.js';
import type { NValueResult } from './types.js';

/**
 * Strain-hardening exponent n and strength coefficient K by ISO 10275 (and ASTM E646): linear
 * regression of ln(true stress) on ln(true plastic strain) over the given points,
 * ln σ = ln K + n·ln εp, so σ = K·εpⁿ. ISO 10275 takes the whole uniform plastic range (from the end of
 * yield-point effects to maximum force) or a stated range (e.g. 10–20 % engineering strain).
 * Units: σ in MPa, εp dimensionless; K in MPa. Valid: at least 3 points with εp > 0.
 * @throws InputError when fewer than 3 usable points.
 * @example nValueFit([0.01, 0.1], [530 * 0.01 ** 0.44, 530 * 0.1 ** 0.44]) // throws: 3 points needed
 */
export function nValueFit(plasticStrain: ArrayLike<number>, trueStress: ArrayLike<number>): NValueResult {
  // Typed scratch columns, not array pushes: this runs over the whole flow curve (766,736 points of a
  // 1,000,000-row record; bench/RESULTS.md, issue 12 D).
  const n = plasticStrain.length;
  const lx = new Float64Array(n), ly = new Float64Array(n);
  let k = 0;
  // lo, hi start as 0 with a flag: an ±Infinity start made V8 box every new extreme (one heap number a point).
  let lo = 0, hi = 0, seen = false;
  for (let i = 0; i < n; i++) {
    const e = plasticStrain[i]!, s = trueStress[i]!;
    if (e > 0 && s > 0) {
      lx[k] = Math.log(e);
      ly[k] = Math.log(s);
      k++;
      if (!seen) { lo = e; hi = e; seen = true; } else {
        if (e < lo) lo = e;
        if (e > hi) hi = e;
      }
    }
  }
  return nResult(lx, ly, k, lo, hi);
}

/**
 * {@link nValueFit} when ln εp of every point is already known (`logStrain[i]` = Math.log(plasticStrain[i]),
 * as `lawData` packs it for the law fits): the same regression and the same numbers, one logarithm
 * pass fewer on a long flow curve. Units and range as nValueFit.
 * @throws InputError when fewer than 3 usable points.
 * @example nValueFitLogs([0.01, 0.1, 0.2], [530 * 0.01 ** 0.44, 530 * 0.1 ** 0.44, 530 * 0.2 ** 0.44], [Math.log(0.01), Math.log(0.1), Math.log(0.2)]).n // 0.44
 */
export function nValueFitLogs(plasticStrain: ArrayLike<number>, trueStress: ArrayLike<number>, logStrain: ArrayLike<number>): NValueResult {
  const n = plasticStrain.length;
  const lx = new Float64Array(n), ly = new Float64Array(n);
  let k = 0;
  // lo, hi start as 0 with a flag: an ±Infinity start made V8 box every new extreme (one heap number a point).
  let lo = 0, hi = 0, seen = false;
  for (let i = 0; i < n; i++) {
    const e = plasticStrain[i]!, s = trueStress[i]!;
    if (e > 0 && s > 0) {
      lx[k] = logStrain[i]!;
      ly[k] = Math.log(s);
      k++;
      if (!seen) { lo = e; hi = e; seen = true; } else {
        if (e < lo) lo = e;
        if (e > hi) hi = e;
      }
    }
  }
  return nResult(lx, ly, k, lo, hi);
}

/**
 * {@link nValueFit} from ln εp and ln σ already taken for every point, all of them usable (εp and σ finite and
 * > 0), with the range [lo, hi] of εp: the same regression on the same numbers (analyzeRecord takes the logs in
 * its flow-curve pass). Units and range as nValueFit.
 * @throws InputError when fewer than 3 points.
 * @example nValueFromLogs(Float64Array.from([0.01, 0.1, 0.2], Math.log), Float64Array.from([530 * 0.01 ** 0.44, 530 * 0.1 ** 0.44, 530 * 0.2 ** 0.44], Math.log), 0.01, 0.2).n // 0.44
 */
export function nValueFromLogs(logStrain: Float64Array, logStress: Float64Array, lo: number, hi: number): NValueResult {
  return nResult(logStrain, logStress, logStrain.length, lo, hi);
}

function nResult(lx: Float64Array, ly: Float64Array, k: number, lo: number, hi: number): NValueResult {
  if (k < 3) throw new InputError('nRange', k, 'at least 3 points with true plastic strain > 0 in the n-value range');
  const f = linearFit(lx, ly, 0, k);
  return { n: f.slope, K: Math.exp(f.intercept), r2: f.r2, range: [lo, hi], points: k, method: 'ISO 10275: regression of ln(true stress) on ln(true plastic strain)' };
}
