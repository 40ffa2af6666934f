import { ComputationError } from '../errors.js';
import type { PreparedScatter } from './problem.js';
import { evaluateScatterSample, type SampleOutcome } from './sample.js';

/** First-order mean and standard deviation of each output (MPa or %), and the gradient used. */
export interface DeltaResult {
  finalReloadYield: { mean: number; sd: number };
  tensileStrength: { mean: number; sd: number };
  remainingElongationPct: { mean: number; sd: number };
  /** ∂(final reload yield)/∂(input), per input, in MPa per input unit. */
  gradient: number[];
}

const OUTPUTS = ['reloadYield', 'tensileStrength', 'remainingElongationPct'] as const;

/**
 * First-order (delta-method) propagation through the same route as the Monte Carlo: mean ≈ f(μ),
 * variance ≈ Σᵢ Σⱼ cᵢ cⱼ σᵢ σⱼ ρᵢⱼ with sensitivity coefficients cᵢ = ∂f/∂xᵢ at the means, taken by
 * central differences with step hᵢ = 10⁻⁴·|μᵢ| (σᵢ when μᵢ = 0).
 * Source: JCGM 100:2008 (GUM), *Evaluation of measurement data — Guide to the expression of
 * uncertainty in measurement*, §5.2.2, eq. (13), the law of propagation of uncertainty for correlated
 * inputs (equation number from memory). Valid for small spreads: the neglected terms grow with the
 * curvature of f times σ², so the Monte Carlo and this agree as the coefficients of variation shrink.
 * Units: those of the outputs (MPa, %).
 * @throws ComputationError when f cannot be evaluated at μ ± h.
 * @example deltaMethod(prepareScatter(problem)).finalReloadYield.sd // for Hollomon with only K
 *   scattering: cv_K · K·(ε̄ + 0.002)ⁿ·e^(−0.002), since the yield is proportional to K
 */
export function deltaMethod(prep: PreparedScatter): DeltaResult {
  const inputs = prep.problem.inputs;
  const p = inputs.length;
  const mu = inputs.map((i) => i.mean);
  const at = (x: number[]): SampleOutcome => {
    try {
      return evaluateScatterSample(prep, x);
    } catch (e) {
      throw new ComputationError('scatter.deltaMethod', `the route cannot be evaluated near the means (${(e as Error).message})`);
    }
  };
  const f0 = at(mu);
  const grads = OUTPUTS.map(() => new Array<number>(p).fill(0));
  for (let i = 0; i < p; i++) {
    if (inputs[i]!.sd === 0) continue;
    const h = 1e-4 * (mu[i] !== 0 ? Math.abs(mu[i]!) : inputs[i]!.sd);
    const up = [...mu]; up[i] = mu[i]! + h;
    const dn = [...mu]; dn[i] = mu[i]! - h;
    const fu = at(up);
    const fd = at(dn);
    OUTPUTS.forEach((o, k) => { grads[k]![i] = (fu[o] - fd[o]) / (2 * h); });
  }
  const R = prep.problem.correlation;
  const sdOf = (g: number[]) => {
    let v = 0;
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) v += g[i]! * g[j]! * inputs[i]!.sd * inputs[j]!.sd * R[i]![j]!;
    return Math.sqrt(Math.max(v, 0));
  };
  return {
    finalReloadYield: { mean: f0.reloadYield, sd: sdOf(grads[0]!) },
    tensileStrength: { mean: f0.tensileStrength, sd: sdOf(grads[1]!) },
    remainingElongationPct: { mean: f0.remainingElongationPct, sd: sdOf(grads[2]!) },
    gradient: grads[0]!,
  };
}
