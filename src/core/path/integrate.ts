import { checkRange, ComputationError, InputError } from '../errors.js';
import { chordModulus } from '../material/modulus.js';
import { isotropicPart, validateKinematic } from './hardening.js';
import type { PathMaterial, PathOptions, PathPoint, PathResult } from './types.js';

/** Defaults of {@link integratePath}, stated once. */
export const PATH_DEFAULTS = Object.freeze({
  /** Largest total-strain increment between output points (dimensionless). */
  maxIncrement: 2.5e-4,
  /** Relative tolerance of the consistency condition (residual / yield-surface size). */
  tolerance: 1e-11,
  /** Largest |total strain| a history may reach. */
  maxStrain: 2,
  /** Largest number of increments of one integration (memory guard). */
  maxIncrements: 5_000_000,
});

const MAX_NEWTON = 100;

/** A resumable 1-D integrator: its state, and `to(ε)` taking one increment to total strain ε. */
export interface PathStepper {
  /** Current total strain, stress (MPa), plastic strain, accumulated plastic strain. */
  readonly state: { strain: number; stress: number; plasticStrain: number; accumulated: number };
  /** Backstresses, MPa (one per Armstrong–Frederick term). */
  readonly backstresses: Float64Array;
  /** One strain-driven increment to total strain `eps` (no reversal inside the increment); returns the Newton iterations used (0 = elastic). */
  to(eps: number): number;
  /** Current yield-surface size R(p), MPa. */
  surfaceSize(): number;
  /** Current elastic modulus E(p), MPa. */
  modulus(): number;
  /** Largest relative residual and iteration count so far, and whether every increment converged. */
  readonly stats: { converged: boolean; iterations: number; residual: number };
}

/**
 * Creates a strain-driven 1-D return-mapping integrator for combined isotropic–kinematic hardening.
 *
 * Model (1-D, small strain, rate-independent): σ = E(p)·(ε − εp); yield function f = |σ − X| − R(p) with
 * X = ΣXᵢ; flow dεp = s·dp, s = sign(σ − X); Armstrong–Frederick dXᵢ = Cᵢ·dεp − γᵢ·Xᵢ·dp; R(p) from
 * {@link isotropicPart}; E(p) = E0 − (E0 − Ea)(1 − exp(−ξp)) ({@link chordModulus}).
 * Update: elastic predictor σ* = E(p)(ε − εp); if |σ* − X| > R(p), the plastic corrector finds Δp from
 * the consistency condition s·(σ(Δp) − X(Δp)) − R(p + Δp) = 0 by Newton's method safeguarded by a
 * bracket (bisection when a Newton step leaves it). Within an increment the direction s is fixed, so
 * each backstress is advanced with the exact solution Xᵢ = s·Cᵢ/γᵢ + (Xᵢ⁰ − s·Cᵢ/γᵢ)·exp(−γᵢΔp)
 * (an exponential integrator) rather than backward Euler: for piecewise-monotonic histories the
 * update is then exact up to the Newton tolerance, whatever the increment.
 *
 * Source: J. C. Simo and T. J. R. Hughes, *Computational Inelasticity* (Springer 1998), §1.4 (1-D
 * return mapping with combined hardening); Armstrong & Frederick (1966); Chaboche (1986); chord
 * modulus after Yoshida & Uemori (2002).
 * Units: MPa, dimensionless true strain. Valid range: |ε| ≤ 2; one reversal per increment at most
 * (callers split histories at their turning points, as {@link integratePath} does).
 * @throws InputError for bad material data (path `material.*`).
 * @example const s = createPathStepper(m); s.to(0.001); s.state.stress
 */
export function createPathStepper(material: PathMaterial, opts: PathOptions = {}): PathStepper {
  const E0 = checkRange('material.elasticModulus', material.elasticModulus, 0, 1e7, { loOpen: true });
  const tol = opts.tolerance === undefined ? PATH_DEFAULTS.tolerance : checkRange('tolerance', opts.tolerance, 1e-15, 1e-3);
  const kin = material.kinematic ? validateKinematic(material.kinematic, 'material.kinematic') : undefined;
  const iso = isotropicPart(material.law, kin, 'material.kinematic');
  const size = iso.size;
  const slope = iso.slope;
  const lawStress = material.law.stress;
  const lawSlope = material.law.slope;
  const decay = material.modulusDecay;
  const Ea = decay ? decay.Ea : E0;
  const xi = decay ? decay.xi : 0;
  const n = kin ? kin.backstresses.length : 0;
  const C = new Float64Array(n);
  const G = new Float64Array(n);
  const SAT = new Float64Array(n);
  for (let i = 0; i < n; i++) { C[i] = kin!.backstresses[i]!.C; G[i] = kin!.backstresses[i]!.gamma; SAT[i] = C[i]! / G[i]!; }
  const X = new Float64Array(n);
  // Created with non-integer values so V8 gives the fields a double representation from the start
  // (then reset to 0): writing a double into a field that began as a small integer boxes it on every
  // increment, which showed up as garbage-collection time in bench/integrator.mjs.
  const st = { strain: 0.5, stress: 0.5, plasticStrain: 0.5, accumulated: 0.5 };
  st.strain = 0; st.stress = 0; st.plasticStrain = 0; st.accumulated = 0;
  const stats = { converged: true, iterations: 0, residual: 0.5 };
  stats.residual = 0;
  const Eof = decay ? (p: number) => chordModulus(E0, decay, p) : () => E0;
  const dEof = decay ? (p: number) => -(E0 - Ea) * xi * Math.exp(-xi * p) : () => 0;

  // Scratch of the current plastic corrector, kept outside `to` so no closure is allocated per increment.
  let cp = 0;
  let cde = 0;
  let cs: 1 | -1 = 1;
  let g = 0;
  let dg = 0;
  // exp(−γᵢ·p) at the start of the increment: R(p + dp) needs exp(−γᵢ(p + dp)) = EG[i]·exp(−γᵢ·dp), and
  // exp(−γᵢ·dp) is already needed for the backstress, so each evaluation costs one exponential per
  // backstress instead of three (R(p) = σ(p) − Σ(Cᵢ/γᵢ)(1 − exp(−γᵢp)), see hardening.ts).
  const EG = new Float64Array(n);
  // g(dp) = s·(σ − ΣX) − R, decreasing in dp; g(0) = f > 0. dg its derivative.
  function evalG(dp: number): void {
    const pe = cp + dp;
    const Ee = Eof(pe);
    const el = cde - cs * dp;
    let sx = 0;
    let dsx = 0;
    let rk = 0;
    let drk = 0;
    for (let i = 0; i < n; i++) {
      const sat = cs * SAT[i]!;
      const ex = Math.exp(-G[i]! * dp);
      sx += sat + (X[i]! - sat) * ex;
      dsx -= G[i]! * (X[i]! - sat) * ex;
      const e = EG[i]! * ex;
      rk += SAT[i]! * (1 - e);
      drk += C[i]! * e;
    }
    g = cs * (Ee * el - sx) - (lawStress(pe) - rk);
    dg = cs * dEof(pe) * el - Ee - cs * dsx - (lawSlope(pe) - drk);
  }

  function to(e1: number): number {
    const p = st.accumulated;
    const ep = st.plasticStrain;
    const Ep = Eof(p);
    const trial = Ep * (e1 - ep);
    let xs = 0;
    for (let i = 0; i < n; i++) xs += X[i]!;
    const xiTr = trial - xs;
    const R0 = size(p);
    const f = Math.abs(xiTr) - R0;
    const scale = R0 + Math.abs(xs) + 1;
    st.strain = e1;
    if (f <= tol * scale) {
      st.stress = trial;
      return 0;
    }
    const s: 1 | -1 = xiTr > 0 ? 1 : -1;
    for (let i = 0; i < n; i++) EG[i] = Math.exp(-G[i]! * p);
    cp = p;
    cde = e1 - ep;
    cs = s;
    let lo = 0;
    let hi = f / Ep;
    evalG(hi);
    let expand = 0;
    while (g > 0) {
      lo = hi;
      hi *= 2;
      if (++expand > 60) throw new ComputationError('path', `no plastic strain restores consistency at strain ${e1}; the hardening data give a yield surface that cannot be reached`);
      evalG(hi);
    }
    let hk = 0;
    for (let i = 0; i < n; i++) hk += C[i]! - G[i]! * s * X[i]!;
    let dp = Math.min(Math.max(f / (Ep + Math.max(0, slope(p + 1e-12)) + Math.max(0, hk)), lo), hi);
    if (!(dp > lo && dp < hi)) dp = 0.5 * (lo + hi);
    let it = 0;
    let ok = false;
    for (; it < MAX_NEWTON; it++) {
      evalG(dp);
      if (Math.abs(g) <= tol * scale) { ok = true; break; }
      if (g > 0) lo = dp; else hi = dp;
      if (hi - lo <= 4e-16 * hi) { ok = true; break; }
      let next = dp - g / dg;
      if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
      dp = next;
    }
    const res = Math.abs(g) / scale;
    if (!ok) stats.converged = false;
    if (it + 1 > stats.iterations) stats.iterations = it + 1;
    if (res > stats.residual) stats.residual = res;
    for (let i = 0; i < n; i++) {
      const sat = s * SAT[i]!;
      X[i] = sat + (X[i]! - sat) * Math.exp(-G[i]! * dp);
    }
    st.plasticStrain = ep + s * dp;
    st.accumulated = p + dp;
    st.stress = Eof(p + dp) * (e1 - st.plasticStrain);
    return it + 1;
  }

  return {
    state: st,
    backstresses: X,
    to,
    surfaceSize: () => size(st.accumulated),
    modulus: () => Eof(st.accumulated),
    stats,
  };
}

/**
 * Integrates a strain history: starting from the annealed, stress-free state at ε = 0, the total
 * strain goes to each entry of `history` in turn (straight segments), in increments of at most
 * `maxIncrement`, with {@link createPathStepper}'s return mapping. Returns every increment's point:
 * strain, stress, plastic strain, accumulated plastic strain, summed backstress, yield-surface size and
 * modulus. Loading, unloading, reloading, reversal and cycles are all just histories.
 *
 * Source: see {@link createPathStepper}. Units: MPa, true strain.
 * Valid range: entries finite with |ε| ≤ 2; maxIncrement in [1e-7, 0.05].
 * @throws InputError naming `history[i]` or `maxIncrement`.
 * @example integratePath(m, [0.02, 0, -0.02]).points.at(-1).stress // compressive flow stress, MPa
 */
export function integratePath(material: PathMaterial, history: readonly number[], opts: PathOptions = {}): PathResult {
  const h = opts.maxIncrement === undefined ? PATH_DEFAULTS.maxIncrement : checkRange('maxIncrement', opts.maxIncrement, 1e-7, 0.05);
  if (!Array.isArray(history) || history.length === 0) throw new InputError('history', history, 'a list of at least one total strain');
  let total = 0;
  let prev = 0;
  for (let i = 0; i < history.length; i++) {
    const e = checkRange(`history[${i}]`, history[i], -PATH_DEFAULTS.maxStrain, PATH_DEFAULTS.maxStrain);
    total += Math.ceil(Math.abs(e - prev) / h);
    prev = e;
  }
  if (total > PATH_DEFAULTS.maxIncrements) throw new InputError('maxIncrement', h, `an increment giving at most ${PATH_DEFAULTS.maxIncrements} increments for this history`, `${total} increments needed`);
  const stepper = createPathStepper(material, opts);
  const points: PathPoint[] = [];
  const snap = (): void => {
    let xs = 0;
    for (let i = 0; i < stepper.backstresses.length; i++) xs += stepper.backstresses[i]!;
    const s = stepper.state;
    points.push({
      strain: s.strain, stress: s.stress, plasticStrain: s.plasticStrain, accumulatedPlasticStrain: s.accumulated,
      backstress: xs, yieldSurfaceSize: stepper.surfaceSize(), modulus: stepper.modulus(),
    });
  };
  snap();
  let from = 0;
  let count = 0;
  for (let i = 0; i < history.length; i++) {
    const target = history[i]!;
    const k = Math.ceil(Math.abs(target - from) / h);
    for (let j = 1; j <= k; j++) {
      stepper.to(j === k ? target : from + ((target - from) * j) / k);
      snap();
      count++;
    }
    from = target;
  }
  for (const pt of points) {
    if (!Number.isFinite(pt.stress + pt.plasticStrain + pt.backstress + pt.yieldSurfaceSize)) {
      throw new ComputationError('path', `not a finite number at strain ${pt.strain}; check the material data`);
    }
  }
  return { points, converged: stepper.stats.converged, iterations: stepper.stats.iterations, residual: stepper.stats.residual, increments: count };
}
