import { describe, expect, it } from 'vitest';
import { normalSampler, xoshiro128ss } from '../../../src/core/index.js';
import { forceMaximum } from '../../../src/core/tensile/forceMaximum.js';

// INVENTED tops with a known maximum, to check the top model itself (the property and hold-out tests check it inside
// the whole analysis). Engineering strain in fractions, stress in MPa.

/** A top at (xv, rm): left s = rm − cL·d² (a flat hardening side), right s = rm − cR·d² (necking), Gaussian noise sd. */
function top(seed: number, n: number, xv: number, rm: number, cL: number, cR: number, sd: number) {
  const gauss = normalSampler(xoshiro128ss(seed));
  const strain = new Float64Array(n), stress = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = xv - 0.1 + (0.14 * i) / (n - 1), d = x - xv;
    strain[i] = x; stress[i] = rm - (d < 0 ? cL : cR) * d * d + sd * gauss();
  }
  return { strain, stress };
}

// Noise-free tolerances: 0.05 point of Ag (an eighth of issue 12's 0.4) and 0.05 MPa of Rm: the model holds these
// tops exactly (kinked: a parabola each side; smooth: a shared curvature and a cubic on the falling side), so what is
// left is the vertex search's resolution and the binning (≤ 1000 block averages).
describe('forceMaximum: the top of a record', () => {
  it('noise-free: Rm and the strain at maximum force of a kinked top (flat hardening side, steep necking side) to 0.05 point', () => {
    const r = top(1, 2000, 0.25, 500, 200, 6000, 0);
    const fm = forceMaximum(r.strain, r.stress, 1e-9, 0, r.strain.length);
    expect(Math.abs(fm.stress - 500)).toBeLessThan(0.05);
    expect(Math.abs(fm.strain - 0.25)).toBeLessThan(5e-4);
  });
  it('noisy kinked tops: the vertex is not pulled early (a side that rose past the vertex read it 1–7 points early)', () => {
    // 40 seeds, 1,500 samples over 14 % strain, noise 0.8 % of Rm: the flat hardening side is level within the noise
    // for about ±6 % strain, so only the steep side places the maximum. Measured mean error: the unbounded model of
    // before (each side free to rise past the vertex) −2.4 points; the bounded kinked model alone −0.2; the
    // Akaike-weighted mean with the smooth top, as shipped, −0.6 (the smooth shape pulls a strongly kinked top
    // early: the price of its gain on smooth tops, see forceMaximum.ts). Held at 1 point, and the 95 % interval
    // holds the truth on at least 34 of 40 (39 measured).
    let sum = 0, inside = 0;
    for (let s = 0; s < 40; s++) {
      const r = top(100 + s, 1500, 0.25, 500, 100, 8000, 4);
      const fm = forceMaximum(r.strain, r.stress, 4, 0, r.strain.length);
      sum += fm.strain - 0.25;
      if (fm.strainInterval95[0] <= 0.25 && 0.25 <= fm.strainInterval95[1]) inside++;
      expect(Math.abs(fm.stress / 500 - 1)).toBeLessThan(0.004);
    }
    expect(Math.abs(sum / 40)).toBeLessThan(0.01);
    expect(inside).toBeGreaterThanOrEqual(34);
  });
  it('a smooth top (same curvature both sides, a cubic necking term): the vertex to 0.05 point without noise', () => {
    const g = (x: number) => { const d = x - 0.2; return 600 - 300 * d * d - (d > 0 ? 4000 * d * d * d : 0); };
    const n = 3000, strain = new Float64Array(n), stress = new Float64Array(n);
    for (let i = 0; i < n; i++) { strain[i] = 0.1 + (0.16 * i) / (n - 1); stress[i] = g(strain[i]!); }
    const fm = forceMaximum(strain, stress, 1e-9, 0, n);
    expect(Math.abs(fm.strain - 0.2)).toBeLessThan(5e-4);
    expect(Math.abs(fm.stress - 600)).toBeLessThan(0.05);
  });
});

// Real records are not equally noisy everywhere: the open 42CrMoS4 record 46NT71 (MaterialDigital, CC BY 4.0) scatters
// 1–3 MPa about a local smooth on its elastic rise and while it necks (a machine control oscillation), 0.1–0.3 MPa around
// its maximum; the record-wide estimate (the median over its blocks) reads 1.7 MPa. The top is fitted with the noise of
// its own span where that span holds enough samples for the block estimate (128 or more).
describe('forceMaximum: the noise of the top itself', () => {
  it('a quiet top in a noisy record: the 95 % interval of Ag as with the top\'s own noise, not the record-wide one (8× larger)', () => {
    for (let seed = 1; seed <= 20; seed++) {
      const r = top(seed, 3000, 0.25, 500, 600, 6000, 0.25);
      const own = forceMaximum(r.strain, r.stress, 0.25, 0, r.strain.length);
      const wide = forceMaximum(r.strain, r.stress, 2.0, 0, r.strain.length);
      const w = (f: typeof own) => f.strainInterval95[1] - f.strainInterval95[0];
      // With the record-wide 2 MPa (before) the interval was 1.8–2.2× as wide on these seeds (measured).
      expect(Math.abs(w(wide) - w(own)), `seed ${seed}`).toBeLessThanOrEqual(0.1 * w(own));
      expect(wide.strainInterval95[0] - 1e-12, `seed ${seed}`).toBeLessThanOrEqual(0.25 + 0.004);
      expect(wide.strainInterval95[1] + 1e-12, `seed ${seed}`).toBeGreaterThanOrEqual(0.25 - 0.004);
    }
  });
});
