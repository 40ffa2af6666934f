// Law fits on oversampled curves: block averages (REDUCTION_DEFAULTS) and intervals widened by the
// residuals' effective number of points (effectivePoints). Data are INVENTED from known laws with seeded noise.
import { sampleCorrelation } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { effectivePoints, fitLaw, lawBounds, lawModelFast, levenbergMarquardt, makeLaw, normalSampler, REDUCTION_DEFAULTS, xoshiro128ss } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

/** A Voce curve (σ0 300, Q 200, b 12 MPa — invented) at n strains with AR(1) noise of marginal sd `sd` and lag-1 correlation rho. */
function voceCurve(n: number, seed: number, rho: number, sd: number) {
  const rng = xoshiro128ss(seed);
  const z = normalSampler(rng);
  const law = makeLaw({ law: 'voce', sigma0: 300, Q: 200, b: 12 });
  const x = new Float64Array(n), y = new Float64Array(n), noise = new Float64Array(n);
  let e = z() * sd;
  for (let i = 0; i < n; i++) {
    if (i > 0) e = rho * e + Math.sqrt(1 - rho * rho) * sd * z();
    x[i] = 0.002 + (0.25 * i) / (n - 1);
    noise[i] = e;
    y[i] = law.stress(x[i]!) + e;
  }
  return { x, y, noise };
}

describe('effectivePoints(n, ssr, lag1Sum)', () => {
  it('is n(1 − ρ)/(1 + ρ) for AR(1) residuals (Bayley & Hammersley 1946; Bretherton et al. 1999 eq. 30 — from memory)', () => {
    const e = effectivePoints(1000, 100, 90);
    expectRelClose(e.lag1, 0.9, 1e-12, 'ρ');
    expectRelClose(e.effectiveN, (1000 * 0.1) / 1.9, 1e-12, 'n_eff');
    expectRelClose(e.inflation, Math.sqrt(19), 1e-12, 'inflation');
    // Negative correlation never narrows an interval.
    expect(effectivePoints(1000, 100, -50).effectiveN).toBe(1000);
  });

  it('the lag-1 autocorrelation a fit reports agrees with simple-statistics sampleCorrelation of the lagged residuals (npm simple-statistics 7.12.1)', () => {
    const { x, y } = voceCurve(3000, 5, 0.8, 1);
    const f = fitLaw('voce', x, y);
    const r = f.residuals;
    const ref = sampleCorrelation(r.slice(0, -1), r.slice(1));
    // Different normalisations (ours divides by Σr², theirs by the two lagged sums): 1 % at n = 3000.
    expectRelClose(f.basis.lag1Autocorrelation, ref, 0.01, 'lag-1 autocorrelation');
    expectRelClose(f.basis.lag1Autocorrelation, 0.8, 0.05, 'ρ put into the noise');
  });
});

describe('fitLaw on correlated residuals gives intervals that cover the truth', () => {
  it('Voce with AR(1) noise (ρ 0.95), 200 seeds: ≥ 88 % of the 95 % intervals of Q hold the true Q; independent-point intervals hold it far less often', () => {
    // Coverage is the definition of a confidence interval (common practice); with ρ 0.95 the
    // independent-point standard error is too small by about sqrt(39) ≈ 6, so its interval should
    // cover only about 2Φ(1.96/6) − 1 ≈ 26 % of the time.
    let honest = 0, naive = 0;
    const N = 200;
    for (let s = 1; s <= N; s++) {
      const { x, y } = voceCurve(1500, 1000 + s, 0.95, 1);
      const f = fitLaw('voce', x, y);
      expect(f.converged).toBe(true);
      const iv = f.intervals95.Q!;
      if (iv[0] <= 200 && 200 <= iv[1]) honest++;
      const se = f.standardErrorsIndependent.Q!;
      if (Math.abs(f.params.Q! - 200) <= 1.96 * se) naive++;
    }
    expect(honest / N).toBeGreaterThanOrEqual(0.88);
    expect(naive / N).toBeLessThan(0.5);
  });

  it('independent noise leaves the intervals as they were (inflation close to 1)', () => {
    const { x, y } = voceCurve(3000, 77, 0, 1);
    const f = fitLaw('voce', x, y);
    expect(f.basis.inflation).toBeLessThan(1.1);
  });
});

describe('fitLaw on a curve of more than REDUCTION_DEFAULTS.fitAllUpTo points fits block averages', () => {
  it('200,000 points: fitted on ~2000 block averages; RMSE on the full curve no worse than the noise put in and within 0.1 % of a point-by-point fit', () => {
    const { x, y, noise } = voceCurve(200_000, 9, 0, 1);
    const f = fitLaw('voce', x, y);
    expect(f.basis.blockSize).toBe(Math.ceil(200_000 / REDUCTION_DEFAULTS.blocks));
    expect(f.basis.fittedPoints).toBe(REDUCTION_DEFAULTS.blocks);
    expect(f.points).toBe(200_000);
    expect(f.residuals.length).toBe(200_000);
    // The least-squares optimum cannot have a larger SSR than the true law (the invented truth).
    let truthSsr = 0;
    for (const e of noise) truthSsr += e * e;
    const truthRmse = Math.sqrt(truthSsr / noise.length);
    expect(f.rmse).toBeLessThanOrEqual(truthRmse * (1 + 1e-6));
    // A point-by-point fit of all 200,000 (the general Levenberg–Marquardt with a full Jacobian).
    const { lower, upper } = lawBounds('voce');
    const ref = levenbergMarquardt(lawModelFast('voce', x), y, [f.params.sigma0!, f.params.Q!, f.params.b!].map((v) => v * 1.05), { lower, upper });
    const refRmse = Math.sqrt(ref.residual / y.length);
    expectRelClose(f.rmse, refRmse, 1e-3, 'RMSE block-average fit vs point-by-point');
    expectRelClose(f.params.Q!, 200, 0.01, 'Q recovered');
  });
});
