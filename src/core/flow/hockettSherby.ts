import { InputError } from '../errors.js';
import { integrate } from '../numeric/quadrature.js';
import { considereNumeric, maximumForceStrain } from './considere.js';
import { SLOPE_FLOOR, type FlowLaw, type HockettSherbyParams } from './types.js';
import { requireBelow, validateParams } from './validate.js';

/**
 * Hockett–Sherby law σ = σsat − (σsat − σ0)·exp(−a·εᵖ) (true stress, true plastic strain).
 *
 * Source: J. E. Hockett and O. D. Sherby, "Large strain deformation of polycrystalline metals at low
 * homologous temperatures", *J. Mech. Phys. Solids* 23 (1975) 87–98.
 * Units: σsat and σ0 in MPa, a and p dimensionless. Valid range: 0 ≤ σ0 < σsat, a > 0, 0 < p ≤ 2.
 * Work: σsat·ε − (σsat−σ0)·∫₀^ε exp(−a·xᵖ) dx, the integral by adaptive Gauss–Kronrod quadrature
 * (relative error below 1e-12). Inverse closed form (−ln((σsat−σ)/(σsat−σ0))/a)^(1/p).
 * @throws InputError for parameters out of range, or `strainAt` at or above σsat.
 * @example hockettSherby({ sigmaSat: 400, sigma0: 200, a: 5, p: 0.7 }).stress(0) // 200
 */
export function hockettSherby(params: HockettSherbyParams, path = 'flowCurve'): FlowLaw {
  const { sigmaSat, sigma0, a, p } = validateParams('hockettSherby', params, path) as HockettSherbyParams;
  requireBelow(`${path}.sigma0`, sigma0, sigmaSat, 'sigmaSat');
  const d = sigmaSat - sigma0;
  let eu: number | undefined;
  const stress = (e: number) => sigmaSat - d * Math.exp(-a * Math.pow(e, p));
  const slope = (e: number) => {
    const x = Math.max(e, SLOPE_FLOOR);
    return d * a * p * Math.pow(x, p - 1) * Math.exp(-a * Math.pow(x, p));
  };
  return {
    law: 'hockettSherby',
    params: Object.freeze({ sigmaSat, sigma0, a, p }),
    stress,
    slope,
    work: (e) => (e <= 0 ? 0 : sigmaSat * e - d * integrate((x) => Math.exp(-a * Math.pow(x, p)), 0, e).value),
    strainAt: (s) => {
      if (s <= sigma0) return 0;
      if (s >= sigmaSat) throw new InputError('stress', s, `below the saturation stress sigmaSat = ${sigmaSat} MPa`);
      return Math.pow(-Math.log((sigmaSat - s) / d) / a, 1 / p);
    },
    // p ≤ 1: concave, one Considère point. p > 1: S-shaped (slope 0 at yield), the force may fall at
    // yield and rise again, so the uniform strain is that of the maximum force (considere.ts).
    uniformStrain: () => (eu ??= p > 1 ? maximumForceStrain(stress, slope) : considereNumeric(stress, slope)),
    saturationStress: sigmaSat,
  };
}
