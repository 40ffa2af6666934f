import { checkRange, InputError } from '../errors.js';

/**
 * Distribution-free one-sided lower tolerance bound: the rank r of the order statistic X₍ᵣ₎ (1 = the
 * smallest of n) that lies below the (1 − p) quantile of any continuous population with confidence
 * at least γ. P(X₍ᵣ₎ ≤ ξ₁₋ₚ) = P(B ≥ r), B ~ Binomial(n, 1 − p); the largest r with P(B ≥ r) ≥ γ is
 * returned, or null when even the smallest observation does not reach γ (n < ln(1 − γ)/ln p).
 * Source: S. S. Wilks, "Determination of sample sizes for setting tolerance limits", Ann. Math.
 * Statist. 12 (1941) 91–96; NIST/SEMATECH e-Handbook of Statistical Methods, §7.2.6.4
 * (tolerance intervals based on the largest and smallest observations). Binomial terms are summed
 * in log space, so n up to 10⁸ is fine.
 * Units: none. Valid range: integer n ≥ 1, 0 < p < 1, 0 < γ < 1.
 * @example orderStatisticLowerRank(59, 0.95, 0.95) // 1 (the smallest of 59 is a 95 %/95 % bound)
 * @example orderStatisticLowerRank(58, 0.95, 0.95) // null
 */
export function orderStatisticLowerRank(n: number, coverage: number, confidence: number, path = ''): number | null {
  const at = (f: string) => (path ? `${path}.${f}` : f);
  if (!Number.isInteger(n) || n < 1 || n > 1e8) throw new InputError(at('n'), n, 'an integer in [1, 100000000]');
  checkRange(at('coverage'), coverage, 1e-6, 1 - 1e-9);
  checkRange(at('confidence'), confidence, 1e-6, 1 - 1e-9);
  const q = 1 - coverage;
  const alpha = 1 - confidence;
  const logRatio = Math.log(q) - Math.log(coverage);
  let logPmf = n * Math.log(coverage); // P(B = 0)
  let cum = 0;
  let r = 0;
  for (let k = 0; k < n; k++) {
    cum += Math.exp(logPmf); // P(B ≤ k)
    if (cum > alpha) break;
    r = k + 1; // P(B ≥ k + 1) = 1 − P(B ≤ k) ≥ γ
    logPmf += Math.log((n - k) / (k + 1)) + logRatio;
  }
  return r >= 1 ? r : null;
}
