import { brent } from '../numeric/brent.js';
import { checkRange, ComputationError } from '../errors.js';
import type { FlowLaw } from '../flow/types.js';
import { chordModulus, type ModulusDecay } from '../material/modulus.js';
import { isotropicPart, validateKinematic } from '../path/hardening.js';
import type { KinematicSpec } from '../path/types.js';

/** √3/2: plane-strain factor between equivalent and major stress and strain (σ̄ = (√3/2)σ1, ε̄ = (2/√3)ε1). */
const R32 = Math.sqrt(3) / 2;

/**
 * A strip in bending: the material and the state the ledger carries into the bend.
 * Units: MPa, mm. The state is taken as uniform through the thickness and stress-free.
 */
export interface BendSection {
  /** Young's modulus of the annealed material, MPa. */
  elasticModulus: number;
  /** Poisson's ratio ν in [0, 0.5). */
  poissonRatio: number;
  law: FlowLaw;
  kinematic?: KinematicSpec;
  modulusDecay?: ModulusDecay;
  /** Strip thickness, mm. */
  thickness: number;
  /** Accumulated equivalent plastic strain before the bend (the ledger's ε̄), default 0. */
  prestrain?: number;
  /** Backstresses before the bend, one per kinematic term, MPa, signed in the route's forward direction. */
  backstresses?: readonly number[];
  /** True when the bend's outer (tension) side is loaded against the forward direction (reverse bending). */
  reverse?: boolean;
}

/** A validated section with its fibre law ready (internal to the bend module). */
export interface FibreModel {
  t: number;
  nu: number;
  p0: number;
  /** Outer-side absolute direction: +1, or −1 for a reverse bend. */
  D: 1 | -1;
  /** Plane-strain modulus E'(p) = E(p)/(1 − ν²), MPa. */
  Eps: (p: number) => number;
  /** Elastic-limit strain magnitude of a fibre loaded in absolute direction d. */
  elasticLimit: (d: 1 | -1) => number;
  /** Fibre response to strain magnitude a ≥ 0 in absolute direction d: major stress magnitude (along d) and equivalent plastic strain. */
  fibre: (a: number, d: 1 | -1) => { stress: number; q: number };
  /** Reverse-yield check after unloading: true if the residual major stress (signed along d) reaches reverse yield. */
  reverseYields: (residual: number, q: number, d: 1 | -1) => boolean;
}

/**
 * Builds the plane-strain fibre model of a strip in bending (internal; see {@link momentCurvature}).
 * A fibre at strain magnitude a in absolute direction d: σ1 = E'(p)·(a − (√3/2)q) with q its equivalent
 * plastic strain, yielding when (√3/2)σ1 = d·ΣXᵢ(q) + R(p0 + q) (von Mises in plane strain:
 * σ1 = (2/√3)·σ̄, ε1p = (√3/2)·ε̄p; Marciniak, Duncan & Hu, *Mechanics of Sheet Metal Forming*, §3.4, §6.2),
 * Xᵢ advanced in closed form from the prior backstress, R from {@link isotropicPart}.
 * @throws InputError naming `thickness`, `poissonRatio`, `prestrain` or the kinematic data.
 */
export function fibreModel(s: BendSection, path = 'bend'): FibreModel {
  const t = checkRange(`${path}.thickness`, s.thickness, 0, 1e4, { loOpen: true });
  const nu = checkRange(`${path}.poissonRatio`, s.poissonRatio, 0, 0.5, { hiOpen: true });
  const E0 = checkRange(`${path}.elasticModulus`, s.elasticModulus, 0, 1e7, { loOpen: true });
  const p0 = s.prestrain === undefined ? 0 : checkRange(`${path}.prestrain`, s.prestrain, 0, 10);
  const kin = s.kinematic ? validateKinematic(s.kinematic, `${path}.kinematic`) : undefined;
  const iso = isotropicPart(s.law, kin, `${path}.kinematic`);
  const bs = kin?.backstresses ?? [];
  const X0 = bs.map((_, i) => {
    const v = s.backstresses?.[i] ?? 0;
    return checkRange(`${path}.backstresses[${i}]`, v, -1e6, 1e6);
  });
  const D: 1 | -1 = s.reverse ? -1 : 1;
  const Eps = (p: number) => chordModulus(E0, s.modulusDecay, p) / (1 - nu * nu);
  const Xd = (q: number, d: 1 | -1): number => {
    let sum = 0;
    for (let i = 0; i < bs.length; i++) {
      const sat = bs[i]!.C / bs[i]!.gamma;
      sum += sat + (d * X0[i]! - sat) * Math.exp(-bs[i]!.gamma * q);
    }
    return sum;
  };
  const E0ps = Eps(p0);
  const R0 = iso.size(p0);
  const elasticLimit = (d: 1 | -1) => Math.max(0, (Xd(0, d) + R0) / (R32 * E0ps));
  const fibre = (a: number, d: 1 | -1) => {
    const h = (q: number) => R32 * Eps(p0 + q) * (a - R32 * q) - Xd(q, d) - iso.size(p0 + q);
    if (h(0) <= 0) return { stress: E0ps * a, q: 0 };
    const qmax = a / R32;
    if (h(qmax) > 0) throw new ComputationError(path, `a fibre strained ${a} cannot reach its yield surface; check the kinematic data`);
    const r = brent(h, 0, qmax, 1e-15 * Math.max(1, qmax), 200);
    if (!r.converged) throw new ComputationError(path, `fibre solve did not converge at strain ${a} (residual ${r.residual})`);
    const q = r.root;
    return { stress: Eps(p0 + q) * (a - R32 * q), q };
  };
  const reverseYields = (residual: number, q: number, d: 1 | -1) => R32 * residual < Xd(q, d) - iso.size(p0 + q) - 1e-9 * (R0 + 1);
  return { t, nu, p0, D, Eps, elasticLimit, fibre, reverseYields };
}
