import { brent } from '../numeric/brent.js';
import { integrate } from '../numeric/quadrature.js';
import { checkRange, ComputationError } from '../errors.js';
import { fibreModel, type BendSection, type FibreModel } from './section.js';

/** Bending moment of a strip at one curvature (per unit width). */
export interface MomentResult {
  /** Bending moment per unit width, N·mm/mm (MPa·mm²/mm). */
  moment: number;
  /** Offset of the neutral (zero-strain) surface from mid-thickness towards the outer side, mm. */
  neutralShift: number;
  /** Fibre strain of the outer surface, ε = (t/2 − shift)/ρ (engineering bending strain). */
  outerFibreStrain: number;
  /** Equivalent plastic strain added at the outer surface by the bend. */
  outerFibrePlasticStrain: number;
}

const REL = 1e-11;

/** Stress (bend frame, outer side tension positive) at height y for neutral offset y0 and curvature κ. */
export function fibreStressAt(m: FibreModel, y: number, y0: number, kappa: number): { stress: number; q: number; d: 1 | -1 } {
  const e = (y - y0) * kappa;
  const d: 1 | -1 = e >= 0 ? m.D : (-m.D as 1 | -1);
  const r = m.fibre(Math.abs(e), d);
  return { stress: e >= 0 ? r.stress : -r.stress, q: r.q, d };
}

/** ∫ f over the thickness, split at the elastic–plastic boundaries where the integrand has kinks. */
export function throughThickness(m: FibreModel, y0: number, kappa: number, f: (y: number) => number): number {
  const h = m.t / 2;
  const cuts = [-h, h, y0];
  if (kappa > 0) {
    cuts.push(y0 + m.elasticLimit(m.D) / kappa, y0 - m.elasticLimit(-m.D as 1 | -1) / kappa);
  }
  const pts = [...new Set(cuts.filter((c) => c >= -h && c <= h))].sort((a, b) => a - b);
  let sum = 0;
  for (let i = 1; i < pts.length; i++) {
    const r = integrate(f, pts[i - 1]!, pts[i]!, REL, 1e-14 * (1 + m.t), 400);
    if (!r.converged) throw new ComputationError('bend', `through-thickness integral did not converge (estimate ${r.errorEstimate})`);
    sum += r.value;
  }
  return sum;
}

/**
 * Moment–curvature of a strip bent to a mid-surface radius ρ, by integration through the thickness.
 *
 * M = ∫ σ1(y)·y dy over −t/2 ≤ y ≤ t/2 (per unit width), fibre strain ε1 = (y − y0)/ρ, plane strain
 * (E' = E/(1 − ν²), flow stress S = (2/√3)·σ̄ on the ledger's flow curve from its prestrain), the neutral
 * offset y0 from force balance ∫ σ1 dy = 0 (zero unless a prior backstress makes tension and
 * compression differ). Thin-bending theory: plane sections stay plane, no through-thickness stress,
 * thickness unchanged, strain y/ρ (Marciniak, Duncan & Hu, *Mechanics of Sheet Metal Forming*, 2002,
 * §6.2–6.6). For an elastic–perfectly-plastic strip this gives M = (S·t²/4)·(1 − (4/3)·X²) with
 * X = S·ρ/(E'·t) once yielded, tending to 3/2 of the elastic-limit moment S·t²/6.
 * Units: MPa, mm; moment N·mm per mm width. Valid range: ρ > t/2; best for ρ/t ≳ 2.
 * @throws InputError naming the bad field; ComputationError if an integral or solve fails.
 * @example momentCurvature(section, 20).moment // N·mm/mm
 */
export function momentCurvature(section: BendSection, rho: number, path = 'bend'): MomentResult {
  const m = fibreModel(section, path);
  return momentOf(m, checkRange(`${path}.radius`, rho, m.t / 2, 1e9, { loOpen: true }));
}

/** Moment and neutral offset for a built fibre model (shared by springback). */
export function momentOf(m: FibreModel, rho: number): MomentResult & { y0: number } {
  const kappa = 1 / rho;
  const h = m.t / 2;
  const force = (y0: number) => throughThickness(m, y0, kappa, (y) => fibreStressAt(m, y, y0, kappa).stress);
  let y0 = 0;
  const n0 = force(0);
  const scale = m.fibre(h * kappa, m.D).stress * m.t + 1e-12;
  if (Math.abs(n0) > 1e-10 * scale) {
    const r = brent(force, -h, h, 1e-14 * m.t, 200);
    if (!r.converged) throw new ComputationError('bend', `neutral surface not found (residual ${r.residual})`);
    y0 = r.root;
  }
  const moment = throughThickness(m, y0, kappa, (y) => fibreStressAt(m, y, y0, kappa).stress * y);
  const outer = fibreStressAt(m, h, y0, kappa);
  return { moment, neutralShift: y0, outerFibreStrain: (h - y0) * kappa, outerFibrePlasticStrain: outer.q, y0 };
}
