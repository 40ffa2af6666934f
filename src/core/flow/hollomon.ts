import { SLOPE_FLOOR, type FlowLaw, type HollomonParams } from './types.js';
import { validateParams } from './validate.js';

/**
 * Hollomon power law σ = K·εⁿ (true stress, true plastic strain).
 *
 * Source: J. H. Hollomon, "Tensile deformation", *Trans. AIME* 162 (1945) 268–290; n and K tables in
 * Callister, *Fundamentals of Materials Science and Engineering*, 2nd ed., p. 199.
 * Units: K in MPa, n dimensionless, ε ≥ 0. Valid range: K > 0, 0 < n ≤ 1. Closed forms: work
 * K·ε^(n+1)/(n+1), inverse (σ/K)^(1/n), Considère εu = n.
 * @throws InputError naming `path.K` or `path.n` when out of range.
 * @example hollomon({ K: 530, n: 0.44 }).stress(0.2) // 530·0.2^0.44 ≈ 262.1 MPa
 */
export function hollomon(params: HollomonParams, path = 'flowCurve'): FlowLaw {
  const { K, n } = validateParams('hollomon', params, path) as HollomonParams;
  const np1 = n + 1;
  return {
    law: 'hollomon',
    params: Object.freeze({ K, n }),
    stress: (e) => K * Math.pow(e, n),
    slope: (e) => n * K * Math.pow(Math.max(e, SLOPE_FLOOR), n - 1),
    work: (e) => (K * Math.pow(e, np1)) / np1,
    strainAt: (s) => (s <= 0 ? 0 : Math.pow(s / K, 1 / n)),
    uniformStrain: () => n,
  };
}
