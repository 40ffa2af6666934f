import { quantileSorted } from 'simple-statistics';
import { ComputationError, InputError } from '../errors.js';
import { TARGET_NAMES } from '../route/targets.js';
import type { TargetName } from '../route/types.js';
import { deltaMethod, type DeltaResult } from './delta.js';
import { orderStatisticLowerRank } from './orderStatisticBound.js';
import type { PreparedScatter } from './problem.js';
import type { ScatterBlock } from './sample.js';
import { normalToleranceFactor } from './toleranceFactor.js';

/** Summary of one output's Monte Carlo distribution (MPa or %). Percentiles by R's type 7 (linear). */
export interface Distribution {
  mean: number;
  sd: number;
  min: number;
  p05: number;
  p50: number;
  p95: number;
  max: number;
}

/** Sensitivity of the final reload yield to one input. */
export interface InputSensitivity {
  input: string;
  /** Standardised regression coefficient: change of the output, in output sd, per input sd, others held fixed. */
  src: number;
  /** Pearson correlation of input and output over the samples. */
  correlation: number;
}

/** Which bound the tolerance section gives and why. */
export interface ToleranceBound {
  /** The lower bound on the final reload yield (MPa) at the stated coverage and confidence. */
  value: number;
  coverage: number;
  confidence: number;
  method: 'distribution-free' | 'normal';
  /** Normal tolerance factor k for n = samples, and x̄ − k·s. */
  normalK: number;
  normalValue: number;
  /** Rank r (1 = smallest) of the order-statistic bound and its value; null when the sample is too small. */
  distributionFreeRank: number | null;
  distributionFreeValue: number | null;
  note: string;
}

/** The Monte Carlo result, core units (MPa, %); sorted samples kept for any percentile. */
export interface ScatterSummary {
  samples: number;
  seed: number;
  blocks: number;
  rejected: number;
  inputs: Array<{ name: string; mean: number; sd: number; cv: number }>;
  probabilityAllTargetsMet: number;
  /** Binomial standard error of that probability, √(p(1 − p)/N). */
  probabilityStdError: number;
  targets: Array<{ name: TargetName; limit: number; probabilityMet: number }>;
  finalReloadYield: Distribution;
  tensileStrength: Distribution;
  remainingElongationPct: Distribution;
  /** Final Vickers hardness by Tabor's relation, HV. */
  hardnessHV: Distribution;
  toleranceBound: ToleranceBound;
  sensitivity: { output: 'finalReloadYield'; method: string; linearR2: number; inputs: InputSensitivity[] };
  deltaMethod: DeltaResult;
  /** Sorted samples of each output, for {@link scatterPercentile} and histograms; not part of the report. */
  sorted: { finalReloadYield: Float64Array; tensileStrength: Float64Array; remainingElongationPct: Float64Array; hardnessHV: Float64Array };
}

/**
 * A percentile of a sorted sample by linear interpolation between order statistics (R type 7,
 * Hyndman & Fan, "Sample quantiles in statistical packages", Am. Stat. 50 (1996) 361–365), through
 * simple-statistics' `quantileSorted`.
 * Units: those of the sample. Valid range: 0 ≤ p ≤ 1, a non-empty sorted sample.
 * @example scatterPercentile(summary.sorted.finalReloadYield, 0.01) // the 1 % point of the final yield
 */
export function scatterPercentile(sorted: ArrayLike<number>, p: number): number {
  if (sorted.length === 0) throw new InputError('sample', 0, 'at least one value');
  if (!(p >= 0 && p <= 1)) throw new InputError('p', p, 'a number in [0, 1]');
  return quantileSorted(sorted as number[], p);
}

function concat(blocks: readonly ScatterBlock[], key: 'reloadYield' | 'tensileStrength' | 'remainingElongationPct' | 'hardnessHV', n: number): Float64Array {
  const out = new Float64Array(n);
  let o = 0;
  for (const b of blocks) { out.set(b[key], o); o += b.count; }
  return out;
}

function distribution(values: Float64Array, sorted: Float64Array): Distribution {
  const n = values.length;
  let s = 0;
  for (let i = 0; i < n; i++) s += values[i]!;
  const mean = s / n;
  let ss = 0;
  for (let i = 0; i < n; i++) { const d = values[i]! - mean; ss += d * d; }
  return {
    mean, sd: Math.sqrt(ss / (n - 1)),
    min: sorted[0]!, p05: scatterPercentile(sorted, 0.05), p50: scatterPercentile(sorted, 0.5), p95: scatterPercentile(sorted, 0.95), max: sorted[n - 1]!,
  };
}

/** Solves A·β = b for a small symmetric positive-definite A by Gaussian elimination with partial pivoting. */
function solve(A: number[][], b: number[]): number[] {
  const n = b.length;
  const M = A.map((r, i) => [...r, b[i]!]);
  for (let c = 0; c < n; c++) {
    let piv = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(M[r]![c]!) > Math.abs(M[piv]![c]!)) piv = r;
    [M[c], M[piv]] = [M[piv]!, M[c]!];
    const d = M[c]![c]!;
    if (!(Math.abs(d) > 1e-300)) throw new ComputationError('scatter.sensitivity', 'the sampled inputs are linearly dependent');
    for (let r = c + 1; r < n; r++) {
      const f = M[r]![c]! / d;
      for (let k = c; k <= n; k++) M[r]![k]! -= f * M[c]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = M[r]![n]!;
    for (let k = r + 1; k < n; k++) s -= M[r]![k]! * x[k]!;
    x[r] = s / M[r]![r]!;
  }
  return x;
}

/**
 * Standardised regression coefficients (SRC) of an output on the inputs: the least-squares slopes
 * of y on x, each scaled by sd(xᵢ)/sd(y). For a near-linear model (R² close to 1) and independent
 * inputs, SRCᵢ² is the share of the output variance due to input i. Source: A. Saltelli et al.,
 * *Global Sensitivity Analysis: The Primer*, Wiley 2008, ch. 1 (standardised regression
 * coefficients). Inputs without spread get 0.
 */
function sensitivity(names: readonly string[], X: Float64Array, y: Float64Array): { linearR2: number; inputs: InputSensitivity[] } {
  const n = y.length;
  const p = names.length;
  const mx = new Array<number>(p).fill(0);
  let my = 0;
  for (let s = 0; s < n; s++) { my += y[s]!; for (let i = 0; i < p; i++) mx[i]! += X[s * p + i]!; }
  my /= n;
  for (let i = 0; i < p; i++) mx[i]! /= n;
  const C = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const cy = new Array<number>(p).fill(0);
  let vy = 0;
  for (let s = 0; s < n; s++) {
    const dy = y[s]! - my;
    vy += dy * dy;
    for (let i = 0; i < p; i++) {
      const di = X[s * p + i]! - mx[i]!;
      cy[i]! += di * dy;
      for (let j = 0; j <= i; j++) C[i]![j]! += di * (X[s * p + j]! - mx[j]!);
    }
  }
  for (let i = 0; i < p; i++) for (let j = 0; j < i; j++) C[j]![i] = C[i]![j]!;
  const active = names.map((_, i) => C[i]![i]! > 0).map((a, i) => (a ? i : -1)).filter((i) => i >= 0);
  const out: InputSensitivity[] = names.map((input) => ({ input, src: 0, correlation: 0 }));
  if (!(vy > 0) || active.length === 0) return { linearR2: 0, inputs: out };
  const beta = solve(active.map((i) => active.map((j) => C[i]![j]!)), active.map((i) => cy[i]!));
  let r2 = 0;
  active.forEach((i, k) => {
    out[i] = { input: names[i]!, src: beta[k]! * Math.sqrt(C[i]![i]! / vy), correlation: cy[i]! / Math.sqrt(C[i]![i]! * vy) };
    r2 += (beta[k]! * cy[i]!) / vy;
  });
  return { linearR2: r2, inputs: out };
}

/**
 * Combines the blocks of a Monte Carlo run, in block order (so the result does not depend on which
 * worker computed which block), into the scatter summary: distributions of the final reload yield,
 * tensile strength and remaining uniform elongation; the probability that all targets (and each)
 * are met with its binomial standard error; the one-sided lower tolerance bound on the final yield;
 * sensitivities; and the first-order (delta-method) mean and sd through the same route.
 *
 * Tolerance bound: with N Monte Carlo samples the distribution-free bound (order statistic, Wilks)
 * applies whenever N ≥ ln(1 − γ)/ln p (29 for 90 %/95 %), and is the one reported: the final yield
 * need not be normal. The normal-theory bound x̄ − k·s (noncentral t) is given beside it. Both treat
 * the plan's means and spreads as known: the confidence covers Monte Carlo sampling only.
 * @throws InputError when blocks are missing or do not match the problem.
 */
export function summarizeScatter(prep: PreparedScatter, blocks: readonly ScatterBlock[]): ScatterSummary {
  const { problem } = prep;
  const N = problem.samples;
  if (blocks.length !== prep.blocks) throw new InputError('scatter.blocks', blocks.length, `${prep.blocks} blocks`);
  const ordered = [...blocks].sort((a, b) => a.index - b.index);
  ordered.forEach((b, i) => { if (b.index !== i) throw new InputError('scatter.blocks', b.index, `block ${i}`); });
  const p = problem.inputs.length;
  const X = new Float64Array(N * p);
  let o = 0;
  let rejected = 0;
  for (const b of ordered) { X.set(b.inputs, o); o += b.inputs.length; rejected += b.rejected; }
  const ys = concat(ordered, 'reloadYield', N);
  const ts = concat(ordered, 'tensileStrength', N);
  const es = concat(ordered, 'remainingElongationPct', N);
  const hs = concat(ordered, 'hardnessHV', N);
  const sorted = { finalReloadYield: ys.slice().sort(), tensileStrength: ts.slice().sort(), remainingElongationPct: es.slice().sort(), hardnessHV: hs.slice().sort() };

  const targetNames = TARGET_NAMES.filter((t) => prep.targets[t] !== undefined);
  const metCounts = new Array<number>(targetNames.length + 1).fill(0);
  for (const b of ordered) {
    for (let s = 0; s < b.count; s++) {
      const m = b.metMask[s]!;
      for (let k = 0; k <= targetNames.length; k++) if (m & (1 << k)) metCounts[k]!++;
    }
  }
  const pAll = metCounts[0]! / N;

  const yieldDist = distribution(ys, sorted.finalReloadYield);
  const { coverage, confidence } = problem;
  const k = normalToleranceFactor(N, coverage, confidence, 'scatter').k;
  const normalValue = yieldDist.mean - k * yieldDist.sd;
  const rank = orderStatisticLowerRank(N, coverage, confidence, 'scatter');
  const dfValue = rank === null ? null : sorted.finalReloadYield[rank - 1]!;
  const toleranceBound: ToleranceBound = rank !== null
    ? { value: dfValue!, coverage, confidence, method: 'distribution-free', normalK: k, normalValue, distributionFreeRank: rank, distributionFreeValue: dfValue,
      note: `distribution-free (Wilks): the ${rank}th smallest of ${N} samples; applies for any continuous distribution since N ≥ ln(1 − γ)/ln p. Normal-theory x̄ − k·s with k = ${k.toFixed(4)} (noncentral t, NIST/SEMATECH e-Handbook §7.2.6.3) shown beside it. Both take the plan's means and spreads as known.` }
    : { value: normalValue, coverage, confidence, method: 'normal', normalK: k, normalValue, distributionFreeRank: null, distributionFreeValue: null,
      note: `normal theory x̄ − k·s, k = ${k.toFixed(4)} (noncentral t, NIST/SEMATECH e-Handbook §7.2.6.3): too few samples (${N}) for a distribution-free bound at this coverage and confidence; assumes the final yield is normal.` };

  const names = problem.inputs.map((i) => i.name);
  const sens = sensitivity(names, X, ys);
  return {
    samples: N,
    seed: problem.seed,
    blocks: prep.blocks,
    rejected,
    inputs: problem.inputs.map((i) => ({ name: i.name, mean: i.mean, sd: i.sd, cv: i.mean !== 0 ? i.sd / Math.abs(i.mean) : 0 })),
    probabilityAllTargetsMet: pAll,
    probabilityStdError: Math.sqrt((pAll * (1 - pAll)) / N),
    targets: targetNames.map((name, i) => ({ name, limit: prep.targets[name]!, probabilityMet: metCounts[i + 1]! / N })),
    finalReloadYield: yieldDist,
    tensileStrength: distribution(ts, sorted.tensileStrength),
    remainingElongationPct: distribution(es, sorted.remainingElongationPct),
    hardnessHV: distribution(hs, sorted.hardnessHV),
    toleranceBound,
    sensitivity: { output: 'finalReloadYield', method: 'standardised regression coefficients (Saltelli et al., Global Sensitivity Analysis: The Primer, 2008, ch. 1)', ...sens },
    deltaMethod: deltaMethod(prep),
    sorted,
  };
}
