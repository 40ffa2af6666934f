import { brent, type RootResult } from '../numeric/brent.js';
import { checkRange, ComputationError, InputError } from '../errors.js';
import { fibreModel, type BendSection } from './section.js';
import { springbackOf } from './springback.js';

/** Tool setting found by an inverse springback solve, with the solver's report. */
export interface OverbendResult {
  /** Tool (overbend) angle, degrees. */
  toolAngleDeg: number;
  /** Tool inner radius, mm. */
  toolRadius: number;
  /** Final angle and inner radius the part has after springback at that setting. */
  finalAngleDeg: number;
  finalRadius: number | null;
  converged: boolean;
  iterations: number;
  /** |final − wanted| in the solved quantity (degrees or mm). */
  residual: number;
}

/**
 * Tool angle to overbend to, on a given tool radius, so that the part ends at a wanted angle.
 * The curvature ratio κf/κ does not depend on the angle (thin-bending theory, Marciniak, Duncan & Hu
 * §6.6), so θ_tool = θ_wanted·κ/κf in closed form (no iteration).
 * Units: mm, degrees. Valid range: wanted angle in (0, 180]; the tool angle must stay ≤ 180°.
 * @throws InputError when the strip would spring back flat (no plastic bending at this radius) or the
 * overbend exceeds 180°.
 * @example overbendAngle(section, { radius: 5, finalAngleDeg: 90 }).toolAngleDeg // > 90
 */
export function overbendAngle(section: BendSection, want: { radius: number; finalAngleDeg: number }, path = 'bend'): OverbendResult {
  const m = fibreModel(section, path);
  const wanted = checkRange(`${path}.finalAngle`, want.finalAngleDeg, 0, 180, { loOpen: true });
  const probe = springbackOf(m, { radius: want.radius, angleDeg: 90 }, path);
  if (probe.curvatureRatio <= 0) throw new InputError(`${path}.radius`, want.radius, 'a tool radius small enough to bend the strip plastically', 'the strip springs back flat at this radius');
  const tool = wanted / probe.curvatureRatio;
  if (tool > 180) throw new InputError(`${path}.finalAngle`, wanted, `an angle at most ${(180 * probe.curvatureRatio).toFixed(2)}° at this radius`, `the tool would have to bend to ${tool.toFixed(2)}°`);
  const check = springbackOf(m, { radius: want.radius, angleDeg: tool }, path);
  return { toolAngleDeg: tool, toolRadius: want.radius, finalAngleDeg: check.finalAngleDeg, finalRadius: check.finalRadius, converged: true, iterations: 0, residual: Math.abs(check.finalAngleDeg - wanted) };
}

/**
 * Tool inner radius to bend on, at a given tool angle, so that the part ends at a wanted inner radius.
 * Solves finalRadius(R_tool) = R_wanted with Brent's method on R_tool in (0, R_wanted] (springback only
 * opens a bend, so the tool radius is smaller than the wanted one).
 * Units: mm, degrees. Valid range: wanted radius > 0.
 * @throws InputError when no tool radius above 1e-3·t reaches the wanted radius.
 * @example overbendRadius(section, { angleDeg: 90, finalRadius: 10 }).toolRadius // < 10
 */
export function overbendRadius(section: BendSection, want: { angleDeg: number; finalRadius: number }, path = 'bend'): OverbendResult {
  const m = fibreModel(section, path);
  const wanted = checkRange(`${path}.finalRadius`, want.finalRadius, 0, 1e9, { loOpen: true });
  const f = (R: number): number => {
    const r = springbackOf(m, { radius: R, angleDeg: want.angleDeg }, path);
    return (r.finalRadius === null ? 1e12 : r.finalRadius) - wanted;
  };
  const lo = 1e-3 * m.t;
  if (f(lo) > 0) throw new InputError(`${path}.finalRadius`, wanted, `a radius at least the one a tool radius of ${lo} mm gives`, 'no tool radius reaches it');
  let res: RootResult;
  try {
    res = brent(f, lo, wanted, 1e-12 * wanted, 200);
  } catch (e) {
    throw new ComputationError(path, `tool radius search failed: ${(e as Error).message}`);
  }
  const r = springbackOf(m, { radius: res.root, angleDeg: want.angleDeg }, path);
  return { toolAngleDeg: want.angleDeg, toolRadius: res.root, finalAngleDeg: r.finalAngleDeg, finalRadius: r.finalRadius, converged: res.converged, iterations: res.iterations, residual: res.residual };
}
