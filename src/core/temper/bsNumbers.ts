/**
 * Thickness (or diameter) ratio of one B&S (American Wire Gauge) number: the gauge runs from
 * 0.4600 in at No. 0000 to 0.0050 in at No. 36 in 39 equal geometric steps, so one number is
 * 92^(1/39) ≈ 1.122932. Source: ASTM B258, *Standard Specification for Standard Nominal Diameters
 * and Cross-Sectional Areas of AWG Sizes of Solid Round Wires* (the gauge definition; from memory,
 * the numbers 0.46 in, 0.005 in and 39 steps are as printed in every wire table).
 */
export const BS_NUMBER_RATIO = 92 ** (1 / 39);

/**
 * Percent thickness reduction of N B&S numbers: 100·(1 − 1.1229^(−N)).
 * Source: ASTM B601, *Standard Classification for Temper Designations for Copper and Copper
 * Alloys*: rolled tempers are named by B&S numbers of reduction from the annealed state (from memory).
 * Units: N dimensionless (≥ 0), result in percent.
 * @example bsReductionPct(2) // 20.70 (half hard, H02)
 */
export function bsReductionPct(numbers: number): number {
  return -Math.expm1(-numbers * Math.log(BS_NUMBER_RATIO)) * 100;
}
