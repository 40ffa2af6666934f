import { describe, expect, it } from 'vitest';
import { analyzeRecord, makeLaw, normalSampler, xoshiro128ss } from '../../../src/core/index.js';

// Ag on INVENTED records whose necking branch has an inflection, as real ones do (the open 42CrMoS4 records: the
// load falls ever faster after maximum force, then at a nearly steady rate). The property test and both hold-outs
// fall ever faster to fracture; a top model tuned on them alone read Ag 0.2 point late on the real records (see
// DEVELOPERS.md, fifth session). Here: Swift hardening to Considère's maximum (found on a 8e-5 grid of plastic
// strain), then s = Rm + ½c·d² + k·d³ with c the hardening side's curvature at the top (smooth to the second
// derivative) and k putting the inflection at d_I, then a straight fall at the inflection's slope; 1,000–100,000
// points uniform in strain, white noise 0.1–1 % of Rm (the core's Box–Muller `normalSampler`); E given (200 GPa). Truth: Ag at the Considère maximum.
describe('Ag on 120 INVENTED records with an inflected necking branch', () => {
  it('mean error near zero; Ag off by more than 0.4 point held as a ceiling; the 95 % interval holds the truth when off', () => {
    const errs: number[] = []; let off = 0, out = 0;
    for (let seed = 0; seed < 120; seed++) {
      const r = xoshiro128ss(seed, 3); const u = (a: number, b: number) => a + (b - a) * r.nextFloat();
      const E = 200000, n = u(0.12, 0.35), K = u(500, 900), eps0 = u(0.003, 0.02);
      const L = makeLaw({ law: 'swift', K, eps0, n });
      const eng = (ep: number) => { const s = L.stress(ep), et = ep + s / E; return { e: Math.expm1(et), s: s / Math.exp(et) }; };
      // Considère: max of engineering stress over ep.
      let bestEp = 0, bestS = -1; for (let k = 1; k <= 20000; k++) { const ep = k * 1e-4 * 0.8; const v = eng(ep).s; if (v > bestS) { bestS = v; bestEp = ep; } }
      const top = eng(bestEp), eU = top.e, Rm = top.s;
      const hp = 1e-4; const spp = (eng(bestEp + hp).s - 2 * Rm + eng(bestEp - hp).s) / (hp * hp); const ep1 = (eng(bestEp + hp).e - eng(bestEp - hp).e) / (2 * hp);
      const c = spp / (ep1 * ep1); // d²s/de² < 0
      const dI = u(0.3, 0.8) * Math.max(eU, 0.05) * 0.5; // inflection distance
      // s = Rm + ½c d² + k d³ up to dI with s''(dI) = 0 → c + 6k dI = 0 → k = −c/(6 dI); then linear.
      const kk = -c / (6 * dI);
      const sI = Rm + 0.5 * c * dI * dI + kk * dI ** 3, slI = c * dI + 3 * kk * dI * dI;
      const eF = eU + dI + u(0.5, 1.5) * dI;
      const N = Math.round(10 ** u(3, 5)); const noise = Rm * u(0.001, 0.01);
      const strain = new Float64Array(N), stress = new Float64Array(N);
      const gauss = normalSampler(xoshiro128ss(seed + 1000));
      // Curve by engineering strain: elastic, then plastic (invert by bisection on ep), then necking.
      const sy = L.stress(0);
      for (let i = 0; i < N; i++) {
        const e = (eF * i) / (N - 1); let s;
        if (e <= sy / E) s = E * e;
        else if (e <= eU) { let lo = 0, hi = bestEp; for (let k = 0; k < 50; k++) { const m = 0.5 * (lo + hi); if (eng(m).e < e) lo = m; else hi = m; } s = eng(0.5 * (lo + hi)).s; }
        else { const d = e - eU; s = d <= dI ? Rm + 0.5 * c * d * d + kk * d ** 3 : sI + slI * (d - dI); }
        strain[i] = e; stress[i] = s + noise * gauss();
      }
      const agT = (eU - Rm / E) * 100;
      try {
        const a = analyzeRecord({ strain, stress }, { fit: false, elasticModulus: E });
        const err = a.uniformElongationPct - agT; errs.push(err);
        const [lo, hi] = a.forceMaximum.uniformElongationInterval95;
        if (Math.abs(err) > 0.4) { off++; if (!(lo <= agT && agT <= hi)) out++; }
      } catch (e) { throw new Error(`seed ${seed}: ${(e as Error).message}`); }
    }
    const m = errs.reduce((s, v) => s + v, 0) / errs.length, rms = Math.sqrt(errs.reduce((s, v) => s + v * v, 0) / errs.length);
    console.log(`inflected necking: ${errs.length} records, Ag error mean ${m.toFixed(3)} rms ${rms.toFixed(3)} point, off by more than 0.4 point ${off}, of which outside the 95 % interval ${out}`);
    // Measured 2026-12-03: mean −0.023, rms 0.48, off 28 of 120, outside 0. The mean is held within 0.1 point (a quarter
  // of issue 12's 0.4-point tolerance; its standard error over 120 records is 0.48/√120 ≈ 0.04): a systematic late
  // or early reading on inflected branches — what the wider necking reach did on the real records — fails it.
    expect(errs.length).toBe(120);
    expect(Math.abs(m)).toBeLessThan(0.1);
    // Seventh session, Ag from the fitted laws inside the top model's interval (lawTop.ts; the curve is Swift up to
    // maximum force): off 28 → 12, mean −0.018.
    expect(off).toBeLessThanOrEqual(12);
    expect(out).toBe(0);
  }, 600000);
});
