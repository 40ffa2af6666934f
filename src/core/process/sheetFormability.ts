import { checkRange, ComputationError } from '../errors.js';
import type { FlowLaw } from '../flow/types.js';
import { brent } from '../numeric/brent.js';
import { equivalentPerMajor, hillInstabilityRate } from './hillLocalizedLimit.js';
import { swiftInstabilityRate } from './swiftDiffuseLimit.js';

/** Largest equivalent strain searched for an instability, true strain. */
const SEARCH_LIMIT = 10;

/** Remaining sheet formability at one strain ratio. */
export interface SheetFormability {
  strainRatio: number;
  /** Which criterion sets the limit: Hill localized (β ≤ 0) or Swift diffuse (β > 0). */
  criterion: 'hillLocalized' | 'swiftDiffuse';
  /** Equivalent strain at the limit (total, from the annealed state). */
  limitEquivalentStrain: number;
  /** Major true strain still available from the current state in this mode (≥ 0). */
  remainingMajorStrain: number;
  converged: boolean;
  iterations: number;
  residual: number;
}

/**
 * Remaining formability of a sheet in the current state for proportional straining at β = ε2/ε1:
 * the instability point ε̄* ≥ ε̄0 where (1/σ̄)·dσ̄/dε̄ = z(β), with z from Hill's localized neck for
 * β ≤ 0 ({@link hillInstabilityRate}) and Swift's diffuse neck for β > 0
 * ({@link swiftInstabilityRate}), then remaining major strain (ε̄* − ε̄0)/φ(β). For Hollomon from the
 * annealed state this is n/(1 + β) for β ≤ 0 and Swift's ε1* for β > 0; uniaxial tension in
 * Swift's sense reduces to Considère's ε = n.
 *
 * Assumptions: von Mises, isotropic hardening, the earlier strain counted through the equivalent
 * strain (path-change effects ignored); Swift's diffuse neck on the β > 0 side is a lower bound of
 * the practical forming limit (Hill's analysis gives no local neck there). Source: Marciniak, Duncan
 * & Hu, *Mechanics of Sheet Metal Forming*, 2nd ed., §5.3–5.4.
 * Hollomon (ε̄* = n/z) and Voce (ε̄* = −ln(z(σ0 + Q)/(Q(b + z)))/b) are solved in closed form, other
 * laws with Brent's method on σ'(ε̄) − z·σ(ε̄).
 * Units: true strains. Valid range: −1 < β ≤ 1, ε̄0 ≥ 0.
 * @throws ComputationError when no instability lies below ε̄ = 10.
 * @example sheetFormability(hollomon({ K: 600, n: 0.2 }), 0, 0).remainingMajorStrain // 0.2
 */
export function sheetFormability(law: FlowLaw, accumulatedStrain: number, strainRatio: number, path = 'step'): SheetFormability {
  // Plain comparisons first: field names are built only for a value that fails (ledger hot path).
  const beta = strainRatio > -1 && strainRatio <= 1 ? strainRatio : checkRange(`${path}.strainRatio`, strainRatio, -1, 1, { loOpen: true });
  const e0 = accumulatedStrain >= 0 && accumulatedStrain <= SEARCH_LIMIT ? accumulatedStrain : checkRange(`${path}.accumulatedStrain`, accumulatedStrain, 0, SEARCH_LIMIT);
  const criterion: SheetFormability['criterion'] = beta <= 0 ? 'hillLocalized' : 'swiftDiffuse';
  const z = beta <= 0 ? hillInstabilityRate(beta) : swiftInstabilityRate(beta);
  const phi = equivalentPerMajor(beta);
  const g = (e: number) => law.slope(e) - z * law.stress(e);
  // Results are built field by field (no object spread: it is slow on the ledger's hot path).
  const result = (limitEquivalentStrain: number, remainingMajorStrain: number, iterations: number, residual: number): SheetFormability =>
    ({ strainRatio: beta, criterion, limitEquivalentStrain, remainingMajorStrain, converged: true, iterations, residual });
  if (law.law === 'hollomon') {
    // Closed form: (1/σ)·dσ/dε = n/ε, so the limit is ε̄* = n/z exactly (no search needed).
    const limit = law.params.n! / z;
    return result(Math.max(limit, e0), Math.max(0, limit - e0) / phi, 0, 0);
  }
  if (law.law === 'voce') {
    // Closed form: σ = σ0 + Q(1 − e^(−bε)), σ' = Qb·e^(−bε); σ' = z·σ gives e^(−bε) = z(σ0 + Q)/(Q(b + z)).
    const { sigma0, Q, b } = law.params as { sigma0: number; Q: number; b: number };
    const x = Q > 0 ? (z * (sigma0 + Q)) / (Q * (b + z)) : 1;
    const limit = x >= 1 ? 0 : -Math.log(x) / b;
    return result(Math.max(limit, e0), Math.max(0, limit - e0) / phi, 0, 0);
  }
  let lo = Math.max(e0, 1e-12);
  if (g(lo) <= 0) return result(e0, 0, 0, 0);
  let hi = Math.max(2 * lo, 0.05);
  while (g(hi) > 0) {
    lo = hi;
    if (hi >= SEARCH_LIMIT) throw new ComputationError(`${path}.formingLimitMajorStrain`, `no necking point below equivalent strain ${SEARCH_LIMIT}`);
    hi = Math.min(hi * 2, SEARCH_LIMIT);
  }
  const r = brent(g, lo, hi, 1e-14);
  if (!r.converged) throw new ComputationError(`${path}.formingLimitMajorStrain`, 'necking-limit search did not converge');
  return result(r.root, Math.max(0, r.root - e0) / phi, r.iterations, r.residual);
}
