import type { FlowLaw } from '../flow/types.js';

/** Plastic offset of the proof strength (Rp0.2): 0.002, ISO 6892-1 §3.10.3 / ASTM E8 offset method. */
export const PROOF_OFFSET = 0.002;

/**
 * Ratio of the formed part's own section to its section at the proof point of a tensile test,
 * exp(−0.002): constant volume, A = A₁·exp(−ε) after a further true plastic strain ε = 0.002.
 */
export const PROOF_SECTION_FACTOR = Math.exp(-PROOF_OFFSET);

/**
 * Reload yield: the engineering 0.2 % proof strength Rp0.2 a tensile test of the formed part would
 * report, force over the part's own section A₁ after an accumulated true plastic strain ε̄:
 *
 *   Rp0.2(ε̄) = F/A₁ = σ(ε̄ + 0.002)·exp(−0.002)
 *
 * (isotropic hardening, loading in the direction of forming; σ the law's true stress; the offset
 * 0.002 taken as plastic strain on the true-strain basis, where it differs from the engineering
 * offset by 2·10⁻⁶). Because σ(ε)·exp(ε̄ − ε) is the engineering stress of that test at every ε ≥ ε̄,
 * this is never above the state's Rm (its maximum), so the yield ratio Rp0.2/Rm ≤ 1.
 * This function is the single definition used by the ledger, targets, the cold-work window, scatter,
 * route design, reports and notebooks.
 * Source: ISO 6892-1 §3.10.3 (proof strength, plastic extension; force over the original section
 * of the specimen, here the formed part's section); constant volume as in Dieter, *Mechanical
 * Metallurgy*, 3rd ed., §8-3. Units: MPa (the law's stress unit). Valid range: ε̄ ≥ 0.
 * @example reloadYield(hollomon({ K: 530, n: 0.44 }), 0.2) // 530·0.202^0.44·e^−0.002 ≈ 261.7
 */
export function reloadYield(law: Pick<FlowLaw, 'stress'>, eps: number): number {
  return law.stress(eps + PROOF_OFFSET) * PROOF_SECTION_FACTOR;
}

/**
 * Inverse of {@link reloadYield}: the accumulated strain ε̄ at which the reload yield equals Y,
 * ε̄ = σ⁻¹(Y·exp(0.002)) − 0.002. May be negative (Y below the annealed state's reload yield: every
 * state reaches it); the caller decides. Returns `null` when no strain reaches Y (at or above the
 * law's saturation stress). Units: Y in MPa, result true plastic strain.
 * @example strainForReloadYield(hollomon({ K: 530, n: 0.44 }), 261.7) // ≈ 0.2
 */
export function strainForReloadYield(law: Pick<FlowLaw, 'strainAt' | 'saturationStress'>, Y: number): number | null {
  const sigma = Y / PROOF_SECTION_FACTOR;
  // A stress at or above saturation is reached by no strain (checked first: throwing is slow).
  if (law.saturationStress !== undefined && sigma >= law.saturationStress) return null;
  try {
    return law.strainAt(sigma) - PROOF_OFFSET;
  } catch {
    return null;
  }
}
