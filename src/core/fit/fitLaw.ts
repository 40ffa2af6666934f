import { InputError } from '../errors.js';
import { makeLaw } from '../flow/makeLaw.js';
import { LAW_PARAMETERS, LAW_TITLES } from '../flow/params.js';
import type { LawName, LawSpec } from '../flow/types.js';
import { blockAverage, REDUCTION_DEFAULTS, reductionBlockSize } from './blockAverage.js';
import { effectivePoints } from './effectivePoints.js';
import { parameterErrors } from './fitStatistics.js';
import { lawJacobian } from './lawJacobian.js';
import { lawData, lawNormalProblem, lawResidualStats, lawResiduals, type LawData } from './lawNormalEquations.js';
import { curveResidualStats } from './momentResidualStats.js';
import { levenbergMarquardtNormal } from './levenbergMarquardt.js';
import { startValues } from './startValues.js';
import type { FitWarning, LawFit } from './types.js';

/** Options of {@link fitLaw}. */
export interface FitLawOptions {
  /** Start instead of the automatic one, parameters by name (MPa). */
  start?: Record<string, number>;
  /**
   * Parameters held at the given values instead of fitted, by name (MPa), each within its LAW_PARAMETERS
   * range: they get no standard error and are listed in `basis.held` (fitLawGroup holds the Swift–Voce
   * blend's α, which one flow curve does not determine).
   */
  hold?: Record<string, number>;
  maxIterations?: number;
  /** The same strain and stress already packed by {@link lawData} (fitAllLaws packs a curve once for all laws). */
  packed?: LawData;
  /**
   * Sum the full-curve statistics point by point whatever the curve's size (default false: curves of
   * REDUCTION_DEFAULTS.momentStatsFrom points or more use block moments, see curveResidualStats).
   */
  fullPassStats?: boolean;
}

/**
 * Laws fitted first on {@link coarseData} when their data are large enough: the Swift–Voce blend, whose six free
 * parameters trade off along a curved valley. The other laws converge in 3–9 steps on the full data; for them a coarse
 * stage saved little and changed which borderline Hockett–Sherby fits converge (44 of 200 hold-out B records).
 */
export const COARSE_FIRST: ReadonlySet<LawName> = new Set<LawName>(['swiftVoce']);

/** At most this many points are used to choose the start (evenly spaced); the fit itself uses all. */
export const START_SAMPLE = 400;

/** Box bounds of a law's parameters, from LAW_PARAMETERS; open ends moved inward by 1e-9 of the span or 1e-9. */
export function lawBounds(law: LawName): { lower: number[]; upper: number[] } {
  const lower: number[] = [], upper: number[] = [];
  for (const p of LAW_PARAMETERS[law]) {
    lower.push(p.loOpen ? p.lo + Math.max(1e-9, Math.abs(p.lo) * 1e-9) : p.lo);
    upper.push(p.hiOpen ? p.hi - Math.max(1e-9, Math.abs(p.hi) * 1e-9) : p.hi);
  }
  return { lower, upper };
}

/** The model of a law at fixed strains: predictions, or null outside the law's domain. */
export function lawModel(law: LawName, strain: ArrayLike<number>): (p: Float64Array) => Float64Array | null {
  const names = LAW_PARAMETERS[law].map((p) => p.name);
  const n = strain.length;
  return (p) => {
    const spec: Record<string, unknown> = { law };
    for (let j = 0; j < names.length; j++) spec[names[j]!] = p[j];
    let f;
    try {
      f = makeLaw(spec as LawSpec).stress;
    } catch {
      return null;
    }
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const v = f(strain[i]!);
      if (!Number.isFinite(v)) return null;
      out[i] = v;
    }
    return out;
  };
}

/**
 * The model of a law at fixed strains by the closed forms of {@link lawJacobian} (the same formulas as
 * the law files, checked against makeLaw in the tests); null outside the LAW_PARAMETERS box or domain.
 */
export function lawModelFast(law: LawName, strain: ArrayLike<number>): (p: Float64Array) => Float64Array | null {
  const { lower, upper } = lawBounds(law);
  return (p) => {
    for (let j = 0; j < p.length; j++) if (!(p[j]! >= lower[j]! && p[j]! <= upper[j]!)) return null;
    const out = new Float64Array(strain.length);
    if (!lawJacobian(law, strain, p, out, null)) return null;
    for (let i = 0; i < out.length; i++) if (!Number.isFinite(out[i]!)) return null;
    return out;
  };
}

/**
 * Fits one hardening law to a flow curve by bounded Levenberg–Marquardt least squares.
 *
 * Minimises Σ(σ_law(εᵢ) − σᵢ)² over the law's parameters within the LAW_PARAMETERS ranges, from
 * {@link startValues}. The normal equations are built in one fused pass per step with analytic
 * derivatives ({@link lawNormalProblem}). Curves of more than REDUCTION_DEFAULTS.fitAllUpTo points
 * are fitted on block averages of consecutive points ({@link blockAverage}, about
 * REDUCTION_DEFAULTS.blocks of them, weighted by their counts); RMSE, R², AIC, BIC and the
 * residuals are always those of the FULL curve: on curves of REDUCTION_DEFAULTS.momentStatsFrom points
 * or more its SSR and lag-1 sum come from block moments ({@link curveResidualStats}), within about
 * 2·REDUCTION_DEFAULTS.momentRelTol of SSR of the point-by-point sums (`fullPassStats` forces those).
 * Intervals: the residuals of closely spaced points are not independent, so the standard errors are
 * widened by sqrt(n/n_eff) with n_eff from the residuals' lag-1 autocorrelation
 * ({@link effectivePoints}) and the t quantile uses n_eff − k degrees of freedom
 * ({@link parameterErrors}); `standardErrorsIndependent` keeps the independent-point values.
 * Units: strain true plastic (dimensionless, > 0), stress true MPa. Valid: at least k + 2 points.
 * @throws InputError for fewer points than parameters + 2 or non-finite or non-positive data.
 * @example fitLaw('hollomon', [0.01, 0.05, 0.1], [530 * 0.01 ** 0.44, 530 * 0.05 ** 0.44, 530 * 0.1 ** 0.44]).params // { K: 530, n: 0.44 }
 */
export function fitLaw(law: LawName, strain: ArrayLike<number>, stress: ArrayLike<number>, opts: FitLawOptions = {}): LawFit {
  const info = LAW_PARAMETERS[law];
  if (!info) throw new InputError('law', law, `one of ${Object.keys(LAW_PARAMETERS).join(', ')}`);
  const k = info.length;
  const n = strain.length;
  if (stress.length !== n) throw new InputError('stress', stress.length, `as many values as strain (${n})`);
  if (n < k + 2) throw new InputError('points', n, `at least ${k + 2} points to fit ${law} (${k} parameters)`);
  // One pass packs the data (Float64Arrays, ln ε) and finds its range and the first bad point.
  const full = opts.packed && opts.packed.x.length === n ? opts.packed : lawData(strain, stress);
  if (full.bad >= 0) {
    const i = full.bad, e = strain[i]!, s = stress[i]!;
    if (!(e > 0) || !(e < Infinity)) throw new InputError(`strain[${i}]`, e, 'a finite true plastic strain > 0');
    throw new InputError(`stress[${i}]`, s, 'a finite true stress > 0 MPa');
  }
  const lo = full.lo, hi = full.hi;
  const { lower, upper } = lawBounds(law);
  const held = info.map(() => false);
  for (const [name, v] of Object.entries(opts.hold ?? {})) {
    const j = info.findIndex((p) => p.name === name);
    if (j < 0) throw new InputError('hold', name, `a parameter of ${law} (${info.map((p) => p.name).join(', ')})`);
    if (!(v >= lower[j]! && v <= upper[j]!)) throw new InputError(`hold.${name}`, v, `a number in [${lower[j]}, ${upper[j]}]`);
    lower[j] = v; upper[j] = v; held[j] = true;
  }
  let start: number[];
  if (opts.start) {
    start = info.map((p) => opts.start![p.name] ?? NaN);
    start.forEach((v, j) => { if (!Number.isFinite(v)) throw new InputError(`start.${info[j]!.name}`, v, 'a finite number'); });
  } else {
    const step = Math.max(1, Math.floor(n / START_SAMPLE));
    const xs: number[] = [], ys: number[] = [];
    for (let i = 0; i < n; i += step) { xs.push(strain[i]!); ys.push(stress[i]!); }
    start = startValues(law, xs, ys);
  }
  start = start.map((v, j) => Math.min(upper[j]!, Math.max(lower[j]!, v)));
  const blockSize = reductionBlockSize(n);
  const fitted = fittedData(full);
  const coarse = COARSE_FIRST.has(law) ? coarseData(fitted) : null;
  if (coarse) {
    // The coarse stage: the same fit on about REDUCTION_DEFAULTS.coarseBlocks averages, whose solution starts the fit
    // proper. The Swift–Voce blend crawls along a curved valley (134 steps on the 2,000 averages of a 1,000,000-row
    // record, 90–125 on the open 42CrMoS4 records); the crawl is now made on an eighth of the points and the fit proper
    // needs about 15 steps. The minimum is the fit proper's: only its start moves (bench/RESULTS.md, eleventh session).
    const c = levenbergMarquardtNormal(lawNormalProblem(law, coarse, lower, upper), start, {
      lower, upper, ...(opts.maxIterations !== undefined ? { maxIterations: opts.maxIterations } : {}) });
    start = Array.from(c.params);
  }
  const res = levenbergMarquardtNormal(lawNormalProblem(law, fitted, lower, upper), start, {
    lower, upper, ...(opts.maxIterations !== undefined ? { maxIterations: opts.maxIterations } : {}) });
  const pass = opts.fullPassStats ? lawResidualStats(law, full, res.params) : curveResidualStats(law, full, res.params);
  const ssr = pass.ssr;
  const ssrN = Math.max(ssr / n, 1e-300);
  const eff = effectivePoints(n, ssr, pass.lag1);
  // JᵀJ of the full curve: the solver's own when every point was fitted; with block averages the
  // weighted Σ w_b∇σ(x̄_b)∇σ(x̄_b)ᵀ, equal to the full sum up to second order in the block span.
  const noError = res.atBound.map((b, j) => b || held[j]!); // a held parameter has no standard error
  const independent = parameterErrors(res.JtJ, k, ssr, n, noError, res.params, n);
  const honest = parameterErrors(res.JtJ, k, ssr, n, noError, res.params, eff.effectiveN);
  const warnings: FitWarning[] = [];
  if (!res.converged) warnings.push({ code: 'notConverged', message: `${LAW_TITLES[law]}: the fit did not converge in ${res.iterations} iterations (${res.reason})` });
  const params: Record<string, number> = {};
  const standardErrors: Record<string, number | null> = {};
  const standardErrorsIndependent: Record<string, number | null> = {};
  const intervals95: Record<string, [number, number] | null> = {};
  const clipped: string[] = [];
  info.forEach((p, j) => {
    params[p.name] = res.params[j]!;
    standardErrors[p.name] = honest.standardErrors[j]!;
    standardErrorsIndependent[p.name] = independent.standardErrors[j]!;
    // A Wald interval is symmetric and knows nothing of the range a parameter can take (a σ0 of −14 to 31 MPa on a
    // fit whose Voce part hardly shows): cut at the range's ends, and say so (basis.intervalsClipped).
    const iv = honest.intervals95[j]!;
    if (iv && (iv[0] < p.lo || iv[1] > p.hi)) { intervals95[p.name] = [Math.max(p.lo, iv[0]), Math.min(p.hi, iv[1])]; clipped.push(p.name); }
    else intervals95[p.name] = iv;
    if (res.atBound[j]) warnings.push({ code: 'atBound', message: `${LAW_TITLES[law]}: ${p.symbol} ended on its bound (${res.params[j]}); its standard error is not given` });
  });
  const fittedK = k - held.filter(Boolean).length;
  if (honest.singular) warnings.push({ code: 'notIdentifiable', message: `${LAW_TITLES[law]}: the data do not determine all ${fittedK} fitted parameters (singular information matrix); standard errors are not given` });
  const fit: LawFit = {
    law, params, standardErrors, intervals95,
    rmse: Math.sqrt(ssr / n), r2: pass.sst > 0 ? 1 - ssr / pass.sst : ssr === 0 ? 1 : 0,
    aic: n * Math.log(ssrN) + 2 * fittedK, bic: n * Math.log(ssrN) + fittedK * Math.log(n), // k: the parameters fitted
    residuals: [], converged: res.converged, iterations: res.iterations,
    strainRange: [lo, hi], points: n, warnings, standardErrorsIndependent,
    basis: { fittedPoints: fitted.x.length, blockSize, lag1Autocorrelation: eff.lag1, effectivePoints: eff.effectiveN, inflation: eff.inflation, held: info.filter((_, j) => held[j]).map((p) => p.name), intervalsClipped: clipped },
  };
  return withLazyResiduals(fit, full, res.params);
}

/**
 * The points fitLaw's solver works on: `full` itself, or for curves of more than
 * REDUCTION_DEFAULTS.fitAllUpTo points its block averages ({@link blockAverage}, made once and kept on
 * `full.blocks`, weighted by their counts). Units those of `full`.
 * @example fittedData(lawData(eps, sigma)).x.length // ≤ 4000 points: all of them; more: about 2000 averages
 */
export function fittedData(full: LawData): LawData {
  const blockSize = reductionBlockSize(full.x.length);
  if (blockSize <= 1) return full;
  if (full.blocks?.size !== blockSize) {
    const b = blockAverage(full.x, full.y, blockSize);
    full.blocks = { size: blockSize, data: lawData(b.x, b.y, b.w) };
  }
  return full.blocks.data;
}

/**
 * The points of fitLaw's coarse stage: for fitted data of more than 2·REDUCTION_DEFAULTS.coarseBlocks points,
 * weighted averages of consecutive groups of them ({@link blockAverage} with weights), about coarseBlocks in all,
 * made once and kept on `fitted.coarse`; null for smaller data (no coarse stage). Units those of `fitted`.
 * Source: solving a least-squares problem first on a coarser sampling of its data to start the full one
 * (coarse-to-fine, common practice in numerical optimisation).
 * @example coarseData(lawData(eps, sigma)) // null for ≤ 500 points; about 250 weighted averages above
 */
export function coarseData(fitted: LawData): LawData | null {
  const m = fitted.x.length;
  const target = REDUCTION_DEFAULTS.coarseBlocks;
  if (m <= 2 * target) return null;
  if (!fitted.coarse) {
    const b = blockAverage(fitted.x, fitted.y, Math.ceil(m / target), fitted.w ?? null);
    fitted.coarse = lawData(b.x, b.y, b.w);
  }
  return fitted.coarse;
}

/**
 * Gives `fit` its `residuals` as an accessor: made when first read (one value pass of the law at
 * `params` over `data`, then kept) and assignable. `analyze` without --residuals never reads them,
 * and on a 766,736-point curve six laws' residual arrays cost 35 MB and a tenth of the command's
 * time (bench/RESULTS.md, issue 12 D). The runner uses it to rebuild fits made on another thread.
 * Units MPa (model − data). Returns `fit`.
 */
export function withLazyResiduals(fit: LawFit, data: LawData, params: Float64Array): LawFit {
  let residuals: number[] | null = null;
  const law = fit.law;
  Object.defineProperty(fit, 'residuals', {
    enumerable: true, configurable: true,
    get: () => (residuals ??= lawResiduals(law, data, params)),
    set: (v: number[]) => { residuals = v; },
  });
  return fit;
}
