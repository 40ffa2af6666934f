import { HARDNESS_DEFAULTS } from '../hardness/defaults.js';
import { taborHardness } from '../hardness/taborHardness.js';
import { forcePeaks, hasLaterForcePeaks } from '../flow/considere.js';
import { chordModulus } from '../material/modulus.js';
import { reloadYield as reloadYieldOf } from './reloadYield.js';
import type { Material, StateProperties } from './types.js';

export { PROOF_OFFSET } from './reloadYield.js';

/**
 * Properties a tensile test of the material would show after an accumulated equivalent plastic
 * strain ε̄ (isotropic hardening, same loading direction):
 * - flow stress σ(ε̄) (true stress);
 * - reload yield Rp0.2 = σ(ε̄ + 0.002)·exp(−0.002), engineering, on the part's own section
 *   ({@link reloadYieldOf reloadYield});
 * - engineering tensile strength Rm on the same section: the largest σ(ε)·exp(ε̄ − ε) over ε ≥ ε̄
 *   (constant volume), i.e. σ(εu)·exp(ε̄ − εu) for ε̄ < εu (Considère), the flow stress σ(ε̄) at or
 *   past εu (the part necks as it yields); for an S-shaped law the later force peaks are compared
 *   too ({@link forcePeaks});
 * - yield ratio Rp0.2 / Rm, ≤ 1 always (both engineering, same section; Rp0.2 is one point of the
 *   curve whose maximum is Rm);
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
  const reloadYield = reloadYieldOf(law, eps);
  let tensileStrength = eps < eu ? law.stress(eu) * Math.exp(eps - eu) : flowStress;
  if (hasLaterForcePeaks(law)) {
    // S-shaped law: the force may peak again after εu (see forcePeaks).
    for (const pk of forcePeaks(law)) if (pk > eps) tensileStrength = Math.max(tensileStrength, law.stress(pk) * Math.exp(eps - pk));
  }
  const remainingUniformStrain = eps < eu ? eu - eps : 0;
  const E = chordModulus(m.elasticModulus, m.modulusDecay, eps);
  return {
    flowStress,
    reloadYield,
    tensileStrength,
    // Rp0.2 ≤ Rm holds exactly; Math.min only absorbs a last-bit rounding when ε̄ + 0.002 sits at a
    // force peak (the property test checks Rp0.2 ≤ Rm·(1 + 1e-12) without it).
    yieldRatio: tensileStrength > 0 ? Math.min(1, reloadYield / tensileStrength) : 0,
    remainingUniformStrain,
    remainingUniformElongationPct: Math.expm1(remainingUniformStrain) * 100,
    elasticModulus: E,
    elasticRecoveryStrain: flowStress / E,
    recoveredElasticEnergy: (flowStress * flowStress) / (2 * E),
    hardnessHV: taborHardness(law, eps, m.hardness ?? HARDNESS_DEFAULTS),
  };
}
