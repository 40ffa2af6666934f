/** Where the Tabor factor c of a material came from, for the report's provenance. */
export type HardnessBasis = 'default' | 'given' | 'fitted';

/** Material group of a hardness conversion table (only groups whose table the project includes). */
export type ConversionGroup = 'steel';

/** Scales a Vickers number can be converted to (and the estimated tensile strength `Rm`, MPa). */
export type HardnessScale = 'HB' | 'HRB' | 'HRC' | 'Rm';

/**
 * The hardness model of a material, resolved: HV = c·σ(ε̄ + εr)/g₀.
 * `taborFactor` c is the Vickers number in MPa over the flow stress σ(ε̄ + εr) (dimensionless);
 * `representativeStrain` εr is added to the accumulated strain (true, plastic).
 */
export interface HardnessModel {
  taborFactor: number;
  representativeStrain: number;
  basis: HardnessBasis;
  /** 95 % interval of c when fitted from readings. */
  taborFactorInterval?: readonly [number, number];
  /** Number of readings c was fitted on. */
  readings?: number;
  /** Conversion table group; without it no conversion to HB, HRB, HRC or Rm is given. */
  conversionGroup?: ConversionGroup;
}

/** One hardness reading of a state of known accumulated equivalent plastic strain (true). */
export interface HardnessReading {
  /** Accumulated equivalent plastic strain of the state read, ≥ 0. */
  strain: number;
  /** Vickers hardness, HV (kgf/mm²). */
  hv: number;
}
