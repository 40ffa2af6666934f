import { SLOPE_FLOOR, type FlowLaw, type SwiftParams } from './types.js';
import { validateParams } from './validate.js';

/**
 * Swift law σ = K·(ε0 + ε)ⁿ (true stress, true plastic strain).
 *
 * Source: H. W. Swift, "Plastic instability under plane stress", *J. Mech. Phys. Solids* 1 (1952) 1–18.
 * Units: K in MPa, ε0 and n dimensionless. Valid range: K > 0, 0 ≤ ε0 ≤ 1, 0 < n ≤ 1. Closed forms:
 * work K·[(ε0+ε)^(n+1) − ε0^(n+1)]/(n+1); inverse (σ/K)^(1/n) − ε0; Considère εu = max(0, n − ε0).
 * @throws InputError naming the parameter when out of range.
 * @example swift({ K: 600, eps0: 0.01, n: 0.2 }).uniformStrain() // 0.19
 */
export function swift(params: SwiftParams, path = 'flowCurve'): FlowLaw {
  const { K, eps0, n } = validateParams('swift', params, path) as SwiftParams;
  const np1 = n + 1;
  const w0 = Math.pow(eps0, np1);
  const s0 = K * Math.pow(eps0, n);
  return {
    law: 'swift',
    params: Object.freeze({ K, eps0, n }),
    stress: (e) => K * Math.pow(eps0 + e, n),
    slope: (e) => n * K * Math.pow(Math.max(eps0 + e, SLOPE_FLOOR), n - 1),
    work: (e) => (K * (Math.pow(eps0 + e, np1) - w0)) / np1,
    strainAt: (s) => (s <= s0 ? 0 : Math.max(0, Math.pow(s / K, 1 / n) - eps0)),
    uniformStrain: () => Math.max(0, n - eps0),
  };
}
