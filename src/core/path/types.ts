import type { FlowLaw } from '../flow/types.js';
import type { ModulusDecay } from '../material/modulus.js';

/** One Armstrong–Frederick backstress: hardening modulus C (MPa) and recall rate γ (dimensionless). */
export interface Backstress {
  /** Initial kinematic hardening modulus, MPa (C > 0). */
  C: number;
  /** Dynamic recall rate, dimensionless (γ > 0); the backstress saturates at C/γ. */
  gamma: number;
}

/** Kinematic hardening: one to three Armstrong–Frederick backstresses, summed. */
export interface KinematicSpec {
  backstresses: readonly Backstress[];
}

/** What the 1-D integrator needs of a material (a ledger `Material` satisfies it). MPa throughout. */
export interface PathMaterial {
  /** Young's modulus of the annealed material, MPa. */
  elasticModulus: number;
  /** Flow curve under monotonic loading, true stress versus true plastic strain. */
  law: FlowLaw;
  /** Backstresses; without them hardening is purely isotropic. */
  kinematic?: KinematicSpec;
  /** Fall of the unloading modulus with accumulated plastic strain. */
  modulusDecay?: ModulusDecay;
}

/** Options of {@link integratePath}. */
export interface PathOptions {
  /** Largest total-strain increment between output points; defaults to `PATH_DEFAULTS.maxIncrement`. */
  maxIncrement?: number;
  /** Relative tolerance of the consistency condition in each return mapping; defaults to `PATH_DEFAULTS.tolerance`. */
  tolerance?: number;
}

/** One output point of a path (MPa, true strain). */
export interface PathPoint {
  /** Total true strain. */
  strain: number;
  /** True stress, MPa (tension positive). */
  stress: number;
  /** Signed plastic strain εp. */
  plasticStrain: number;
  /** Accumulated plastic strain p = ∫|dεp| (the equivalent plastic strain in 1-D). */
  accumulatedPlasticStrain: number;
  /** Sum of the backstresses, MPa. */
  backstress: number;
  /** Yield-surface size (radius) R(p), MPa: the surface is |σ − X| ≤ R. */
  yieldSurfaceSize: number;
  /** Elastic (unloading) modulus at this point, E(p), MPa. */
  modulus: number;
}

/** Result of a path integration; `converged` is false if any return mapping missed its tolerance. */
export interface PathResult {
  points: PathPoint[];
  converged: boolean;
  /** Largest number of Newton iterations any increment needed. */
  iterations: number;
  /** Largest |consistency residual| / yield stress of any plastic increment. */
  residual: number;
  /** Number of strain increments taken. */
  increments: number;
}
