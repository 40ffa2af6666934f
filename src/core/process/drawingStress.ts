import { checkRange, InputError } from '../errors.js';

/** Parts of the drawing stress, MPa: σd = ideal + friction + redundant. */
export interface DrawingStress {
  /** Drawing stress at the die exit, MPa (force over exit area). */
  stress: number;
  /** Ideal (homogeneous) work part Ȳ·ε, MPa. */
  ideal: number;
  /** Friction part Ȳ·(μ/α)·ε, MPa. */
  friction: number;
  /** Redundant (internal shearing) work part Ȳ·(2/3)·α, MPa. */
  redundant: number;
}

/**
 * Drawing stress of a round wire or bar through a conical die, in the Siebel form
 *
 *   σd = Ȳ·[(1 + μ/α)·ε + (2/3)·α],   ε = ln(A0/A1)
 *
 * with Ȳ the mean (uniaxial) flow stress over the pass, μ the Coulomb friction coefficient and α the
 * die half-angle in radians. The three terms are the ideal work, the friction work and the redundant
 * work. Source: E. Siebel's drawing formula as given in Dieter, *Mechanical Metallurgy*, 3rd ed.,
 * §19-4 (drawing of rods and wire) — written here from memory, not confirmed on a stored page. With
 * μ = 0 and α = 0 it reduces to the ideal work Ȳ·ln(A0/A1) (CHECKS.md; Hosford & Caddell, *Metal
 * Forming*, ch. 6), and every other term is ≥ 0, so σd is never below the ideal work.
 *
 * Units: Ȳ in MPa, ε true (dimensionless), α in radians, μ dimensionless; result MPa.
 * Valid range: Ȳ ≥ 0, 0 ≤ ε ≤ 5, 0 ≤ α ≤ π/4 (the form is meant for the usual 2°–15°), 0 ≤ μ ≤ 0.5;
 * α = 0 only with μ = 0 (the friction term grows without bound as α → 0).
 * @throws InputError naming the parameter for a value outside its range.
 * @example drawingStress(400, Math.log(1 / 0.8), 6 * Math.PI / 180, 0.05).stress // 400·(1.4775·0.22314 + 0.06981) ≈ 159.8
 */
export function drawingStress(meanFlowStress: number, strain: number, dieHalfAngleRad: number, friction: number, path = 'step'): DrawingStress {
  const Y = checkRange(`${path}.meanFlowStress`, meanFlowStress, 0, Infinity);
  const e = checkRange(`${path}.strain`, strain, 0, 5);
  const a = checkRange(`${path}.dieHalfAngleDeg`, dieHalfAngleRad, 0, Math.PI / 4);
  const mu = checkRange(`${path}.friction`, friction, 0, 0.5);
  if (a === 0 && mu > 0) throw new InputError(`${path}.dieHalfAngleDeg`, 0, 'a half-angle above 0 when friction is above 0');
  const ideal = Y * e;
  const fric = mu === 0 ? 0 : Y * (mu / a) * e;
  const redundant = Y * (2 / 3) * a;
  return { stress: ideal + fric + redundant, ideal, friction: fric, redundant };
}
