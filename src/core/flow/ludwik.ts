import { considereNumeric } from './considere.js';
import { SLOPE_FLOOR, type FlowLaw, type LudwikParams } from './types.js';
import { validateParams } from './validate.js';

/**
 * Ludwik law σ = σ0 + K·εⁿ (true stress, true plastic strain).
 *
 * Source: P. Ludwik, *Elemente der technologischen Mechanik*, Springer, Berlin 1909, p. 32.
 * Units: σ0 and K in MPa, n dimensionless. Valid range: σ0 ≥ 0, K > 0, 0 < n ≤ 1. Closed forms:
 * work σ0·ε + K·ε^(n+1)/(n+1); inverse ((σ−σ0)/K)^(1/n). Considère point found numerically.
 * @throws InputError naming the parameter when out of range.
 * @example ludwik({ sigma0: 200, K: 400, n: 0.5 }).stress(0.04) // 200 + 400·0.2 = 280 MPa
 */
export function ludwik(params: LudwikParams, path = 'flowCurve'): FlowLaw {
  const { sigma0, K, n } = validateParams('ludwik', params, path) as LudwikParams;
  const np1 = n + 1;
  let eu: number | undefined;
  const stress = (e: number) => sigma0 + K * Math.pow(e, n);
  const slope = (e: number) => n * K * Math.pow(Math.max(e, SLOPE_FLOOR), n - 1);
  return {
    law: 'ludwik',
    params: Object.freeze({ sigma0, K, n }),
    stress,
    slope,
    work: (e) => sigma0 * e + (K * Math.pow(e, np1)) / np1,
    strainAt: (s) => (s <= sigma0 ? 0 : Math.pow((s - sigma0) / K, 1 / n)),
    uniformStrain: () => (eu ??= considereNumeric(stress, slope)),
  };
}
