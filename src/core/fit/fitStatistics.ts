import { invertSymmetric } from './symmetric.js';
import { studentTQuantile } from './studentT.js';

export interface FitStatistics {
  rmse: number;
  r2: number;
  aic: number;
  bic: number;
  /** Standard error per parameter; null when held at a bound or the information matrix is singular. */
  standardErrors: (number | null)[];
  intervals95: ([number, number] | null)[];
  /** True when (JᵀJ) of the free parameters could not be inverted. */
  singular: boolean;
}

/**
 * Statistics of a nonlinear least-squares fit with N points and k free parameters.
 *
 * s² = SSR/(N − k); covariance C = s²·(JᵀJ)⁻¹ over the parameters not held at a bound (the usual
 * linearised estimate); SE = sqrt(diag C); 95 % interval p ± t(0.975, N − k)·SE.
 * RMSE = sqrt(SSR/N); R² = 1 − SSR/SST; for Gaussian errors AIC = N·ln(SSR/N) + 2k and
 * BIC = N·ln(SSR/N) + k·ln N (constants that cancel between models on the same data dropped).
 * Sources: D. M. Bates and D. G. Watts, *Nonlinear Regression Analysis and Its Applications* (1988),
 * §2.3 (linear approximation inference); K. P. Burnham and D. R. Anderson, *Model Selection and
 * Multimodel Inference*, 2nd ed. (2002), §2.2 (AIC for least squares); G. Schwarz, *Ann. Stat.* 6
 * (1978) 461–464 (BIC). This is what SciPy's curve_fit returns as pcov (absolute_sigma=False).
 * Units: SE in parameter units, RMSE in data units. Valid: N > k.
 * @example fitStatistics(J, residuals, y, 2, [false, false], params) // { rmse, r2, ..., standardErrors: [..] }
 */
export function fitStatistics(
  jacobian: Float64Array,
  residuals: ArrayLike<number>,
  y: ArrayLike<number>,
  m: number,
  atBound: readonly boolean[],
  params: ArrayLike<number>,
): FitStatistics {
  const n = y.length;
  let ssr = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    ssr += residuals[i]! * residuals[i]!;
    my += y[i]!;
  }
  my /= n;
  let sst = 0;
  for (let i = 0; i < n; i++) sst += (y[i]! - my) ** 2;
  const free: number[] = [];
  for (let j = 0; j < m; j++) if (!atBound[j]) free.push(j);
  const k = m;
  const dof = n - free.length;
  const ssrN = Math.max(ssr / n, 1e-300);
  const out: FitStatistics = {
    rmse: Math.sqrt(ssr / n),
    r2: sst > 0 ? 1 - ssr / sst : ssr === 0 ? 1 : 0,
    aic: n * Math.log(ssrN) + 2 * k,
    bic: n * Math.log(ssrN) + k * Math.log(n),
    standardErrors: new Array(m).fill(null),
    intervals95: new Array(m).fill(null),
    singular: false,
  };
  if (dof < 1 || free.length === 0) return out;
  const A = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    const row = i * m;
    for (let a = 0; a < m; a++) {
      const ja = jacobian[row + a]!;
      for (let b = 0; b <= a; b++) A[a * m + b] = A[a * m + b]! + ja * jacobian[row + b]!;
    }
  }
  for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) A[b * m + a] = A[a * m + b]!;
  const se = parameterErrors(A, m, ssr, n, atBound, params, n);
  out.standardErrors = se.standardErrors;
  out.intervals95 = se.intervals95;
  out.singular = se.singular;
  return out;
}

/** Standard errors and 95 % intervals from JᵀJ (see {@link parameterErrors}). */
export interface ParameterErrors {
  standardErrors: (number | null)[];
  intervals95: ([number, number] | null)[];
  singular: boolean;
  /** Degrees of freedom of the t quantile: effectiveN − free parameters (at least 1). */
  dof: number;
}

/**
 * Standard errors and 95 % intervals of least-squares parameters from the normal matrix JᵀJ (m×m,
 * row-major) at the solution, over the parameters not held at a bound:
 * C = s²·(JᵀJ)⁻¹·(n / n_eff), s² = SSR/(n − f), SE = sqrt(diag C), interval p ± t(0.975, n_eff − f)·SE,
 * with f the free parameters. For independent points n_eff = n (the usual linearised estimate, what
 * SciPy's curve_fit returns as pcov with absolute_sigma=False; Bates & Watts 1988 §2.3). For
 * autocorrelated residuals pass n_eff from {@link effectivePoints}: the variance of each estimate
 * grows by n/n_eff and the t quantile uses the effective degrees of freedom (Bayley & Hammersley
 * 1946, from memory). Units: SE in parameter units. Valid: n > f.
 * @example parameterErrors(JtJ, 2, ssr, 1000, [false, false], [530, 0.2], 80).standardErrors
 */
export function parameterErrors(JtJ: Float64Array, m: number, ssr: number, n: number, atBound: readonly boolean[], params: ArrayLike<number>, effectiveN: number): ParameterErrors {
  const out: ParameterErrors = { standardErrors: new Array(m).fill(null), intervals95: new Array(m).fill(null), singular: false, dof: 0 };
  const free: number[] = [];
  for (let j = 0; j < m; j++) if (!atBound[j]) free.push(j);
  const f = free.length;
  if (n - f < 1 || f === 0) return out;
  const A = new Float64Array(f * f);
  for (let a = 0; a < f; a++) for (let b = 0; b < f; b++) A[a * f + b] = JtJ[free[a]! * m + free[b]!]!;
  const inv = invertSymmetric(A, f);
  if (!inv) {
    out.singular = true;
    return out;
  }
  const nEff = Math.min(n, Math.max(1, effectiveN));
  const s2 = (ssr / (n - f)) * (n / nEff);
  out.dof = Math.max(1, nEff - f);
  const t = studentTQuantile(0.975, out.dof);
  for (let a = 0; a < f; a++) {
    const v = s2 * inv[a * f + a]!;
    if (!(v >= 0) || !Number.isFinite(v)) continue;
    const se = Math.sqrt(v);
    const j = free[a]!;
    out.standardErrors[j] = se;
    out.intervals95[j] = [params[j]! - t * se, params[j]! + t * se];
  }
  return out;
}
