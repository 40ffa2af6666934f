import { brent } from '../numeric/brent.js';
import { checkRange, ComputationError, InputError } from '../errors.js';
import { noncentralTCdf } from './noncentralT.js';
import { normalQuantile } from './normalQuantile.js';

/** Result of {@link normalToleranceFactor}: the factor and how the solver ended. */
export interface ToleranceFactorResult {
  /** One-sided tolerance factor k: x̄ − k·s is a lower bound (x̄ + k·s an upper bound). */
  k: number;
  converged: boolean;
  iterations: number;
  /** |P(T ≤ k√n) − γ| at the returned k. */
  residual: number;
}

/**
 * One-sided normal tolerance factor k for sample size n, coverage p and confidence γ, by the
 * noncentral-t method: k = t'(γ; ν = n − 1, δ = z_p·√n)/√n, where t' is the γ quantile of the
 * noncentral t distribution and z_p the standard normal p quantile. With probability γ at least a
 * fraction p of a normal population lies above x̄ − k·s (s the sample standard deviation, n − 1
 * divisor).
 * Source: NIST/SEMATECH e-Handbook of Statistical Methods, §7.2.6.3 "Tolerance intervals for a
 * normal distribution" (exact one-sided factor via the noncentral t); tabulated in M. G. Natrella,
 * *Experimental Statistics*, NBS Handbook 91 (1963), Table A-7 and ISO 16269-6:2014, Annex tables.
 * The γ quantile is found by Brent's method on {@link noncentralTCdf}.
 * Units: none. Valid range: 2 ≤ n ≤ 10⁸, 0 < p < 1, 0 < γ < 1.
 * @throws InputError naming `n`, `coverage` or `confidence`; ComputationError if the root is not found.
 * @example normalToleranceFactor(10, 0.90, 0.95).k // 2.355 (Natrella, Table A-7)
 */
export function normalToleranceFactor(n: number, coverage: number, confidence: number, path = ''): ToleranceFactorResult {
  const at = (f: string) => (path ? `${path}.${f}` : f);
  if (!Number.isInteger(n) || n < 2 || n > 1e8) throw new InputError(at('n'), n, 'an integer in [2, 100000000]');
  checkRange(at('coverage'), coverage, 1e-6, 1 - 1e-9);
  checkRange(at('confidence'), confidence, 1e-6, 1 - 1e-9);
  const nu = n - 1;
  const sqn = Math.sqrt(n);
  const delta = normalQuantile(coverage) * sqn;
  const f = (k: number) => noncentralTCdf(k * sqn, nu, delta) - confidence;
  // Bracket: start at z_p (where the CDF is near 1/2) and widen until the sign changes.
  let a = delta / sqn - 1;
  let b = delta / sqn + 1;
  let fa = f(a);
  let fb = f(b);
  for (let i = 0; fa > 0 && i < 60; i++) { b = a; fb = fa; a -= 2 ** i; fa = f(a); }
  for (let i = 0; fb < 0 && i < 60; i++) { a = b; fa = fb; b += 2 ** i; fb = f(b); }
  if (fa > 0 || fb < 0) throw new ComputationError(at('k'), `could not bracket the tolerance factor (n = ${n}, p = ${coverage}, γ = ${confidence})`);
  const r = brent(f, a, b, 1e-10, 200);
  return { k: r.root, converged: r.converged, iterations: r.iterations, residual: Math.abs(r.residual) };
}
