/**
 * Unit systems of plans and reports. The core works in MPa and mm; conversion happens once at the
 * boundary. 1 ksi = 6.894757293168361 MPa and 1 in = 25.4 mm exactly by definition (NIST SP 811,
 * 2008 edition, Appendix B.8: 1 lbf = 4.4482216152605 N, 1 in = 0.0254 m).
 */
export type UnitSystem = 'SI' | 'US';

export const MPA_PER_KSI = 6.894757293168361;
export const MM_PER_IN = 25.4;
/** 1 lbf = 4.4482216152605 N exactly (NIST SP 811, Appendix B.8). */
export const N_PER_LBF = 4.4482216152605;
/** 1 lbf·ft = 4.4482216152605 N × 0.3048 m = 1.3558179483314004 N·m (NIST SP 811, Appendix B.8). */
export const NM_PER_LBF_FT = N_PER_LBF * 0.3048;

export interface Units {
  system: UnitSystem;
  stress: 'MPa' | 'ksi';
  length: 'mm' | 'in';
  /** Plan stress → MPa. */
  toMPa(x: number): number;
  fromMPa(x: number): number;
  toMm(x: number): number;
  fromMm(x: number): number;
  /**
   * Forces: N (SI) or lbf (US); torques N·m or lbf·ft. Density (kg/m³) and specific heat (J/(kg·K)) stay SI in both systems.
   * Vickers hardness (HV, kgf/mm² by convention; targets, readings, report) is the same number in SI and US plans: never converted.
   */
  force: 'N' | 'lbf';
  torque: 'N·m' | 'lbf·ft';
  toN(x: number): number;
  fromN(x: number): number;
  fromNm(x: number): number;
}

export function unitsOf(system: UnitSystem): Units {
  if (system === 'US') {
    return {
      system, stress: 'ksi', length: 'in',
      toMPa: (x) => x * MPA_PER_KSI, fromMPa: (x) => x / MPA_PER_KSI,
      toMm: (x) => x * MM_PER_IN, fromMm: (x) => x / MM_PER_IN,
      force: 'lbf', torque: 'lbf·ft', toN: (x) => x * N_PER_LBF, fromN: (x) => x / N_PER_LBF, fromNm: (x) => x / NM_PER_LBF_FT,
    };
  }
  const id = (x: number) => x;
  return { system, stress: 'MPa', length: 'mm', toMPa: id, fromMPa: id, toMm: id, fromMm: id, force: 'N', torque: 'N·m', toN: id, fromN: id, fromNm: id };
}
