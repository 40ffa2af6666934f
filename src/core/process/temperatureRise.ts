import { checkRange } from '../errors.js';
import { PROCESS_DEFAULTS } from './defaults.js';

/**
 * Adiabatic temperature rise of a pass from the work done on the metal:
 *
 *   ΔT = β·W/(ρ·c)
 *
 * W the work per unit volume (MJ/m³, numerically MPa; ×10⁶ for J/m³), β the fraction turned into
 * heat (Taylor–Quinney coefficient, default 0.9: Taylor & Quinney, Proc. R. Soc. A 143, 1934; J.
 * Appl. Phys. 136, 065102, 2024), ρ the density (kg/m³) and c the specific heat (J/(kg·K)).
 * No heat leaves the metal during the pass (adiabatic: an upper bound for fast passes) and the metal
 * is assumed back at room temperature before the next pass (the rise is per pass, not cumulative).
 * Units: K. Valid range: W ≥ 0, ρ > 0, c > 0, 0 ≤ β ≤ 1.
 * @example temperatureRise(100, 7850, 460) // 0.9·100e6/(7850·460) ≈ 24.92 K
 */
export function temperatureRise(workPerVolume: number, density: number, specificHeat: number, beta: number = PROCESS_DEFAULTS.heatToWorkFraction, path = 'step'): number {
  const W = checkRange(`${path}.plasticWork`, workPerVolume, 0, Infinity);
  const rho = checkRange('material.density', density, 0, Infinity, { loOpen: true });
  const c = checkRange('material.specificHeat', specificHeat, 0, Infinity, { loOpen: true });
  const b = checkRange(`${path}.heatToWorkFraction`, beta, 0, 1);
  return (b * W * 1e6) / (rho * c);
}
