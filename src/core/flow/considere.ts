import { ComputationError } from '../errors.js';
import { brent } from '../numeric/brent.js';

/** Largest true plastic strain searched for the Considère condition. */
export const CONSIDERE_SEARCH_LIMIT = 10;

/**
 * Considère uniform strain of any law, found numerically: the smallest ε ≥ 0 where
 * dσ/dε = σ (A. Considère, *Annales des Ponts et Chaussées* 9, 1885; Dieter, *Mechanical
 * Metallurgy*, 3rd ed., §8-3). Returns 0 when the law already has dσ/dε ≤ σ at yield.
 * Units: true plastic strain. Valid range: laws whose slope falls below σ before ε = 10.
 * @throws ComputationError when no necking point lies below ε = 10.
 * @example considereNumeric((e) => 530 * e ** 0.44, (e) => 0.44 * 530 * e ** -0.56) // ≈ 0.44
 */
export function considereNumeric(stress: (e: number) => number, slope: (e: number) => number): number {
  const h = (e: number) => slope(e) - stress(e);
  let lo = 1e-12;
  if (h(lo) <= 0) return 0;
  // Geometric scan for the first sign change, then Brent on the bracket.
  let hi = lo;
  for (;;) {
    hi = Math.min(hi * 2, CONSIDERE_SEARCH_LIMIT);
    if (h(hi) <= 0) break;
    if (hi >= CONSIDERE_SEARCH_LIMIT) throw new ComputationError('material.flowCurve', `no Considère necking point below true strain ${CONSIDERE_SEARCH_LIMIT}`);
    lo = hi;
  }
  const r = brent(h, lo, hi, 1e-14);
  if (!r.converged) throw new ComputationError('material.flowCurve', 'Considère search did not converge');
  return r.root;
}

/**
 * Engineering tensile strength of the unstrained material from its law: Rm = σ(εu)·exp(−εu)
 * (force at the Considère point over the original area, constant volume). For Hollomon this is
 * K·(n/e)ⁿ (Dieter, *Mechanical Metallurgy*, §8-3; CHECKS.md). Units: MPa.
 * @example tensileStrengthOf(hollomon({K: 530, n: 0.44})) // 530·(0.44/e)^0.44 ≈ 237.6
 */
export function tensileStrengthOf(law: { stress(e: number): number; uniformStrain(): number }): number {
  const eu = law.uniformStrain();
  return law.stress(eu) * Math.exp(-eu);
}

/**
 * Uniform engineering (plastic) elongation at maximum force from the law: e_u = exp(εu) − 1; for
 * Hollomon exp(n) − 1 (CHECKS.md, derived from Considère). Dimensionless (multiply by 100 for %).
 * @example uniformElongationOf(hollomon({K: 530, n: 0.44})) // e^0.44 − 1 ≈ 0.5527
 */
export function uniformElongationOf(law: { uniformStrain(): number }): number {
  return Math.expm1(law.uniformStrain());
}
