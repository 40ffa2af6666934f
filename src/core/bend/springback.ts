import { checkRange } from '../errors.js';
import { fibreStressAt, momentOf, throughThickness, type MomentResult } from './momentCurvature.js';
import { fibreModel, type BendSection, type FibreModel } from './section.js';

/** A bend on a tool: inner radius of the tool (the part's inner surface), mm, and bend angle, degrees. */
export interface BendTool {
  /** Inner bend radius on the tool (die or punch radius), mm; > 0. */
  radius: number;
  /** Bend angle on the tool (the angle the strip turns through), degrees, in (0, 180]. */
  angleDeg: number;
}

/** Result of a bend and its elastic unloading (MPa, mm, degrees). */
export interface SpringbackResult extends MomentResult {
  /** Inner radius after springback, mm; null when the strip springs back flat (no plastic bending). */
  finalRadius: number | null;
  /** Bend angle after springback, degrees. */
  finalAngleDeg: number;
  /** Springback angle, tool angle − final angle, degrees. */
  springbackDeg: number;
  /** Curvature ratio κf/κ = ρ/ρf of the mid-surface (Ri/Rf in Marciniak, Duncan & Hu). */
  curvatureRatio: number;
  /** Residual stress through the thickness after unloading: y from −t/2 (inner) to t/2 (outer), mm; stress MPa (major, plane strain). */
  residualStress: Array<{ y: number; stress: number }>;
  /** True if the residual stress reaches reverse yield somewhere (unloading is then not purely elastic and springback is somewhat overstated). */
  reverseYield: boolean;
}

/** Number of points of the residual-stress profile. */
export const RESIDUAL_POINTS = 41;

/**
 * Bend to a tool radius and angle, then unload elastically: springback, final radius and angle,
 * residual stress through the thickness.
 *
 * Loading: {@link momentCurvature} at the mid-surface radius ρ = Ri + t/2. Unloading: elastic with
 * each fibre's chord modulus E'(p) = E(p)/(1 − ν²) (p its accumulated plastic strain), strain change
 * Δε = Δa + Δκ·y with the force change zero and the moment change −M:
 * Δa·A0 + Δκ·A1 = 0, Δa·A1 + Δκ·A2 = −M, Aₖ = ∫E'·yᵏ dy. Final curvature κf = 1/ρ + Δκ; the mid-surface
 * length is kept, so θf = θ·κf·ρ; final inner radius 1/κf − t/2. Residual stress σ + E'·(Δa + Δκ·y).
 * For an elastic–perfectly-plastic strip with uniform E' this is Ri/Rf = ρ/ρf = 4X³ − 3X + 1,
 * X = S·ρ/(E'·t) (radii to mid-thickness; E' plane-strain modulus; S = (2/√3)σy plane-strain flow
 * stress), and the outer-fibre residual stress after a nearly fully plastic bend is −S/2
 * (Marciniak, Duncan & Hu, *Mechanics of Sheet Metal Forming*, 2002, §6.6).
 * Units: MPa, mm, degrees. Valid range: Ri > 0 (thin-bending theory, best for Ri/t ≳ 2), 0 < θ ≤ 180°.
 * @throws InputError naming `path.radius`, `path.angle` or a section field.
 * @example springback(section, { radius: 5, angleDeg: 90 }).finalAngleDeg // < 90
 */
export function springback(section: BendSection, tool: BendTool, path = 'bend'): SpringbackResult {
  const m = fibreModel(section, path);
  return springbackOf(m, tool, path);
}

/** Springback for a built fibre model (shared with the inverse solvers). */
export function springbackOf(m: FibreModel, tool: BendTool, path = 'bend'): SpringbackResult {
  const Ri = checkRange(`${path}.radius`, tool.radius, 0, 1e9, { loOpen: true });
  const theta = checkRange(`${path}.angle`, tool.angleDeg, 0, 180, { loOpen: true });
  const rho = Ri + m.t / 2;
  const kappa = 1 / rho;
  const mr = momentOf(m, rho);
  const { y0 } = mr;
  const Eu = (y: number) => m.Eps(m.p0 + fibreStressAt(m, y, y0, kappa).q);
  const A0 = throughThickness(m, y0, kappa, Eu);
  const A1 = throughThickness(m, y0, kappa, (y) => Eu(y) * y);
  const A2 = throughThickness(m, y0, kappa, (y) => Eu(y) * y * y);
  const det = A0 * A2 - A1 * A1;
  const dk = (-mr.moment * A0) / det;
  const da = (-dk * A1) / A0;
  const kf = Math.max(0, kappa + dk);
  // A strip bent only elastically springs back flat; round-off can leave a curvature of ~1e-16·κ.
  const flat = kf <= 1e-12 * kappa;
  const ratio = flat ? 0 : kf / kappa;
  const finalAngleDeg = theta * ratio;
  const residualStress: Array<{ y: number; stress: number }> = [];
  let reverseYield = false;
  for (let k = 0; k < RESIDUAL_POINTS; k++) {
    const y = -m.t / 2 + (m.t * k) / (RESIDUAL_POINTS - 1);
    const f = fibreStressAt(m, y, y0, kappa);
    const res = f.stress + m.Eps(m.p0 + f.q) * (da + dk * y);
    // Along the fibre's own loading direction (the bend frame's sign flips on the inner side).
    const along = y - y0 >= 0 ? res : -res;
    if (f.q > 0 && m.reverseYields(along, f.q, f.d)) reverseYield = true;
    residualStress.push({ y, stress: res });
  }
  return {
    moment: mr.moment,
    neutralShift: mr.neutralShift,
    outerFibreStrain: mr.outerFibreStrain,
    outerFibrePlasticStrain: mr.outerFibrePlasticStrain,
    finalRadius: flat ? null : 1 / kf - m.t / 2,
    finalAngleDeg,
    springbackDeg: theta - finalAngleDeg,
    curvatureRatio: ratio,
    residualStress,
    reverseYield,
  };
}
