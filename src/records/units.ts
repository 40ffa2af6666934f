/** Units a record may come in, and their factors to the core's units (MPa, N, mm, strain fraction). */
export const STRESS_UNITS: Readonly<Record<string, number>> = {
  mpa: 1, 'n/mm²': 1, 'n/mm2': 1, 'n/mm^2': 1, 'n/mm**2': 1, gpa: 1000, kpa: 1e-3, pa: 1e-6,
  'n/m²': 1e-6, 'n/m2': 1e-6, 'n/m^2': 1e-6, 'n/cm²': 0.01, 'n/cm2': 0.01, 'n/cm^2': 0.01,
  // kN/cm² (10 MPa) as structural-steel tables write it (common practice).
  'kn/cm²': 10, 'kn/cm2': 10, 'kn/cm^2': 10, 'kn/mm²': 1000, 'kn/mm2': 1000, 'kn/mm^2': 1000,
  // 1 ksi = 6.894757293168361 MPa, 1 psi = 0.006894757293168361 MPa (NIST SP 811, Appendix B.8); psi written out
  // as pound-force per square inch.
  ksi: 6.894757293168361, psi: 0.006894757293168361,
  'lbf/in²': 0.006894757293168361, 'lbf/in2': 0.006894757293168361, 'lbf/in^2': 0.006894757293168361,
  'lb/in²': 0.006894757293168361, 'lb/in2': 0.006894757293168361, 'lb/in^2': 0.006894757293168361,
  'kip/in²': 6.894757293168361, 'kip/in2': 6.894757293168361, 'kip/in^2': 6.894757293168361,
  // Kilogram-force per square millimetre (and per cm²) of older certificates: 1 kgf = 9.80665 N (NIST SP 811,
  // Appendix B.8), so 1 kgf/mm² = 9.80665 MPa; 'kg/mm²' as such certificates write it (common practice).
  'kgf/mm²': 9.80665, 'kgf/mm2': 9.80665, 'kgf/mm^2': 9.80665, 'kg/mm²': 9.80665, 'kg/mm2': 9.80665, 'kg/mm^2': 9.80665,
  'kgf/cm²': 0.0980665, 'kgf/cm2': 0.0980665, 'kgf/cm^2': 0.0980665, 'kg/cm²': 0.0980665, 'kg/cm2': 0.0980665, 'kg/cm^2': 0.0980665,
  // The kilopond (kp) is the kilogram-force under its older German name: 1 kp/mm² = 9.80665 MPa (DIN 1301 before
  // SI, from memory; common practice). The decanewton (daN = 10 N, SI prefix deca) per mm² of French certificates is 10 MPa, as
  // is the hectobar (hbar = 10⁷ Pa) they also write (SI Brochure, prefixes; common practice).
  'kp/mm²': 9.80665, 'kp/mm2': 9.80665, 'kp/mm^2': 9.80665,
  'dan/mm²': 10, 'dan/mm2': 10, 'dan/mm^2': 10, 'dan/cm²': 0.1, 'dan/cm2': 0.1, 'dan/cm^2': 0.1, hbar: 10,
};
export const FORCE_UNITS: Readonly<Record<string, number>> = {
  // 1 lbf = 4.4482216152605 N, 1 kgf = 9.80665 N (NIST SP 811, Appendix B.8); 'lb'/'lbs' as US exports
  // write pound-force (common practice).
  n: 1, kn: 1000, lbf: 4.4482216152605, lb: 4.4482216152605, lbs: 4.4482216152605,
  kip: 4448.2216152605, kips: 4448.2216152605, klbf: 4448.2216152605, kgf: 9.80665,
  // The decanewton of French and other European machine exports (daN = 10 N, SI prefix deca) and the kilopond
  // (kp = kgf) of older German ones (common practice).
  dan: 10, kp: 9.80665,
};
export const LENGTH_UNITS: Readonly<Record<string, number>> = {
  mm: 1, in: 25.4, inch: 25.4, inches: 25.4, '"': 25.4, m: 1000, cm: 10, µm: 1e-3, μm: 1e-3, um: 1e-3,
};
export const AREA_UNITS: Readonly<Record<string, number>> = {
  'mm²': 1, mm2: 1, 'mm^2': 1, 'in²': 645.16, in2: 645.16, 'in^2': 645.16,
};
/** Strain: fraction (empty, '-', '1', 'mm/mm', 'in/in') or percent. */
export const STRAIN_UNITS: Readonly<Record<string, number>> = {
  '': 1, '-': 1, '1': 1, 'mm/mm': 1, 'in/in': 1, 'm/m': 1, 'ft/ft': 1, fraction: 1, '%': 0.01, percent: 0.01, pct: 0.01,
  // Microstrain (µε = 1e-6; micro sign U+00B5 or Greek mu U+03BC; 'ue' as ASCII exports write it), mm/m = 1e-3.
  'µε': 1e-6, 'με': 1e-6, 'µe': 1e-6, ue: 1e-6, µstrain: 1e-6, microstrain: 1e-6, 'µm/m': 1e-6, 'μm/m': 1e-6, 'um/m': 1e-6,
  'mm/m': 1e-3, 'µin/in': 1e-6, 'uin/in': 1e-6,
  // Per mille (‰, U+2030; 1 ‰ = 1e-3, the same as mm/m), as some European exports write strain.
  '‰': 1e-3, permille: 1e-3, 'per mille': 1e-3,
};

export type Quantity = 'stress' | 'force' | 'length' | 'strain' | 'time';

const TABLES: Record<Exclude<Quantity, 'time'>, Readonly<Record<string, number>>> = {
  stress: STRESS_UNITS, force: FORCE_UNITS, length: LENGTH_UNITS, strain: STRAIN_UNITS,
};

/**
 * Lower-cased unit without spaces or the brackets around it ([MPa], (ksi), {mm}, <N>); 'N/mm^2' and
 * 'N/mm²' alike, and 'N·mm⁻²', 'N mm-2', 'N.mm^-2'; 'in per in', 'in_per_in' and 'in./in.' read as 'in/in'; 'lbf.' as 'lbf'.
 */
export function normUnit(u: string): string {
  let k = u.trim().toLowerCase();
  for (let i = 0; i < 2; i++) k = k.replace(/^[[({<]\s*(.*?)\s*[\])}>]$/, '$1');
  k = k.replace(/[\s_]+per[\s_]+/g, '/');
  // A negative exponent as SI typesetting writes it (N·mm⁻², N mm-2, N.mm^-2; SI Brochure §5.4.6, from memory): N/mm².
  k = k.replace(/^([a-zµ]+)\s*[·.*]?\s*([a-zµ]+)\s*(?:\^?-2|⁻²)$/, '$1/$2²');
  k = k.replace(/\s+/g, '').replace(/\.(?=\/|$)/g, '');
  return k;
}

/** The factor of `unit` for `q`, or undefined when the unit is not known for that quantity. */
export function unitFactor(q: Exclude<Quantity, 'time'>, unit: string): number | undefined {
  const t = TABLES[q];
  const k = normUnit(unit);
  // MN and mN differ only in case (10⁹ apart; mN is the force unit of small-specimen tests): read them
  // case-sensitively, never through the lower-cased table.
  if (q === 'force' && k === 'mn') {
    const raw = unit.trim().replace(/^[[({<]\s*(.*?)\s*[\])}>]$/, '$1').trim();
    return raw === 'MN' ? 1e6 : raw === 'mN' ? 1e-3 : undefined;
  }
  // MN/m² is the MPa of older British standards; mN/m² (10⁻⁹ MPa) is no tensile stress: only the capital M is read.
  if (q === 'stress' && /^mn\/m(²|2|\^2)$/.test(k)) {
    const raw = unit.trim().replace(/^[[({<]\s*(.*?)\s*[\])}>]$/, '$1').replace(/\s+/g, '');
    return /^MN\/m(²|2|\^2)$/.test(raw) ? 1 : undefined;
  }
  return Object.prototype.hasOwnProperty.call(t, k) ? t[k] : undefined;
}

/** Allowed unit names of a quantity, for messages. */
export function allowedUnits(q: Exclude<Quantity, 'time'>): string {
  switch (q) {
    case 'stress': return 'MPa, N/mm², MN/m², GPa, kPa, Pa, kN/cm², ksi, psi (lbf/in²), kgf/mm² (kp/mm²), daN/mm² (hbar)';
    case 'force': return 'N, kN, daN, lbf, kip, kgf (kp)';
    case 'length': return 'mm, in, m, cm, µm';
    case 'strain': return 'a fraction (-, mm/mm, in/in), %, ‰ (mm/m) or µε (microstrain)';
  }
}
