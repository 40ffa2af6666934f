import { InputError } from '../errors.js';
import { linearFit } from '../fit/linearFit.js';
import type { NValueResult } from './types.js';
import type { LogSums } from './flowColumns.js';

const METHOD = 'ISO 10275: regression of ln(true stress) on ln(true plastic strain)';

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
 * {@link nValueFit} from the sums of ln εp and ln σ that analyzeRecord's flow-curve pass takes about the middle
 * point (`LogSums`: k points, every one usable), with the range [lo, hi] of εp: the same regression
 * ln σ = ln K + n·ln εp (ISO 10275), from one-pass sums about a centre instead of two passes about the means —
 * Sxx = Σdx² − (Σdx)²/k, Sxy = Σdx·dy − Σdx·Σdy/k, Syy = Σdy² − (Σdy)²/k, n = Sxy/Sxx,
 * ln K = ȳ − n·x̄, R² = 1 − (Syy − n·Sxy)/Syy (Draper & Smith, *Applied Regression Analysis*, ch. 1). The centre
 * near the mean keeps the subtraction from losing digits: it agrees with nValueFit to about 1e-13 relative
 * (test/core/tensile/flowLogs.test.ts). Units: K in MPa. Valid: k ≥ 3 with distinct εp.
 * @throws InputError when fewer than 3 points or all εp equal.
 * @example nValueFromSums({ k: 2, cx: 0, cy: 0, sx: 0, sy: 0, sxx: 0, sxy: 0, syy: 0 }, 0.01, 0.2) // throws: 3 points needed
 */
export function nValueFromSums(s: LogSums, lo: number, hi: number): NValueResult {
  const k = s.k;
  if (k < 3) throw new InputError('nRange', k, 'at least 3 points with true plastic strain > 0 in the n-value range');
  const sxx = s.sxx - (s.sx * s.sx) / k, sxy = s.sxy - (s.sx * s.sy) / k, syy = s.syy - (s.sy * s.sy) / k;
  const mx = s.cx + s.sx / k, my = s.cy + s.sy / k;
  if (!(sxx > 0)) throw new InputError('x', mx, 'at least two distinct x values');
  const n = sxy / sxx;
  const ssr = Math.max(0, syy - n * sxy);
  return { n, K: Math.exp(my - n * mx), r2: syy > 0 ? 1 - ssr / syy : 1, range: [lo, hi], points: k, method: METHOD };
}

function nResult(lx: Float64Array, ly: Float64Array, k: number, lo: number, hi: number): NValueResult {
  if (k < 3) throw new InputError('nRange', k, 'at least 3 points with true plastic strain > 0 in the n-value range');
  const f = linearFit(lx, ly, 0, k);
  return { n: f.slope, K: Math.exp(f.intercept), r2: f.r2, range: [lo, hi], points: k, method: METHOD };
}
