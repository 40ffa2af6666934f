import { ComputationError } from '../errors.js';
import type { FlowLaw } from '../flow/types.js';
import { brent } from '../numeric/brent.js';
import type { RootResult } from '../numeric/brent.js';
import { drawingStress } from './drawingStress.js';

/** Largest pass strain searched, true strain (area reduction 1 − e^−10). */
const SEARCH_LIMIT = 10;

/** The largest pass a wire can take, and how the solver got there. */
export interface MaxDrawReduction extends RootResult {
  /** Largest pass strain ln(A0/A1), true. */
  strain: number;
  /** The same as area reduction, percent: 100·(1 − e^−strain). */
  areaReductionPct: number;
}

/**
 * Largest single-pass area reduction of a drawing pass: the pass strain ε at which the drawing
 * stress (Siebel form, {@link drawingStress}) equals the flow stress of the drawn wire at the exit,
 *
 *   Ȳ(ε0, ε)·[(1 + μ/α)·ε + (2/3)·α] = σ(ε0 + ε),   Ȳ = (W(ε0 + ε) − W(ε0))/ε,
 *
 * solved with Brent's method. ε0 is the strain the wire enters with (its work hardening so far).
 * With no friction and no redundant work this gives the classical limits: ε = 1 (63.2 % area
 * reduction) for a non-hardening metal and ε = n + 1 for a Hollomon metal from the annealed state
 * (Hosford & Caddell, *Metal Forming*, ch. 6; Groover, *Fundamentals of Modern Manufacturing*,
 * wire drawing). No safety factor is applied here: it is the physical limit of the pass.
 * Units: strains true; returns percent too. Valid range: ε0 ≥ 0; α, μ as in {@link drawingStress}.
 * @throws ComputationError when no limit lies below a pass strain of 10 (the law softens, e.g.).
 * @example maxDrawReduction(hollomon({ K: 600, n: 0.21 }), 0, 0, 0).areaReductionPct // 100·(1 − e^−1.21) ≈ 70.18
 */
export function maxDrawReduction(law: FlowLaw, entryStrain: number, dieHalfAngleRad: number, friction: number, path = 'step'): MaxDrawReduction {
  const w0 = law.work(entryStrain);
  const s0 = law.stress(entryStrain);
  const f = (e: number): number => {
    const Y = e > 1e-12 ? (law.work(entryStrain + e) - w0) / e : s0;
    return drawingStress(Y, e, dieHalfAngleRad, friction, path).stress - law.stress(entryStrain + e);
  };
  // Start just above zero: a Hollomon law has σ(0) = 0, so f(0) = 0 there without meaning a limit.
  let lo = 1e-9;
  if (f(lo) >= 0) {
    // Redundant work alone already reaches the flow stress (α ≥ 1.5 rad): no pass possible.
    return { strain: 0, areaReductionPct: 0, root: 0, converged: true, iterations: 0, residual: Math.abs(f(lo)) };
  }
  let hi = 0.25;
  while (f(hi) < 0) {
    lo = hi;
    if (hi >= SEARCH_LIMIT) throw new ComputationError(`${path}.maxAreaReductionPct`, `the drawing stress stays below the exit flow stress up to a pass strain of ${SEARCH_LIMIT}`);
    hi = Math.min(hi * 2, SEARCH_LIMIT);
  }
  const r = brent(f, lo, hi, 1e-13);
  if (!r.converged) throw new ComputationError(`${path}.maxAreaReductionPct`, `largest-reduction search did not converge (residual ${r.residual})`);
  return { ...r, strain: r.root, areaReductionPct: -Math.expm1(-r.root) * 100 };
}
