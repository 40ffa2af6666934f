import { InputError } from '../errors.js';

/**
 * Default range of equivalent plastic strain since the previous anneal (or the annealed start) in
 * which a full anneal risks coarse grains: [0.02, 0.10]. Recrystallisation after only a few per cent
 * of cold work nucleates few grains, which grow large (orange peel, low strength); below the lower
 * end the metal does not recrystallise at all. Common practice; the "critical strain" of
 * W. D. Callister, *Materials Science and Engineering*, recrystallisation section, and F. J. Humphreys
 * & M. Hatherly, *Recrystallization and Related Annealing Phenomena*, 2nd ed., ch. 7 (from memory:
 * roughly 2–10 %, depending on alloy, grain size and annealing temperature). Set it per material
 * with `material.grainGrowthStrain`.
 */
export const DEFAULT_GRAIN_GROWTH_STRAIN: readonly [number, number] = [0.02, 0.1];

/**
 * Validates a grain-growth strain range [from, to]: 0 ≤ from < to ≤ 1.
 * @throws InputError naming `path`, the value and the allowed range.
 */
export function validateGrainGrowthStrain(range: readonly [number, number] | undefined, path = 'material.grainGrowthStrain'): readonly [number, number] {
  if (range === undefined) return DEFAULT_GRAIN_GROWTH_STRAIN;
  const [a, b] = range;
  if (!(Number.isFinite(a) && Number.isFinite(b) && a >= 0 && b > a && b <= 1)) {
    throw new InputError(path, range, 'a pair [from, to] of equivalent strains with 0 ≤ from < to ≤ 1');
  }
  return [a, b];
}

/**
 * Whether a full anneal after `strainSince` equivalent plastic strain since the previous anneal
 * (or the annealed start) falls in the coarse-grain range [from, to] (both ends included).
 * Units: dimensionless true strain.
 * @example inGrainGrowthRange(0.04, DEFAULT_GRAIN_GROWTH_STRAIN) // true; 0.30 → false
 */
export function inGrainGrowthRange(strainSince: number, range: readonly [number, number]): boolean {
  return strainSince >= range[0] && strainSince <= range[1];
}
