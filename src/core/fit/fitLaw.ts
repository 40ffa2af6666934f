import { InputError } from '../errors.js';
import { makeLaw } from '../flow/makeLaw.js';
import { LAW_PARAMETERS } from '../flow/params.js';
import type { LawName, LawSpec } from '../flow/types.js';
import { fitStatistics } from './fitStatistics.js';
import { lawJacobian } from './lawJacobian.js';
import { levenbergMarquardt } from './levenbergMarquardt.js';
import { startValues } from './startValues.js';
import type { FitWarning, LawFit } from './types.js';

/** Options of {@link fitLaw}. */
export interface FitLawOptions {
  /** Start instead of the automatic one, parameters by name (MPa). */
  start?: Record<string, number>;
  maxIterations?: number;
}

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
 * {@link startValues}; returns parameters, standard errors and 95 % intervals, RMSE, R², AIC, BIC,
 * residuals and `converged` ({@link fitStatistics} for the formulas and sources).
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
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++) {
    if (!(strain[i]! > 0) || !Number.isFinite(strain[i]!)) throw new InputError(`strain[${i}]`, strain[i], 'a finite true plastic strain > 0');
    if (!(stress[i]! > 0) || !Number.isFinite(stress[i]!)) throw new InputError(`stress[${i}]`, stress[i], 'a finite true stress > 0 MPa');
    lo = Math.min(lo, strain[i]!);
    hi = Math.max(hi, strain[i]!);
  }
  const { lower, upper } = lawBounds(law);
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
  const model = lawModelFast(law, strain);
  const scratch = new Float64Array(n);
  const res = levenbergMarquardt(model, stress, start, {
    lower, upper,
    jacobian: (p, out) => lawJacobian(law, strain, p, scratch, out), ...(opts.maxIterations !== undefined ? { maxIterations: opts.maxIterations } : {}) });
  const residuals = Array.from(res.predicted, (v, i) => v - stress[i]!);
  const st = fitStatistics(res.jacobian, residuals, stress, k, res.atBound, res.params);
  const warnings: FitWarning[] = [];
  if (!res.converged) warnings.push({ code: 'notConverged', message: `${law}: the fit did not converge in ${res.iterations} iterations (${res.reason})` });
  const params: Record<string, number> = {};
  const standardErrors: Record<string, number | null> = {};
  const intervals95: Record<string, [number, number] | null> = {};
  info.forEach((p, j) => {
    params[p.name] = res.params[j]!;
    standardErrors[p.name] = st.standardErrors[j]!;
    intervals95[p.name] = st.intervals95[j]!;
    if (res.atBound[j]) warnings.push({ code: 'atBound', message: `${law}: ${p.name} ended on its bound (${res.params[j]}); its standard error is not given` });
  });
  if (st.singular) warnings.push({ code: 'notIdentifiable', message: `${law}: the data do not determine all ${k} parameters (singular information matrix); standard errors are not given` });
  return {
    law, params, standardErrors, intervals95,
    rmse: st.rmse, r2: st.r2, aic: st.aic, bic: st.bic,
    residuals, converged: res.converged, iterations: res.iterations,
    strainRange: [lo, hi], points: n, warnings,
  };
}
