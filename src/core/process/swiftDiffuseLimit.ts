import { checkRange } from '../errors.js';
import { equivalentPerMajor } from './hillLocalizedLimit.js';

/**
 * Swift's diffuse-necking limit of a Hollomon sheet (σ = K·εⁿ, von Mises, isotropic) strained
 * proportionally at β = ε2/ε1: the major true strain at maximum load in both in-plane directions,
 *
 *   ε1* = 2n·(1 + β + β²) / ((1 + β)·(2β² − β + 2)).
 *
 * Source: H. W. Swift, J. Mech. Phys. Solids 1 (1952) 1–18; the Hollomon/von Mises form as in
 * Marciniak, Duncan & Hu, *Mechanics of Sheet Metal Forming*, 2nd ed., §5.3 — written from memory and
 * checked by its known special cases: uniaxial tension (β = −1/2), plane strain (β = 0) and
 * equibiaxial tension (β = 1) all give ε1* = n (uniaxial tension is Considère's ε = n).
 * Units: true strain. Valid range: 0 ≤ n ≤ 1, −1/2 ≤ β ≤ 1 (tension–tension side and uniaxial).
 * @throws InputError for β or n outside the range.
 * @example swiftDiffuseLimit(0.2, 0.5) // 2·0.2·1.75/(1.5·2.0) ≈ 0.2333
 */
export function swiftDiffuseLimit(n: number, beta: number): number {
  checkRange('n', n, 0, 1);
  checkRange('strainRatio', beta, -0.5, 1);
  return (2 * n * (1 + beta + beta * beta)) / ((1 + beta) * (2 * beta * beta - beta + 2));
}

/**
 * The rate (1/σ̄)·dσ̄/dε̄ at which Swift's diffuse neck forms at β: z = (1 + β)(2β² − β + 2) /
 * (2·(1 + β + β²)·φ), φ = (2/√3)·√(1 + β + β²). Derived from {@link swiftDiffuseLimit}: for Hollomon
 * the rate is n/ε̄, so ε̄* = n/z and ε1* = ε̄* / φ. Uniaxial tension gives 1 (Considère).
 * Valid range: −1/2 ≤ β ≤ 1. @example swiftInstabilityRate(-0.5) // 1
 */
export function swiftInstabilityRate(beta: number): number {
  return ((1 + beta) * (2 * beta * beta - beta + 2)) / (2 * (1 + beta + beta * beta) * equivalentPerMajor(beta));
}
