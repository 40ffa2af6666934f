/**
 * Von Mises equivalent plastic strain of the common forming modes, for proportional straining of an
 * isotropic, volume-constant metal. Source: Marciniak, Duncan & Hu, *Mechanics of Sheet Metal
 * Forming*, 2nd ed. (2002), §2.4 and §3.4 (plane strain ε̄ = (2/√3)·ε1); drawing and upsetting as
 * ln of the area or height ratio (Hosford & Caddell, *Metal Forming*, 4th ed., ch. 6 and 7).
 * All strains are true (logarithmic) and dimensionless; sizes in any one length unit.
 */

/** 2/√3: the plane-strain factor between the major true strain and the von Mises equivalent strain. */
export const PLANE_STRAIN_FACTOR = 2 / Math.sqrt(3);

/**
 * Rolling (plane strain, no spread): ε̄ = (2/√3)·ln(t0/t).
 * Valid range: 0 < t ≤ t0. @example rollingStrain(2, 1) // 0.8004
 */
export function rollingStrain(t0: number, t: number): number {
  return PLANE_STRAIN_FACTOR * Math.log(t0 / t);
}

/**
 * Drawing of wire or bar (axisymmetric): ε̄ = ln(A0/A) = 2·ln(d0/d).
 * Valid range: 0 < d ≤ d0. @example drawingStrain(15.2, 12.2) // 0.4398
 */
export function drawingStrain(d0: number, d: number): number {
  return 2 * Math.log(d0 / d);
}

/**
 * Equibiaxial stretching: ε3 = −2ε1, so ε̄ = 2·ε1.
 * Valid range: ε1 ≥ 0. @example biaxialStrain(0.1) // 0.2
 */
export function biaxialStrain(eps1: number): number {
  return 2 * eps1;
}

/**
 * Simple shear: ε̄ = γ/√3.
 * Valid range: γ ≥ 0. @example shearStrain(Math.sqrt(3)) // 1
 */
export function shearStrain(gamma: number): number {
  return gamma / Math.sqrt(3);
}

/**
 * Upsetting (uniaxial compression): ε̄ = ln(h0/h).
 * Valid range: 0 < h ≤ h0. @example upsetStrain(20, 10) // 0.6931
 */
export function upsetStrain(h0: number, h: number): number {
  return Math.log(h0 / h);
}

/**
 * True strain from engineering strain: ε = ln(1 + e), valid to maximum force (Dowling,
 * *Mechanical Behavior of Materials*, §4.5). @example trueFromEngineering(0.1) // 0.09531
 */
export function trueFromEngineering(e: number): number {
  return Math.log1p(e);
}

/**
 * Cold work as area reduction, %CW = (A0 − A)/A0 × 100 (Callister, *Fundamentals of Materials
 * Science and Engineering*, eq. for percent cold work). Valid range: 0 < A ≤ A0.
 * @example coldWorkPct(Math.PI * 15.2 ** 2 / 4, Math.PI * 12.2 ** 2 / 4) // 35.58
 */
export function coldWorkPct(a0: number, a: number): number {
  return ((a0 - a) / a0) * 100;
}
