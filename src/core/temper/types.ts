/** The temper systems strainledger knows (see `core/temper/scale.ts`). */
export type TemperSystemName = 'copperRolled' | 'aluminiumH1x' | 'steelStrip';

/**
 * The property a temper system is defined by:
 * - `thicknessReductionPct`: thickness reduction of strip from the annealed state, % (the row's
 *   accumulated strain read as plane-strain rolling: 100·(1 − e^(−(√3/2)·ε̄)));
 * - `tensileStrength`: the row's tensile strength Rm, MPa in the core;
 * - `hardnessHV`: the row's Vickers hardness (Tabor estimate, core/hardness), HV.
 */
export type TemperBasis = 'thicknessReductionPct' | 'tensileStrength' | 'hardnessHV';

/** One temper of a scale: it runs from `from` (inclusive) up to the next temper's `from` (exclusive). */
export interface TemperBand {
  designation: string;
  name: string;
  /** Lower boundary in the scale's basis (percent, MPa or HV). */
  from: number;
}

/** A temper system made concrete for one material (aluminium needs the O temper's Rm). */
export interface TemperScale {
  system: TemperSystemName;
  basis: TemperBasis;
  /** Bands in increasing order of `from`; the last runs without an upper limit. */
  bands: readonly TemperBand[];
}

/** The temper of a ledger row. */
export interface TemperState {
  designation: string;
  name: string;
  /** Designation of the next harder temper, or null at the top of the scale. */
  next: string | null;
  /**
   * How far the state has come from this temper's lower boundary towards the next temper's, as a
   * fraction in [0, 1) of the gap (in the scale's basis); null at the top of the scale.
   */
  towardNext: number | null;
}
