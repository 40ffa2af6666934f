import { linearRegression } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { fitAllLaws, fitLaw, lawData, makeLaw } from '../../../src/core/index.js';
import { blendProjectedStart } from '../../../src/core/fit/blendProjection.js';
import { BLEND_ALPHA, hockettSherbyNearLudwik } from '../../../src/core/fit/fitAllLaws.js';
import { expectRelClose } from '../../helpers.js';

// INVENTED Voce-like curve with a little deterministic ripple (so the fit has residuals).
const eps = Array.from({ length: 120 }, (_, i) => 0.002 + (0.2 * i) / 119);
const sig = eps.map((e, i) => 250 + 180 * (1 - Math.exp(-12 * e)) + 1.5 * Math.sin(i * 1.7));

describe('fitLaw with a parameter held (the blend holds α)', () => {
  it('Voce with b held: σ0 and Q are the straight-line least squares of σ on 1 − e^(−bε) (simple-statistics linearRegression)', () => {
    const b = 10;
    const f = fitLaw('voce', eps, sig, { hold: { b } });
    // Reference: simple-statistics (npm) linearRegression, an ordinary least-squares line, intercept σ0, slope Q.
    const line = linearRegression(eps.map((e, i) => [1 - Math.exp(-b * e), sig[i]!]));
    expect(f.params.b).toBe(b);
    expectRelClose(f.params.sigma0!, line.b, 1e-7, 'sigma0');
    expectRelClose(f.params.Q!, line.m, 1e-7, 'Q');
    expect(f.standardErrors.b).toBeNull();
    expect(f.standardErrors.sigma0).toBeGreaterThan(0);
    expect(f.basis.held).toEqual(['b']);
    expect(f.warnings.map((w) => w.code)).not.toContain('atBound');
    // AIC counts the parameters fitted (two), not the law's three.
    const free = fitLaw('voce', eps, sig);
    expect(free.basis.held).toEqual([]);
    expectRelClose(f.aic - 2 * 2, f.points * Math.log((f.rmse * f.rmse)), 1e-9, 'AIC with k = 2');
  });

  it('a held value outside the range or an unknown name is refused with the allowed range', () => {
    expect(() => fitLaw('voce', eps, sig, { hold: { b: -1 } })).toThrow(/hold\.b.*\[/);
    expect(() => fitLaw('voce', eps, sig, { hold: { c: 1 } })).toThrow(/sigma0, Q, b/);
  });

  it('the Swift–Voce blend holds α at 0.5 and fits the other six, no worse than its Swift and Voce parts', () => {
    const f = fitLaw('swiftVoce', eps, sig, { hold: { alpha: BLEND_ALPHA }, start: { alpha: BLEND_ALPHA, ...fitLaw('swift', eps, sig).params, ...fitLaw('voce', eps, sig).params } });
    expect(f.params.alpha).toBe(0.5);
    expect(f.basis.held).toEqual(['alpha']);
    expect(f.rmse).toBeLessThanOrEqual(Math.min(fitLaw('voce', eps, sig).rmse, fitLaw('swift', eps, sig).rmse) * (1 + 1e-9));
  });
});

describe('hockettSherbyNearLudwik', () => {
  it('starts Hockett–Sherby where it equals the Ludwik fit to first order: off by h²/(2(σsat − σ0)) for hardening h (Taylor series of exp)', () => {
    const eL = Array.from({ length: 80 }, (_, i) => 0.003 + (0.15 * i) / 79);
    const sL = eL.map((e) => 900 + 400 * e ** 0.3);
    const lud = fitLaw('ludwik', eL, sL);
    const start = hockettSherbyNearLudwik(lud);
    expect(start.sigmaSat).toBe(1e5);
    const hs = makeLaw({ law: 'hockettSherby', ...start } as never);
    const ll = makeLaw({ law: 'ludwik', ...lud.params } as never);
    for (const e of eL) {
      const h = ll.stress(e) - lud.params.sigma0!;
      const gap = ll.stress(e) - hs.stress(e); // exp(−x) = 1 − x + x²/2 − …: Hockett–Sherby falls short by h²/(2(σsat − σ0))
      expectRelClose(gap, (h * h) / (2 * (start.sigmaSat! - start.sigma0!)), 0.01, `gap at ε ${e}`);
    }
  });
});

describe('the blend fitted by variable projection when its own fit crawls (blendProjectedStart)', () => {
  // INVENTED noise-free blend shaped like a real S275-class record (TS275_0003's SciPy optimum, its 113 points over
  // ε 0.0021–0.0465): the blend's own fit from the Swift and Voce fits crawls 500 steps without converging there.
  const truth = { alpha: 0.5, K: 1421, eps0: 0, n: 0.873, sigma0: 582, Q: 186, b: 38.5 };
  const law = makeLaw({ law: 'swiftVoce', ...truth });
  const x = Array.from({ length: 113 }, (_, i) => 0.0021 + (0.0444 * i) / 112);
  const y = x.map((e) => law.stress(e));

  it('fitAllLaws recovers the curve (RMSE < 1e-9 MPa), converged, and the six fitted parameters of the truth', () => {
    const f = fitAllLaws(x, y).fits.find((g) => g.law === 'swiftVoce')!;
    expect(f.converged).toBe(true);
    expect(f.rmse).toBeLessThan(1e-9);
    for (const k of ['K', 'n', 'sigma0', 'Q', 'b'] as const) expectRelClose(f.params[k]!, truth[k], 1e-6, k);
    expect(f.params.eps0).toBeLessThan(1e-9);
  });

  it('the projection alone, from the Swift and Voce fits, lands on the truth: c = (αK, (1−α)σ0, (1−α)Q) solved exactly', () => {
    const s = fitLaw('swift', x, y).params, v = fitLaw('voce', x, y).params;
    const p = blendProjectedStart(lawData(x, y), { eps0: s.eps0!, n: s.n!, b: v.b! }, 0.5)!;
    for (const k of ['K', 'n', 'sigma0', 'Q', 'b'] as const) expectRelClose(p[k]!, truth[k], 1e-5, k);
  });
});

describe('95 % intervals cut at the ends of a parameter\'s admissible range', () => {
  // INVENTED: a nearly flat Voce curve (Q 1.5 MPa over σ0 300) with a deterministic ripple, so b is barely
  // determined and value − t·SE falls below b's lower end, 0 (LAW_PARAMETERS: b > 0).
  const x = Array.from({ length: 120 }, (_, i) => 0.002 + (0.2 * i) / 119);
  const y = x.map((e, i) => 300 + 1.5 * (1 - Math.exp(-12 * e)) + 1.5 * Math.sin(i * 1.7));
  it('the lower end of b\'s interval is 0, not negative; its upper end and the uncut intervals stay value ± t·SE', () => {
    const f = fitLaw('voce', x, y);
    expect(f.converged).toBe(true);
    expect(f.basis.intervalsClipped).toEqual(['b']);
    const [lo, hi] = f.intervals95.b!;
    expect(lo).toBe(0);
    // The t quantile, from σ0's uncut interval (symmetric: half-width = t·SE).
    const [s0lo, s0hi] = f.intervals95.sigma0!;
    expectRelClose((s0hi - s0lo) / 2 / f.standardErrors.sigma0!, (hi - f.params.b!) / f.standardErrors.b!, 1e-9, 't from σ0 and from b\'s upper end');
    expect(f.params.b! - (hi - f.params.b!)).toBeLessThan(0); // the symmetric interval would have reached below 0
    expectRelClose(s0lo + s0hi, 2 * f.params.sigma0!, 1e-12, 'σ0 interval symmetric (not cut)');
  });
  it('a well-determined fit cuts nothing', () => {
    const f = fitLaw('voce', eps, sig);
    expect(f.basis.intervalsClipped).toEqual([]);
  });
});
