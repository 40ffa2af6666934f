import { checkRange, InputError } from '../errors.js';
import { levenbergMarquardt } from '../fit/levenbergMarquardt.js';
import { fitStatistics } from '../fit/fitStatistics.js';
import type { FitQuality, FitWarning } from '../fit/types.js';
import { createPathStepper } from './integrate.js';
import type { Backstress, KinematicSpec, PathMaterial } from './types.js';

/** Options of {@link fitKinematic}. */
export interface KinematicFitOptions {
  /** Number of backstresses to fit, 1 to 3; default 1. */
  backstresses?: number;
  /** Start values; default from the record (see {@link fitKinematic}). */
  start?: readonly Backstress[];
  /** Most Levenberg–Marquardt iterations per start. */
  maxIterations?: number;
}

/** Kinematic parameters fitted to a record, with the same statistics as a law fit. */
export interface KinematicFit extends FitQuality {
  kinematic: KinematicSpec;
  /** Standard error of each C and γ (null on a bound or not identifiable), in the order of `kinematic.backstresses`. */
  standardErrors: Array<{ C: number | null; gamma: number | null }>;
  intervals95: Array<{ C: [number, number] | null; gamma: [number, number] | null }>;
}

/** The one place the fitter's bounds live: C in MPa, γ dimensionless. */
export const KINEMATIC_FIT_BOUNDS = Object.freeze({ C: [1, 1e7] as const, gamma: [0.1, 1e4] as const });

/** Predicted stress at every record point: the integrator driven through the record's total strains. */
function simulate(m: PathMaterial, strain: ArrayLike<number>, p: Float64Array): Float64Array | null {
  const backstresses: Backstress[] = [];
  for (let i = 0; i < p.length; i += 2) backstresses.push({ C: p[i]!, gamma: p[i + 1]! });
  let stepper;
  try {
    stepper = createPathStepper({ ...m, kinematic: { backstresses } });
  } catch {
    return null; // backstresses above the flow curve: outside the model's domain
  }
  const out = new Float64Array(strain.length);
  for (let i = 0; i < strain.length; i++) {
    if (strain[i]! !== stepper.state.strain) stepper.to(strain[i]!);
    out[i] = stepper.state.stress;
  }
  return stepper.stats.converged ? out : null;
}

/**
 * Fits Armstrong–Frederick backstresses (C, γ per term) to a record with a reversal or with
 * tension–compression loops, the flow curve (the monotonic response) and E being known.
 *
 * Model: the 1-D return mapping of {@link createPathStepper} driven through the record's total strains
 * from the annealed state, the flow curve split into yield-surface size and backstresses
 * ({@link isotropicPart}); least squares on stress, Σ(σ_model − σ_record)², by the core's bounded
 * Levenberg–Marquardt solver with the statistics of the law fits ({@link fitStatistics}: RMSE, R²,
 * AIC, BIC, standard errors, 95 % intervals). Several starts (recall rates 10, 100 and 1000 per
 * term, saturations C/γ sharing 40 % of the flow stress at the largest strain) — the lowest cost wins.
 * Monotonic data carry no information on the split (the flow curve is kept whatever C and γ), so a
 * record must unload past reverse yield at least once.
 *
 * Sources: Armstrong & Frederick (1966); Chaboche (1986); fitting kinematic parameters to a reversal
 * by least squares as in Yoshida & Uemori (2002) (from memory). Units: strain dimensionless (total
 * true strain), stress and C in MPa, γ dimensionless. Valid: ≥ 2·k + 2 points, strains |ε| ≤ 2.
 * @throws InputError naming `strain[i]`, `stress[i]` or `record` (no reversal).
 * @example fitKinematic(m, strain, stress).kinematic.backstresses[0] // { C, gamma }
 */
export function fitKinematic(material: PathMaterial, strain: ArrayLike<number>, stress: ArrayLike<number>, opts: KinematicFitOptions = {}): KinematicFit {
  const nb = opts.backstresses === undefined ? 1 : checkRange('backstresses', opts.backstresses, 1, 3);
  if (!Number.isInteger(nb)) throw new InputError('backstresses', nb, 'a whole number 1, 2 or 3');
  const n = strain.length;
  const k = 2 * nb;
  if (stress.length !== n) throw new InputError('stress', stress.length, `as many values as strain (${n})`);
  if (n < k + 2) throw new InputError('record', n, `at least ${k + 2} points to fit ${nb} backstress(es)`);
  let reversed = false;
  let maxAbs = 0;
  let lastDir = 0;
  let prev = 0;
  for (let i = 0; i < n; i++) {
    checkRange(`strain[${i}]`, strain[i], -2, 2);
    checkRange(`stress[${i}]`, stress[i], -1e5, 1e5);
    const d = Math.sign(strain[i]! - prev);
    if (d !== 0) {
      if (lastDir !== 0 && d !== lastDir) reversed = true;
      lastDir = d;
    }
    prev = strain[i]!;
    maxAbs = Math.max(maxAbs, Math.abs(strain[i]!));
  }
  if (!reversed) throw new InputError('record', 'monotonic strains', 'a record with at least one unloading or reversal (monotonic data do not determine backstresses)');
  const lower: number[] = [];
  const upper: number[] = [];
  for (let j = 0; j < nb; j++) { lower.push(KINEMATIC_FIT_BOUNDS.C[0], KINEMATIC_FIT_BOUNDS.gamma[0]); upper.push(KINEMATIC_FIT_BOUNDS.C[1], KINEMATIC_FIT_BOUNDS.gamma[1]); }
  const sTop = material.law.stress(Math.min(maxAbs, 2));
  const starts: number[][] = [];
  if (opts.start) {
    if (opts.start.length !== nb) throw new InputError('start', opts.start.length, `${nb} start backstresses`);
    starts.push(opts.start.flatMap((b) => [b.C, b.gamma]));
  } else {
    for (const g0 of [10, 100, 1000]) {
      const s: number[] = [];
      for (let j = 0; j < nb; j++) {
        const g = g0 * Math.pow(10, j) > 1e4 ? g0 / Math.pow(10, j) : g0 * Math.pow(10, j);
        s.push(((0.4 * sTop) / nb) * g, g);
      }
      starts.push(s);
    }
  }
  const model = (p: Float64Array) => simulate(material, strain, p);
  let best: ReturnType<typeof levenbergMarquardt> | null = null;
  let iterations = 0;
  for (const s0 of starts) {
    const s = s0.map((v, j) => Math.min(upper[j]!, Math.max(lower[j]!, v)));
    if (model(Float64Array.from(s)) === null) continue;
    const r = levenbergMarquardt(model, stress, s, { lower, upper, ...(opts.maxIterations !== undefined ? { maxIterations: opts.maxIterations } : {}) });
    iterations += r.iterations;
    if (!best || r.residual < best.residual) best = r;
  }
  if (!best) throw new InputError('record', 'no valid start', 'a flow curve high enough to leave room for a backstress (R(p) > 0)');
  const residuals = Array.from(best.predicted, (v, i) => v - stress[i]!);
  const st = fitStatistics(best.jacobian, residuals, stress, k, best.atBound, best.params);
  const warnings: FitWarning[] = [];
  if (!best.converged) warnings.push({ code: 'notConverged', message: `kinematic fit did not converge (${best.reason})` });
  if (st.singular) warnings.push({ code: 'notIdentifiable', message: `the record does not determine all ${k} kinematic parameters (singular information matrix)` });
  const backstresses: Backstress[] = [];
  const standardErrors: KinematicFit['standardErrors'] = [];
  const intervals95: KinematicFit['intervals95'] = [];
  for (let j = 0; j < nb; j++) {
    backstresses.push({ C: best.params[2 * j]!, gamma: best.params[2 * j + 1]! });
    standardErrors.push({ C: st.standardErrors[2 * j]!, gamma: st.standardErrors[2 * j + 1]! });
    intervals95.push({ C: st.intervals95[2 * j]!, gamma: st.intervals95[2 * j + 1]! });
    if (best.atBound[2 * j] || best.atBound[2 * j + 1]) warnings.push({ code: 'atBound', message: `backstress ${j + 1} ended on a bound (C ${best.params[2 * j]}, γ ${best.params[2 * j + 1]})` });
  }
  return {
    kinematic: { backstresses }, standardErrors, intervals95,
    rmse: st.rmse, r2: st.r2, aic: st.aic, bic: st.bic, residuals,
    converged: best.converged, iterations, points: n, warnings,
  };
}
