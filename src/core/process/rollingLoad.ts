import { checkRange, InputError } from '../errors.js';
import { PROCESS_DEFAULTS } from './defaults.js';

/** Roll force and torque of one flat-rolling pass. */
export interface RollingLoad {
  /** Roll separating force, N. */
  force: number;
  /** Total torque on the pair of work rolls, N·m (2·P·λ·L). */
  torque: number;
  /** Mean roll pressure, MPa. */
  meanPressure: number;
  /** Projected arc of contact L = √(R·Δh), mm. */
  contactLength: number;
  /** Friction parameter Q = μ·L/h̄, dimensionless. */
  frictionParameter: number;
  /** Largest draft the rolls can bite, Δh = μ²·R, mm. */
  maxBiteDraft: number;
}

/**
 * Flat-rolling force and torque by the plane-strain mean-pressure model with Coulomb friction
 * (rigid rolls, no roll flattening):
 *
 *   L = √(R·Δh),  h̄ = (h0 + h1)/2,  Q = μ·L/h̄,  p̄ = σ0'·(e^Q − 1)/Q,  P = p̄·w·L,
 *   torque of the roll pair = 2·P·λ·L  (λ = 0.45 cold),  σ0' = (2/√3)·Ȳ,
 *
 * Ȳ the mean uniaxial flow stress of the pass, σ0' the plane-strain flow stress. Source: Dieter,
 * *Mechanical Metallurgy*, 3rd ed., §17-5 (mean pressure (1/Q)(e^Q − 1), torque lever arm) — from
 * memory, not confirmed on a stored page. The bite limit Δh_max = μ²·R is from the same section.
 *
 * Units: R, h0, h1, w in mm; Ȳ in MPa; μ dimensionless; force N; torque N·m; pressure MPa.
 * Valid range: 0 < h1 < h0, Δh < 2R, 0 ≤ μ ≤ 0.6 (Q → 0 gives p̄ = σ0'), w > 0. Roll flattening
 * (Hitchcock) is not included, so thin hard strip gets a low estimate.
 * @throws InputError naming the parameter for a value outside its range.
 * @example rollingLoad(170 * Math.sqrt(3) / 2, 450, 40, 28, 760, 0.3).force // ≈ 13.36e6 N (Dieter's hot-rolling example, see tests)
 */
export function rollingLoad(meanFlowStress: number, rollRadius: number, h0: number, h1: number, width: number, friction: number, path = 'step'): RollingLoad {
  const Y = checkRange(`${path}.meanFlowStress`, meanFlowStress, 0, Infinity);
  const R = checkRange(`${path}.rollRadius`, rollRadius, 0, Infinity, { loOpen: true });
  const w = checkRange(`${path}.width`, width, 0, Infinity, { loOpen: true });
  const mu = checkRange(`${path}.friction`, friction, 0, 0.6);
  checkRange(`${path}.thickness`, h1, 0, Infinity, { loOpen: true });
  const dh = h0 - h1;
  if (!(dh >= 0)) throw new InputError(`${path}.thickness`, h1, `a thickness at most the entry thickness ${h0}`);
  if (dh >= 2 * R) throw new InputError(`${path}.rollRadius`, R, `a roll radius above half the draft (${dh / 2})`);
  const L = Math.sqrt(R * dh);
  const hBar = (h0 + h1) / 2;
  const Q = (mu * L) / hBar;
  const factor = Q < 1e-8 ? 1 + Q / 2 : Math.expm1(Q) / Q;
  const sigmaPs = (2 / Math.sqrt(3)) * Y;
  const p = sigmaPs * factor;
  const force = p * w * L; // MPa·mm² = N
  const torque = (2 * force * PROCESS_DEFAULTS.rollTorqueArmFraction * L) / 1000; // N·mm → N·m
  return { force, torque, meanPressure: p, contactLength: L, frictionParameter: Q, maxBiteDraft: mu * mu * R };
}
