// fitLaw's coarse stage (COARSE_FIRST, coarseData): the Swift–Voce blend on a long curve is first solved on about
// REDUCTION_DEFAULTS.coarseBlocks weighted averages, and that solution starts the fit proper. Only the start may move:
// the fit must end where the solver ends from the usual start without the stage. Data INVENTED from known laws.
import { describe, expect, it } from 'vitest';
import { blockAverage, fitLaw, lawBounds, lawData, lawNormalProblem, levenbergMarquardtNormal, makeLaw, normalSampler, REDUCTION_DEFAULTS, xoshiro128ss } from '../../../src/core/index.js';
import { coarseData, COARSE_FIRST, fittedData } from '../../../src/core/fit/fitLaw.js';

describe('blockAverage with weights', () => {
  it('equals the plain block average of the points the weights count (each point repeated w times)', () => {
    const rng = xoshiro128ss(3);
    const x: number[] = [], y: number[] = [], w: number[] = [], X: number[] = [], Y: number[] = [];
    for (let i = 0; i < 60; i++) {
      const wi = 1 + Math.floor(rng.nextFloat() * 5);
      x.push(0.01 * i + 0.003 * rng.nextFloat()); y.push(400 + 50 * rng.nextFloat()); w.push(wi);
      for (let k = 0; k < wi; k++) { X.push(x[i]!); Y.push(y[i]!); }
    }
    const b = blockAverage(x, y, 6, w);
    expect(b.x.length).toBe(10);
    let at = 0;
    for (let g = 0; g < 10; g++) {
      const cnt = w.slice(6 * g, 6 * g + 6).reduce((s, v) => s + v, 0);
      const ref = blockAverage(X.slice(at, at + cnt), Y.slice(at, at + cnt), cnt);
      expect(b.w[g]).toBe(cnt);
      expect(Math.abs(b.x[g]! - ref.x[0]!)).toBeLessThan(1e-15);
      expect(Math.abs(b.y[g]! - ref.y[0]!)).toBeLessThan(1e-12);
      at += cnt;
    }
    // Without weights, the counts (the old behaviour, unchanged).
    expect(Array.from(blockAverage([1, 2, 3, 4], [10, 20, 30, 40], 2).w)).toEqual([2, 2]);
  });
});

describe('the coarse stage of the Swift–Voce blend', () => {
  it('ends at the minimum the fit proper reaches from the usual start without it, in far fewer steps on the full data', () => {
    expect(COARSE_FIRST.has('swiftVoce')).toBe(true);
    for (const [seed, n] of [[11, 100_000], [12, 30_000], [13, 3_000]] as const) {
      // A blend curve (α 0.5) with noise 1 MPa, INVENTED.
      const law = makeLaw({ law: 'swiftVoce', alpha: 0.5, K: 900, eps0: 0.008, n: 0.22, sigma0: 260, Q: 180, b: 18 });
      const z = normalSampler(xoshiro128ss(seed));
      const x = new Float64Array(n), y = new Float64Array(n);
      for (let i = 0; i < n; i++) { x[i] = 0.002 + (0.22 * i) / (n - 1); y[i] = law.stress(x[i]!) + z(); }
      const full = lawData(x, y);
      const fitted = fittedData(full);
      const coarse = coarseData(fitted)!;
      expect(coarse.x.length).toBeLessThanOrEqual(REDUCTION_DEFAULTS.coarseBlocks + 1);
      expect(coarse.x.length).toBeGreaterThan(REDUCTION_DEFAULTS.coarseBlocks / 2);
      // The fit as fitAllLaws makes it (α held) ...
      const swift = fitLaw('swift', x, y, { packed: full }), voce = fitLaw('voce', x, y, { packed: full });
      const start = { ...swift.params, ...voce.params, alpha: 0.5 };
      const f = fitLaw('swiftVoce', x, y, { packed: full, start, hold: { alpha: 0.5 } });
      // ... against the solver run from that start on the same fitted points with no coarse stage.
      const { lower, upper } = lawBounds('swiftVoce');
      lower[0] = upper[0] = 0.5;
      const names = ['alpha', 'K', 'eps0', 'n', 'sigma0', 'Q', 'b'];
      const p0 = names.map((k, j) => Math.min(upper[j]!, Math.max(lower[j]!, start[k as keyof typeof start]!)));
      const ref = levenbergMarquardtNormal(lawNormalProblem('swiftVoce', fitted, lower, upper), p0, { lower, upper });
      const cost = (p: ArrayLike<number>) => { const g = new Float64Array(49), gg = new Float64Array(7); return lawNormalProblem('swiftVoce', fitted, lower, upper).normal(Float64Array.from(p), g, gg); };
      const mine = cost(names.map((k) => f.params[k]!));
      expect(f.converged).toBe(true);
      // The same minimum of the fitted points' cost (1e-9: the solver's own stopping tolerance is 1e-10 of the cost).
      expect(Math.abs(mine / ref.residual - 1), `seed ${seed}`).toBeLessThan(1e-9);
      // Fewer steps on the fitted points: at most two thirds of those from the usual start (13 of 67, 15 of 45, 21 of 35).
      expect(f.iterations, `seed ${seed}: fine steps`).toBeLessThan((2 * ref.iterations) / 3);
    }
  });

  it('no coarse stage on short data (≤ 2 × coarseBlocks points) and none for the other laws', () => {
    expect(coarseData(lawData([0.01, 0.02, 0.03], [300, 310, 320]))).toBeNull();
    for (const l of ['hollomon', 'ludwik', 'swift', 'voce', 'hockettSherby'] as const) expect(COARSE_FIRST.has(l)).toBe(false);
  });
});
