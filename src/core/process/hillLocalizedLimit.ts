import { checkRange } from '../errors.js';

/**
 * Hill's localized-necking limit of a Hollomon sheet (σ = K·εⁿ) strained proportionally at the
 * strain ratio β = ε2/ε1 ≤ 0: the major true strain at which a neck forms along the direction of
 * zero extension,
 *
 *   ε1* = n/(1 + β).
 *
 * Source: R. Hill, J. Mech. Phys. Solids 1 (1952) 19–30; Marciniak, Duncan & Hu, *Mechanics of Sheet
 * Metal Forming*, 2nd ed., §5.4 (eq. for local necking, ε1* = n/(1 + β)). Uniaxial tension
 * (β = −1/2) gives 2n, plane strain (β = 0) gives n. Hill's theory gives no local neck for β > 0.
 * Units: true strain. Valid range: 0 ≤ n ≤ 1, −1 < β ≤ 0.
 * @throws InputError for β outside (−1, 0] or n outside [0, 1].
 * @example hillLocalizedLimit(0.2, -0.5) // 0.4
 */
export function hillLocalizedLimit(n: number, beta: number): number {
  checkRange('n', n, 0, 1);
  checkRange('strainRatio', beta, -1, 0, { loOpen: true });
  return n / (1 + beta);
}

/**
 * The rate (1/σ̄)·dσ̄/dε̄ at which Hill's local neck forms under proportional straining at β (von
 * Mises, isotropic): (1 + β)/φ, with φ = ε̄/ε1 = (2/√3)·√(1 + β + β²). For Hollomon,
 * (1/σ̄)·dσ̄/dε̄ = n/ε̄, which gives back ε1* = n/(1 + β) (derived from Hill's condition
 * dσ1/σ1 = (1 + β)·dε1; Marciniak, Duncan & Hu §5.4). Valid range: −1 < β ≤ 0.
 * @example hillInstabilityRate(-0.5) // 0.5/1 = 0.5
 */
export function hillInstabilityRate(beta: number): number {
  return (1 + beta) / equivalentPerMajor(beta);
}

/**
 * Von Mises equivalent strain per unit major strain under proportional straining at β = ε2/ε1:
 * φ = (2/√3)·√(1 + β + β²) (Marciniak, Duncan & Hu, §2.4). Uniaxial (β = −1/2) 1, plane strain
 * (β = 0) 2/√3, equibiaxial (β = 1) 2. @example equivalentPerMajor(1) // 2
 */
export function equivalentPerMajor(beta: number): number {
  return (2 / Math.sqrt(3)) * Math.sqrt(1 + beta + beta * beta);
}
