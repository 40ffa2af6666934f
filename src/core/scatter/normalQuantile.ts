import { brent } from '../numeric/brent.js';
import { checkRange, ComputationError } from '../errors.js';
import { normalCdf } from './normal.js';

/**
 * Standard normal quantile z_p = Φ⁻¹(p): the root of Φ(z) = p by Brent's method on [−9, 9], with Φ
 * from {@link normalCdf}. Written here because simple-statistics' `probit` uses a closed-form
 * approximation good to about 10⁻³ only; this one is as accurate as Φ (≈10⁻⁷ in z).
 * Units: none. Valid range: 10⁻¹² ≤ p ≤ 1 − 10⁻¹².
 * @throws InputError when p is outside that range.
 * @example normalQuantile(0.95) // 1.644854 (Abramowitz & Stegun, Table 26.5)
 */
export function normalQuantile(p: number, path = 'p'): number {
  checkRange(path, p, 1e-12, 1 - 1e-12);
  if (p === 0.5) return 0;
  const r = brent((z) => normalCdf(z) - p, -9, 9, 1e-14, 200);
  if (!r.converged) throw new ComputationError(path, `normal quantile did not converge (residual ${r.residual})`);
  return r.root;
}
