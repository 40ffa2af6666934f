/**
 * Proof strength, plastic extension: the stress where the line parallel to the elastic line, offset by
 * `offset` strain, meets the curve — Rp in ISO 6892-1 §3.10.3.1 and Figure 3 (0.2 % offset: Rp0.2);
 * "offset method", ASTM E8 §7.7.1. Found as the first sign change of g = σ − E·(e − e0 − offset)
 * after `fromIndex`, linearly interpolated between the two bracketing points.
 * Units: strain fraction, stresses and E in MPa. Valid: offset > 0.
 * @returns the stress in MPa and the (fractional) index, or null when the curve never crosses the line.
 * @example proofStrength([0, 0.002, 0.004, 0.006], [0, 400, 440, 450], 200000, 0, 0.002) // ≈ 436.4 MPa
 */
export function proofStrength(
  strain: ArrayLike<number>, stress: ArrayLike<number>, E: number, toe: number, offset: number, fromIndex = 0, toIndex = strain.length,
): { stress: number; index: number } | null {
  const g = (i: number) => stress[i]! - E * (strain[i]! - toe - offset);
  let prev = g(fromIndex);
  for (let i = fromIndex + 1; i < toIndex; i++) {
    const cur = g(i);
    if (prev > 0 && cur <= 0) {
      const t = prev / (prev - cur);
      return { stress: stress[i - 1]! + t * (stress[i]! - stress[i - 1]!), index: i - 1 + t };
    }
    prev = cur;
  }
  return null;
}

/**
 * Proof strength, total extension Rt (ISO 6892-1 §3.10.3.3): the stress where the total extension
 * (toe-compensated) first reaches `total`, linearly interpolated. Rt0.5: total = 0.005.
 * Units: strain fraction, stress MPa. @returns MPa, or null when never reached.
 * @example totalExtensionStrength([0, 0.004, 0.006], [0, 400, 420], 0, 0.005) // 410
 */
export function totalExtensionStrength(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, total: number, toIndex = strain.length): number | null {
  for (let i = 1; i < toIndex; i++) {
    const a = strain[i - 1]! - toe, b = strain[i]! - toe;
    if (a < total && b >= total) return stress[i - 1]! + ((total - a) / (b - a)) * (stress[i]! - stress[i - 1]!);
  }
  return null;
}
