import { errorFunction } from 'simple-statistics';
import type { Rng } from './rng.js';

/**
 * Standard normal deviates from a seeded uniform source by the Box–Muller transform:
 * z₁ = √(−2 ln u₁)·cos(2πu₂), z₂ = √(−2 ln u₁)·sin(2πu₂), u₁ ∈ (0, 1], u₂ ∈ [0, 1).
 * Source: G. E. P. Box & M. E. Muller, "A note on the generation of random normal deviates",
 * Ann. Math. Statist. 29 (1958) 610–611. Both deviates of a pair are used.
 * Units: none. Valid range: any seeded {@link Rng}.
 * @example const z = normalSampler(xoshiro128ss(1)); z() // a standard normal deviate
 */
export function normalSampler(rng: Rng): () => number {
  let spare = 0;
  let hasSpare = false;
  return () => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    const u1 = 1 - rng.nextFloat();
    const u2 = rng.nextFloat();
    const r = Math.sqrt(-2 * Math.log(u1));
    const a = 2 * Math.PI * u2;
    spare = r * Math.sin(a);
    hasSpare = true;
    return r * Math.cos(a);
  };
}

/**
 * Standard normal cumulative distribution Φ(x) = (1 + erf(x/√2))/2, with erf from simple-statistics
 * (the Numerical Recipes `erfcc` Chebyshev fit, fractional error below 1.2·10⁻⁷ everywhere; Press et
 * al., *Numerical Recipes in C*, 2nd ed., §6.2).
 * Units: none. Valid range: any finite x.
 * @example normalCdf(1.6448536) // ≈ 0.95
 */
export function normalCdf(x: number): number {
  return 0.5 * (1 + errorFunction(x / Math.SQRT2));
}
