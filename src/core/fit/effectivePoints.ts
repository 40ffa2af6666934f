/** The effective number of independent points of a residual series and how it was found. */
export interface EffectivePoints {
  /** Lag-1 sample autocorrelation of the residuals, r₁ = Σ rᵢrᵢ₋₁ / Σ rᵢ² (residuals of a least-squares fit have mean ≈ 0). */
  lag1: number;
  /** n·(1 − ρ)/(1 + ρ) with ρ = max(0, r₁), at least 1 and at most n. */
  effectiveN: number;
  /** sqrt(n / effectiveN): the factor by which independent-point standard errors are widened. */
  inflation: number;
}

/**
 * Effective number of independent points of n residuals that are autocorrelated like a first-order
 * autoregressive series with lag-1 correlation ρ: n_eff = n·(1 − ρ)/(1 + ρ).
 * Closely spaced points of a tensile record (100,000 points where the load cell and extensometer
 * resolve far fewer independent values, plus any misfit of the law) give residuals that are not
 * independent; treating them as independent makes standard errors too small by about sqrt(n/n_eff).
 * Negative ρ is taken as 0 (never narrows an interval). ρ is capped at 0.9999 so n_eff stays ≥ 1
 * for long series.
 * Sources (from memory, not looked up): N. S. Bayley and J. M. Hammersley, "The 'effective' number
 * of independent observations in an autocorrelated time series", J. R. Stat. Soc. Suppl. 8 (1946)
 * 184–197; C. S. Bretherton et al., J. Climate 12 (1999) 1990–2009, eq. 30 (the AR(1) form above).
 * Units: dimensionless. Valid: n ≥ 2, ssr > 0.
 * @example effectivePoints(1000, 100, 90) // lag1 0.9, effectiveN ≈ 52.6, inflation ≈ 4.36
 */
export function effectivePoints(n: number, ssr: number, lag1Sum: number): EffectivePoints {
  const q = ssr > 0 && n > 1 ? lag1Sum / ssr : 0;
  // A non-finite ratio (residuals that overflowed) is taken as no correlation, never passed on as NaN.
  const r1 = Number.isFinite(q) ? q : 0;
  const rho = Math.min(0.9999, Math.max(0, r1));
  const effectiveN = Math.min(n, Math.max(1, (n * (1 - rho)) / (1 + rho)));
  return { lag1: r1, effectiveN, inflation: Math.sqrt(n / effectiveN) };
}
