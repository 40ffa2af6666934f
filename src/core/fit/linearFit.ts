import { InputError } from '../errors.js';

/** Result of an ordinary least-squares straight line y = intercept + slope·x. */
export interface LinearFit {
  slope: number;
  intercept: number;
  /** Coefficient of determination 1 − SSR/SST (1 for a perfect line; 0 when SST = 0 and SSR = 0 is reported as 1). */
  r2: number;
  /** Standard error of the slope, sqrt(s²/Sxx) with s² = SSR/(n − 2); 0 for n = 2. */
  slopeStandardError: number;
  interceptStandardError: number;
  /** Residual sum of squares. */
  ssr: number;
  n: number;
}

/**
 * Ordinary least-squares straight line through (x[i], y[i]) for i in [from, to).
 *
 * Formula: slope = Sxy/Sxx, intercept = ȳ − slope·x̄, with Sxx = Σ(x−x̄)², Sxy = Σ(x−x̄)(y−ȳ);
 * SE(slope) = sqrt(SSR/(n−2)/Sxx), SE(intercept) = sqrt(SSR/(n−2)·(1/n + x̄²/Sxx)).
 * Source: any statistics text, e.g. N. R. Draper and H. Smith, *Applied Regression Analysis*, 3rd ed.,
 * ch. 1 (eqs. 1.2.9, 1.4.1–1.4.5). Units: those of x and y. Valid: at least 2 points with distinct x.
 * Two-pass sums (means first) for numerical accuracy.
 * @throws InputError when fewer than 2 points or all x are equal.
 * @example linearFit([0, 1, 2], [1, 3, 5]) // { slope: 2, intercept: 1, r2: 1, ... }
 */
export function linearFit(x: ArrayLike<number>, y: ArrayLike<number>, from = 0, to = x.length): LinearFit {
  const n = to - from;
  if (n < 2) throw new InputError('points', n, 'at least 2 points for a straight line');
  let mx = 0;
  let my = 0;
  for (let i = from; i < to; i++) {
    mx += x[i]!;
    my += y[i]!;
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = from; i < to; i++) {
    const dx = x[i]! - mx;
    const dy = y[i]! - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (!(sxx > 0)) throw new InputError('x', mx, 'at least two distinct x values');
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  const ssr = Math.max(0, syy - slope * sxy);
  const s2 = n > 2 ? ssr / (n - 2) : 0;
  return {
    slope,
    intercept,
    r2: syy > 0 ? 1 - ssr / syy : 1,
    slopeStandardError: Math.sqrt(s2 / sxx),
    interceptStandardError: Math.sqrt(s2 * (1 / n + (mx * mx) / sxx)),
    ssr,
    n,
  };
}
