import { ComputationError, InputError } from '../errors.js';
import { stateProperties } from '../route/state.js';
import type { StepEffect } from '../route/steps.js';
import type { Material, RouteInput } from '../route/types.js';
import { normalSampler } from './normal.js';
import { SCATTER_BLOCK, sampleLaw, sampleStart, stepEffects, type PreparedScatter } from './problem.js';
import { xoshiro128ss } from './rng.js';

/** What one sample gives: the final state's properties (MPa, %) and which targets it meets. */
export interface SampleOutcome {
  reloadYield: number;
  tensileStrength: number;
  remainingElongationPct: number;
  /** Vickers hardness of the final state by Tabor's relation, HV. */
  hardnessHV: number;
  /** Bit 0: all targets met; bit i + 1: target i (in the order of `checkTargets`) met. */
  metMask: number;
}

/**
 * Carries one sample of the inputs through the route and returns the final state. This is the
 * ledger's own computation ({@link evaluateRoute}: the step kinds' `apply`, the same strain sums and
 * anneal rule, {@link stateProperties} and {@link checkTargets} on the final state) without building
 * the per-step rows, so it gives the same numbers as `evaluateRoute(scatterRouteInput(prep, x))`,
 * bit for bit (tested).
 * Units: MPa, mm, %. @throws InputError or ComputationError for a sample the route cannot take.
 */
export function evaluateScatterSample(prep: PreparedScatter, x: ArrayLike<number>): SampleOutcome {
  const law = sampleLaw(prep, x);
  const material: Material = { ...prep.baseMaterial, law };
  const effects = prep.fixedEffects ?? stepEffects(sampleStart(prep, x), prep.stock, prep.problem.steps);
  return finalState(prep, material, effects);
}

/** The ledger's strain sums and anneal rule over the step effects, then the final state and targets. */
function finalState(prep: PreparedScatter, material: Material, effects: readonly StepEffect[]): SampleOutcome {
  const law = material.law;
  const eu = law.uniformStrain();
  let eps = 0;
  for (let i = 0; i < effects.length; i++) {
    const e = effects[i]!;
    if (e.softeningFraction !== undefined) {
      const f = e.softeningFraction;
      if (f >= 1) eps = 0;
      else {
        const s0 = law.stress(0);
        eps = law.strainAt(law.stress(eps) - f * (law.stress(eps) - s0));
      }
    } else {
      eps = eps + e.strainIncrement;
    }
  }
  const p = stateProperties(material, eps, eu);
  if (!Number.isFinite(p.reloadYield + p.tensileStrength + p.remainingUniformElongationPct)) {
    throw new ComputationError('scatter', `a sample gave a non-finite final state (strain ${eps})`);
  }
  // Targets as checkTargets decides them (margin = predicted − limit for a minimum, limit − predicted
  // for a maximum; met when margin ≥ 0), without allocating a result per sample.
  const checks = prep.targetChecks;
  let mask = 0;
  let all = true;
  for (let i = 0; i < checks.length; i++) {
    const c = checks[i]!;
    const predicted = p[c.property];
    const margin = c.min ? predicted - c.limit : c.limit - predicted;
    if (margin >= 0) mask |= 1 << (i + 1);
    else all = false;
  }
  if (all) mask |= 1;
  return { reloadYield: p.reloadYield, tensileStrength: p.tensileStrength, remainingElongationPct: p.remainingUniformElongationPct, hardnessHV: p.hardnessHV, metMask: mask };
}

/** The plain route of one sample, for {@link evaluateRoute} (used to check the fast path). */
export function scatterRouteInput(prep: PreparedScatter, x: ArrayLike<number>): RouteInput {
  return {
    material: { ...prep.baseMaterial, law: sampleLaw(prep, x) },
    start: sampleStart(prep, x),
    steps: prep.problem.steps,
    targets: prep.targets,
  };
}

/** The samples of one block: inputs (row-major, one row per sample), outputs and target flags. */
export interface ScatterBlock {
  index: number;
  count: number;
  inputs: Float64Array;
  reloadYield: Float64Array;
  tensileStrength: Float64Array;
  remainingElongationPct: Float64Array;
  /** Final Vickers hardness (Tabor), HV. */
  hardnessHV: Float64Array;
  metMask: Uint16Array;
  /** Draws rejected because the route could not take them (a parameter outside its range, a start size below a pass's exit size). */
  rejected: number;
}

/** Most consecutive rejected draws before the spreads are declared too wide. */
export const MAX_CONSECUTIVE_REJECTS = 1000;

/**
 * Samples block `index` of a prepared problem: its own xoshiro128** stream (seed, index), standard
 * normal deviates z by Box–Muller, correlated inputs x = μ + σ ⊙ (L·z) with L the Cholesky factor of
 * the correlation matrix (the usual construction of correlated normals, e.g. Gentle, *Random Number
 * Generation and Monte Carlo Methods*, 2nd ed., §5.3.1), then {@link evaluateScatterSample}. A draw
 * the route cannot take is redrawn (a normal truncated to the valid region) and counted.
 * @throws InputError naming `scatter` when {@link MAX_CONSECUTIVE_REJECTS} draws in a row are rejected.
 */
export function sampleScatterBlock(prep: PreparedScatter, index: number): ScatterBlock {
  const { problem, chol } = prep;
  const p = problem.inputs.length;
  const start = index * SCATTER_BLOCK;
  const count = Math.min(SCATTER_BLOCK, problem.samples - start);
  if (!(count > 0)) throw new InputError('scatter.block', index, `a block index in [0, ${prep.blocks - 1}]`);
  const z = normalSampler(xoshiro128ss(problem.seed, index));
  const mu = Float64Array.from(problem.inputs, (i) => i.mean);
  const sd = Float64Array.from(problem.inputs, (i) => i.sd);
  const L = new Float64Array(p * p); // the Cholesky factor, row-major
  for (let i = 0; i < p; i++) for (let j = 0; j <= i; j++) L[i * p + j] = chol[i]![j]!;
  const inputs = new Float64Array(count * p);
  const reloadYield = new Float64Array(count);
  const tensileStrength = new Float64Array(count);
  const remainingElongationPct = new Float64Array(count);
  const hardnessHV = new Float64Array(count);
  const metMask = new Uint16Array(count);
  const zz = new Float64Array(p);
  const x = new Float64Array(p);
  const material: Material = { ...prep.baseMaterial, law: sampleLaw(prep, mu) };
  const fixed = prep.fixedEffects;
  const steps = problem.steps;
  let rejected = 0;
  let lastReason = '';
  for (let s = 0; s < count; s++) {
    for (let tries = 0; ; tries++) {
      for (let i = 0; i < p; i++) zz[i] = z();
      for (let i = 0; i < p; i++) {
        let c = 0;
        for (let j = 0; j <= i; j++) c += L[i * p + j]! * zz[j]!;
        x[i] = mu[i]! + sd[i]! * c;
      }
      let out: SampleOutcome | null = null;
      try {
        material.law = sampleLaw(prep, x);
        out = finalState(prep, material, fixed ?? stepEffects(sampleStart(prep, x), prep.stock, steps));
      } catch (e) {
        if (!(e instanceof InputError || e instanceof ComputationError)) throw e;
        lastReason = e.message;
      }
      if (out) {
        for (let i = 0; i < p; i++) inputs[s * p + i] = x[i]!;
        reloadYield[s] = out.reloadYield;
        tensileStrength[s] = out.tensileStrength;
        remainingElongationPct[s] = out.remainingElongationPct;
        hardnessHV[s] = out.hardnessHV;
        metMask[s] = out.metMask;
        break;
      }
      rejected++;
      if (tries + 1 >= MAX_CONSECUTIVE_REJECTS) {
        throw new InputError('scatter', `${MAX_CONSECUTIVE_REJECTS} draws in a row`, 'spreads narrow enough that most draws are valid law parameters and start sizes the route can take',
          `the scattered inputs fall outside what the law or the route allows (last: ${lastReason})`);
      }
    }
  }
  return { index, count, inputs, reloadYield, tensileStrength, remainingElongationPct, hardnessHV, metMask, rejected };
}
