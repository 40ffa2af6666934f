import { HARDNESS_DEFAULTS } from '../hardness/defaults.js';
import { taborHardness } from '../hardness/taborHardness.js';
import { chordModulus } from '../material/modulus.js';
import type { Material, StateProperties } from './types.js';

/** Plastic offset of the proof strength (Rp0.2): 0.002, ISO 6892-1 §3.10.3 / ASTM E8 offset method. */
export const PROOF_OFFSET = 0.002;

/**
 * Properties a tensile test of the material would show after an accumulated equivalent plastic
 * strain ε̄ (isotropic hardening, same loading direction):
 * - flow stress σ(ε̄);
 * - reload yield Rp0.2 ≈ σ(ε̄ + 0.002) (offset definition, ISO 6892-1);
 * - engineering tensile strength on the new section: σ(εu)·exp(ε̄ − εu) for ε̄ < εu (constant
 *   volume, Considère), the flow stress σ(ε̄) at or past εu (the part necks as it yields);
 * - yield ratio reload yield / tensile strength (can read slightly above 1 past εu);
 * - remaining uniform strain max(0, εu − ε̄) and elongation 100·(exp(remaining) − 1) %;
 * - elastic recovery σ(ε̄)/E(ε̄) and recovered energy σ²/(2E) per volume;
 * - Vickers hardness c·σ(ε̄ + εr)/g₀ by Tabor's relation ({@link taborHardness}; the material's
 *   `hardness` model or the defaults).
 * Units: MPa, dimensionless strains, MJ/m³, HV (kgf/mm²). Valid range: ε̄ ≥ 0.
 * Source: Considère (1885) via Dieter, *Mechanical Metallurgy*, 3rd ed., §8-3; definitions as in
 * ISO 6892-1.
 * @example stateProperties(copper, 0).remainingUniformStrain // = n for a Hollomon law
 */
export function stateProperties(m: Material, eps: number, eu: number = m.law.uniformStrain()): StateProperties {
  const law = m.law;
  const flowStress = law.stress(eps);
  const reloadYield = law.stress(eps + PROOF_OFFSET);
  const tensileStrength = eps < eu ? law.stress(eu) * Math.exp(eps - eu) : flowStress;
  const remainingUniformStrain = eps < eu ? eu - eps : 0;
  const E = chordModulus(m.elasticModulus, m.modulusDecay, eps);
  return {
    flowStress,
    reloadYield,
    tensileStrength,
    yieldRatio: tensileStrength > 0 ? reloadYield / tensileStrength : 0,
    remainingUniformStrain,
    remainingUniformElongationPct: Math.expm1(remainingUniformStrain) * 100,
    elasticModulus: E,
    elasticRecoveryStrain: flowStress / E,
    recoveredElasticEnergy: (flowStress * flowStress) / (2 * E),
    hardnessHV: taborHardness(law, eps, m.hardness ?? HARDNESS_DEFAULTS),
  };
}
