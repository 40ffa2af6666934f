/**
 * The one table of process-planning defaults (stated once; docs and code read it from here).
 * - `maxDrawabilityRatio` 0.8: drawing stress at most 80 % of the flow stress of the drawn wire,
 *   i.e. a safety factor of 1.25 against the wire yielding outside the die (common practice, no
 *   source; shops use 0.6–0.9 depending on wire quality and speed).
 * - `heatToWorkFraction` β = 0.9: fraction of plastic work turned into heat (Taylor & Quinney 1934;
 *   J. Appl. Phys. 136, 065102, 2024, and long-standing practice).
 * - `maxTemperatureRise` 150 K per pass: above it a warning (common practice, no source: low-carbon
 *   steel wire strain-ages and lubricants break down when the wire runs a few hundred °C hot).
 * - `rollTorqueArmFraction` λ = 0.45: lever arm of the roll force as a fraction of the projected
 *   contact length for cold rolling (Dieter, *Mechanical Metallurgy*, 3rd ed., §17-5, "0.5 for hot
 *   rolling, 0.45 for cold rolling"; from memory, not confirmed on a stored page).
 */
export const PROCESS_DEFAULTS = {
  maxDrawabilityRatio: 0.8,
  heatToWorkFraction: 0.9,
  maxTemperatureRise: 150,
  rollTorqueArmFraction: 0.45,
} as const;

/** Degrees to radians. */
export const RAD_PER_DEG = Math.PI / 180;
