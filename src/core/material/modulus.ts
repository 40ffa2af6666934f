/** Parameters of the fall of the unloading (chord) modulus with plastic strain. */
export interface ModulusDecay {
  /** Saturated chord modulus after large prestrain, MPa (0 < Ea ≤ E0). */
  Ea: number;
  /** Rate of the fall, dimensionless (ξ > 0). */
  xi: number;
}

/**
 * Unloading chord modulus after plastic strain: E(ε̄) = E0 − (E0 − Ea)·(1 − exp(−ξ·ε̄)).
 *
 * Source: F. Yoshida and T. Uemori, "A model of large-strain cyclic plasticity describing the
 * Bauschinger effect and workhardening stagnation", *Int. J. Plasticity* 18 (2002) 661–686
 * (the chord-modulus form; cited from memory in CHECKS.md, not confirmed on a stored page).
 * Units: E0, Ea in MPa; ε̄ dimensionless. Valid range: ε̄ ≥ 0. Without decay E(ε̄) = E0.
 * @example chordModulus(200000, { Ea: 170000, xi: 20 }, 0.05) // 200000 − 30000·(1 − e^−1) ≈ 181036
 */
export function chordModulus(E0: number, decay: ModulusDecay | undefined, eqStrain: number): number {
  if (!decay) return E0;
  return E0 - (E0 - decay.Ea) * -Math.expm1(-decay.xi * eqStrain);
}
