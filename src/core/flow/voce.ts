import { InputError } from '../errors.js';
import type { FlowLaw, VoceParams } from './types.js';
import { validateParams } from './validate.js';

/**
 * Voce saturation law σ = σ0 + Q·(1 − exp(−b·ε)) (true stress, true plastic strain).
 *
 * Source: E. Voce, "The relationship between stress and strain for homogeneous deformation",
 * *J. Inst. Metals* 74 (1948) 537–562.
 * Units: σ0 and Q in MPa, b dimensionless. Valid range: σ0 ≥ 0, Q ≥ 0, b > 0. Closed forms:
 * work (σ0+Q)·ε − (Q/b)(1 − e^(−bε)); inverse −ln(1 − (σ−σ0)/Q)/b for σ0 ≤ σ < σ0+Q;
 * Considère εu = ln(Q(1+b)/(σ0+Q))/b when Q·b > σ0, else 0.
 * @throws InputError for parameters out of range, or `strainAt` at or above the saturation σ0+Q.
 * @example voce({ sigma0: 200, Q: 150, b: 10 }).uniformStrain() // ln(150·11/350)/10 ≈ 0.1551
 */
export function voce(params: VoceParams, path = 'flowCurve'): FlowLaw {
  const { sigma0, Q, b } = validateParams('voce', params, path) as VoceParams;
  const eu = Q * b > sigma0 ? Math.log((Q * (1 + b)) / (sigma0 + Q)) / b : 0;
  return {
    law: 'voce',
    params: Object.freeze({ sigma0, Q, b }),
    stress: (e) => sigma0 + Q * -Math.expm1(-b * e),
    slope: (e) => Q * b * Math.exp(-b * e),
    work: (e) => (sigma0 + Q) * e + (Q / b) * Math.expm1(-b * e),
    strainAt: (s) => {
      if (s <= sigma0) return 0;
      if (s >= sigma0 + Q) throw new InputError('stress', s, `below the Voce saturation stress ${sigma0 + Q} MPa`);
      return -Math.log1p(-(s - sigma0) / Q) / b;
    },
    uniformStrain: () => eu,
    saturationStress: sigma0 + Q,
  };
}
