import { ComputationError, checkRange } from '../errors.js';
import type { FlowLaw } from '../flow/types.js';
import { HARDNESS_DEFAULTS, HARDNESS_RANGES, STANDARD_GRAVITY } from './defaults.js';
import type { HardnessModel } from './types.js';

/**
 * Validates a hardness model's Tabor parameters against {@link HARDNESS_RANGES}.
 * @throws InputError naming `PATH.taborFactor` or `PATH.representativeStrain`, the value and the range.
 * @example validateHardnessModel({ taborFactor: 2.8, representativeStrain: 0.08, basis: 'given' })
 */
export function validateHardnessModel(m: HardnessModel, path = 'material.hardness'): HardnessModel {
  checkRange(`${path}.taborFactor`, m.taborFactor, HARDNESS_RANGES.taborFactor[0], HARDNESS_RANGES.taborFactor[1]);
  checkRange(`${path}.representativeStrain`, m.representativeStrain, HARDNESS_RANGES.representativeStrain[0], HARDNESS_RANGES.representativeStrain[1]);
  return m;
}

/** The default hardness model ({@link HARDNESS_DEFAULTS}, basis `default`). */
export function defaultHardnessModel(): HardnessModel {
  return { taborFactor: HARDNESS_DEFAULTS.taborFactor, representativeStrain: HARDNESS_DEFAULTS.representativeStrain, basis: 'default' };
}

/**
 * Vickers hardness of a state by Tabor's relation:
 *
 *   HV = c · σ(ε̄ + εr) / g₀
 *
 * with σ the flow curve (true stress, MPa, versus true plastic strain), ε̄ the accumulated equivalent
 * plastic strain, εr the representative strain the indentation adds, c the Tabor factor (Vickers
 * number in MPa over σ) and g₀ = 9.80665 turning MPa into kgf/mm². Closed forms follow from the law:
 * Hollomon HV = c·K·(ε̄ + εr)ⁿ/g₀; Voce HV = c·(σ0 + Q(1 − e^(−b(ε̄+εr))))/g₀.
 *
 * Source: D. Tabor, *The Hardness of Metals*, Oxford 1951 (p ≈ 3·Y at a representative strain ≈ 0.08,
 * from memory); Vickers geometry ISO 6507-1 (contact/projected area). Units: HV in kgf/mm² (the
 * conventional Vickers number). Valid: ε̄ ≥ 0, for metals that harden by plastic flow and
 * indentations large against the grain size; an estimate of ±10–15 % (common practice), not a
 * substitute for a hardness test.
 * @throws ComputationError when the result is not finite.
 * @example taborHardness(hollomon({ K: 530, n: 0.44 }), 0) // ≈ 49.5 HV (annealed copper, Callister's K, n)
 */
export function taborHardness(law: FlowLaw, strain: number, model: Pick<HardnessModel, 'taborFactor' | 'representativeStrain'> = HARDNESS_DEFAULTS): number {
  const hv = (model.taborFactor * law.stress(strain + model.representativeStrain)) / STANDARD_GRAVITY;
  if (!Number.isFinite(hv)) throw new ComputationError('hardnessHV', `not a finite number (${hv}) at accumulated strain ${strain} (allowed ε̄ ≥ 0) with taborFactor ${model.taborFactor} and representativeStrain ${model.representativeStrain}; check the law and material.hardness`);
  return hv;
}

/**
 * Inverse of {@link taborHardness}: the accumulated strain ε̄ at which the Tabor estimate reaches `hv`,
 * ε̄ = σ⁻¹(hv·g₀/c) − εr. Returns a negative number when the annealed material is already harder than
 * `hv` (the caller clips), and `null` when no strain reaches it (at or above a saturating law's limit).
 * Units: HV in kgf/mm², strain dimensionless. Source: as {@link taborHardness}.
 * @example strainForHardness(hollomon({ K: 530, n: 0.44 }), 94.4) // ≈ 0.268
 */
export function strainForHardness(law: FlowLaw, hv: number, model: Pick<HardnessModel, 'taborFactor' | 'representativeStrain'> = HARDNESS_DEFAULTS): number | null {
  const sigma = (hv * STANDARD_GRAVITY) / model.taborFactor;
  if (law.saturationStress !== undefined && sigma >= law.saturationStress) return null;
  if (sigma <= law.stress(0)) return -model.representativeStrain;
  try {
    return law.strainAt(sigma) - model.representativeStrain;
  } catch {
    return null;
  }
}
