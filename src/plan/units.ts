/**
 * Unit systems of plans and reports. The core works in MPa and mm; conversion happens once at the
 * boundary. 1 ksi = 6.894757293168361 MPa and 1 in = 25.4 mm exactly by definition (NIST SP 811,
 * 2008 edition, Appendix B.8: 1 lbf = 4.4482216152605 N, 1 in = 0.0254 m).
 */
export type UnitSystem = 'SI' | 'US';

export const MPA_PER_KSI = 6.894757293168361;
export const MM_PER_IN = 25.4;

export interface Units {
  system: UnitSystem;
  stress: 'MPa' | 'ksi';
  length: 'mm' | 'in';
  /** Plan stress → MPa. */
  toMPa(x: number): number;
  fromMPa(x: number): number;
  toMm(x: number): number;
  fromMm(x: number): number;
}

export function unitsOf(system: UnitSystem): Units {
  if (system === 'US') {
    return {
      system, stress: 'ksi', length: 'in',
      toMPa: (x) => x * MPA_PER_KSI, fromMPa: (x) => x / MPA_PER_KSI,
      toMm: (x) => x * MM_PER_IN, fromMm: (x) => x / MM_PER_IN,
    };
  }
  const id = (x: number) => x;
  return { system, stress: 'MPa', length: 'mm', toMPa: id, fromMPa: id, toMm: id, fromMm: id };
}
