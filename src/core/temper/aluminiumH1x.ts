/**
 * Increase of the H18 minimum tensile strength over the O temper's, MPa, by the O temper's
 * tensile strength. The rule of ANSI H35.1 / EN 515 for strain-hardened (H1x) tempers, tabulated
 * there in steps; the values below are FROM MEMORY (not checked against a printed copy):
 * Rm(O) ≤ 40 → 55; ≤ 60 → 65; ≤ 80 → 75; ≤ 100 → 85; ≤ 120 → 90; ≤ 160 → 95; ≤ 200 → 100;
 * ≤ 240 → 105; ≤ 280 → 110; ≤ 320 → 115; above → 120. Steps between the tabulated O strengths
 * (e.g. 42 MPa) take the next row up.
 * Units: MPa in and out. Valid range: Rm(O) > 0.
 * @example h18Increase(90) // 85
 */
export function h18Increase(rmO: number): number {
  for (const [upTo, inc] of H18_INCREASE) if (rmO <= upTo) return inc;
  return 120;
}

/** Rows of {@link h18Increase}: [largest O-temper Rm, MPa; increase to H18, MPa] (from memory). */
export const H18_INCREASE: readonly (readonly [number, number])[] = [
  [40, 55], [60, 65], [80, 75], [100, 85], [120, 90], [160, 95], [200, 100], [240, 105], [280, 110], [320, 115],
];

/** H19 lies at least this far above H18, MPa (from memory: ANSI H35.1 / EN 515 "at least 10 MPa"). */
export const H19_ABOVE_H18 = 10;

/**
 * Lower boundaries (minimum tensile strengths) of the strain-hardened aluminium tempers, MPa:
 * H18 = Rm(O) + {@link h18Increase}(Rm(O)); H14 midway between O and H18; H12 midway between O and
 * H14; H16 midway between H14 and H18; H19 = H18 + {@link H19_ABOVE_H18}. No rounding to 5 MPa
 * (the standards round published minima; we keep the rule exact so the scale is continuous).
 * Source: ANSI H35.1 / EN 515 (the midway rule as summarised in the project's CHECKS.md; from memory).
 * Units: MPa. Valid range: Rm(O) > 0.
 * @example aluminiumH1xBoundaries(90).H18 // 175
 */
export function aluminiumH1xBoundaries(rmO: number): { H12: number; H14: number; H16: number; H18: number; H19: number } {
  const H18 = rmO + h18Increase(rmO);
  const H14 = (rmO + H18) / 2;
  return { H12: (rmO + H14) / 2, H14, H16: (H14 + H18) / 2, H18, H19: H18 + H19_ABOVE_H18 };
}
