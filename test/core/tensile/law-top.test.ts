import { describe, expect, it } from 'vitest';
import { LAW_NAMES, makeLaw, synthesizeLabRecord, xoshiro128ss, analyzeRecord, lawData, type LawSpec } from '../../../src/core/index.js';
import { lawTopPlasticStrain, lawUniformElongation } from '../../../src/core/tensile/lawTop.js';
import { LAW_GATE_CHI2 } from '../../../src/core/tensile/forceMaximum.js';
import { errorFunction } from 'simple-statistics';
import type { LawFit } from '../../../src/core/fit/types.js';
import { labCase } from './lab-records.helpers.js';

// One INVENTED parameter set per law (engineering-metal magnitudes).
const LAWS: LawSpec[] = [
  { law: 'hollomon', K: 530, n: 0.22 },
  { law: 'ludwik', sigma0: 250, K: 500, n: 0.45 },
  { law: 'swift', K: 600, eps0: 0.01, n: 0.2 },
  { law: 'voce', sigma0: 250, Q: 200, b: 12 },
  { law: 'hockettSherby', sigmaSat: 520, sigma0: 240, a: 6, p: 0.8 },
  { law: 'swiftVoce', alpha: 0.5, K: 600, eps0: 0.01, n: 0.2, sigma0: 250, Q: 200, b: 12 },
];
const E = 200000;

describe('lawTopPlasticStrain: where a law with elastic strain reaches maximum engineering stress', () => {
  it('Hollomon: εu = n·(1 − σ/E), and εu → n as E → ∞ (Considère: necking at ε = n for Kεⁿ; Dieter, Mechanical Metallurgy)', () => {
    const L = makeLaw({ law: 'hollomon', K: 530, n: 0.22 });
    const eu = lawTopPlasticStrain(L, E)!;
    expect(Math.abs(eu - 0.22 * (1 - L.stress(eu) / E))).toBeLessThan(1e-12);
    expect(Math.abs(lawTopPlasticStrain(L, 1e15)! - 0.22)).toBeLessThan(1e-9);
  });
  for (const spec of LAWS) {
    it(`${spec.law}: the highest engineering stress s = σ·exp(−εp − σ/E) on a 1e-6 grid lies within one step of it`, () => {
      const L = makeLaw(spec);
      const eu = lawTopPlasticStrain(L, E)!;
      let best = 0, bestS = -Infinity;
      for (let k = 1; k <= 1_000_000; k++) { const ep = k * 1e-6; const s = L.stress(ep) * Math.exp(-ep - L.stress(ep) / E); if (s > bestS) { bestS = s; best = ep; } }
      expect(Math.abs(eu - best)).toBeLessThanOrEqual(1.5e-6);
    });
  }
});

describe('lawTopPlasticStrain: a law whose hardening rate starts at zero is left out', () => {
  it('Hockett–Sherby with p > 1 (as fitted to the open 42CrMoS4 record 46NT71): null, though its engineering stress has a maximum', () => {
    const L = makeLaw({ law: 'hockettSherby', sigmaSat: 1303, sigma0: 1133, a: 73, p: 1.28 });
    expect(lawTopPlasticStrain(L, E)).toBeNull();
    // The maximum exists (past the start where σ' < σ): the null is a choice, documented in lawTop.ts.
    let up = false;
    for (let k = 1; k <= 2000 && !up; k++) { const ep = k * 1e-4; up = L.slope(ep) * (1 - L.stress(ep) / E) > L.stress(ep); }
    expect(up).toBe(true);
  });
});

describe('lawUniformElongation: Ag from the fitted laws, only inside the top model\'s interval', () => {
  const fit = (spec: LawSpec, aic: number) => ({ law: spec.law, params: { ...spec }, converged: true, aic } as unknown as LawFit);
  const agOf = (spec: LawSpec) => { const L = makeLaw(spec); const ep = lawTopPlasticStrain(L, E)!; const s = L.stress(ep); const e = Math.expm1(ep + s / E); return (e - s / (1 + e) / E) * 100; };
  it('the Akaike-weighted mean of the laws inside the interval; null pct when those hold less than half the weight', () => {
    const a = fit(LAWS[2]!, 0), b = fit(LAWS[3]!, 2); // weights 1 : e⁻¹
    const agA = agOf(LAWS[2]!), agB = agOf(LAWS[3]!);
    const both = lawUniformElongation([a, b], E, [Math.min(agA, agB) - 1, Math.max(agA, agB) + 1])!;
    const w = Math.exp(-1);
    expect(both.pct!).toBeCloseTo((agA + w * agB) / (1 + w), 10);
    // Only the worse law inside: it holds e⁻¹/(1 + e⁻¹) ≈ 27 % of the weight, too little.
    const lo = Math.min(agB - 0.01, agB + 0.01), hi = agB + 0.01;
    expect(Math.abs(agA - agB)).toBeGreaterThan(0.05);
    const onlyB = lawUniformElongation([a, b], E, [lo, hi])!;
    expect(onlyB.pct).toBeNull();
    expect(onlyB.laws.map((l) => l.inside)).toEqual([false, true]);
  });
});

describe('lawUniformElongation with the fitted data: the weights from the upper part of the curve', () => {
  // INVENTED curve: Swift K 600, ε0 0.01, n 0.22 up to its maximum of force, with a deterministic ±1 MPa scatter.
  // Two "fits": Swift at the true parameters but given the worse whole-curve criterion (AIC 1000 against 0), and a
  // Voce law that does not follow the curve. Over the whole curve's criteria the Voce law takes the weight; over the
  // upper part (0.3–0.9 of the largest plastic strain), where its residuals are far larger, Swift does.
  const swift: LawSpec = { law: 'swift', K: 600, eps0: 0.01, n: 0.22 };
  const voce: LawSpec = { law: 'voce', sigma0: 300, Q: 150, b: 15 };
  const S = makeLaw(swift);
  const top = lawTopPlasticStrain(S, E)!;
  const n = 4000;
  const x = Float64Array.from({ length: n }, (_, i) => 0.002 + ((top - 0.002) * i) / (n - 1));
  const y = Float64Array.from(x, (v, i) => S.stress(v) + Math.sin(1.7 * i));
  const fit = (spec: LawSpec, aic: number) => ({ law: spec.law, params: { ...spec }, converged: true, aic, basis: { held: [] } } as unknown as LawFit);
  const agOf = (spec: LawSpec) => { const L = makeLaw(spec); const ep = lawTopPlasticStrain(L, E)!; const s = L.stress(ep); const e = Math.expm1(ep + s / E); return (e - s / (1 + e) / E) * 100; };
  it('without the data: the whole-curve criteria (Voce); with them: Swift, and the range used is said', () => {
    const fits = [fit(swift, 1000), fit(voce, 0)];
    const wide: [number, number] = [0, 100];
    const plain = lawUniformElongation(fits, E, wide)!;
    expect(plain.upperPart).toBeNull();
    expect(plain.laws[1]!.weight).toBeCloseTo(1, 12);
    expect(plain.pct!).toBeCloseTo(agOf(voce), 10);
    const d = lawData(x, y);
    const upper = lawUniformElongation(fits, E, wide, d)!;
    expect(upper.upperPart![0]).toBeCloseTo(0.3 * d.hi, 15);
    expect(upper.upperPart![1]).toBeCloseTo(0.9 * d.hi, 15);
    expect(upper.laws[0]!.weight).toBeCloseTo(1, 12);
    expect(upper.pct!).toBeCloseTo(agOf(swift), 10);
    expect(Math.abs(agOf(swift) - agOf(voce))).toBeGreaterThan(1);
  });
  it('used only where the laws inside the interval hold at least half of the weight over the whole curve too', () => {
    // Only Swift's Ag inside: over the upper part it holds all the weight, over the whole curve none (Voce's AIC 0).
    const d = lawData(x, y);
    const onlySwift: [number, number] = [agOf(swift) - 0.01, agOf(swift) + 0.01];
    expect(agOf(voce) < onlySwift[0] || agOf(voce) > onlySwift[1]).toBe(true);
    const r = lawUniformElongation([fit(swift, 1000), fit(voce, 0)], E, onlySwift, d)!;
    expect(r.laws[0]!.weight).toBeCloseTo(1, 12);
    expect(r.laws[0]!.inside).toBe(true);
    expect(r.pct).toBeNull();
    // Both criteria agreeing (Swift's whole-curve AIC the better): used.
    expect(lawUniformElongation([fit(swift, 0), fit(voce, 1000)], E, onlySwift, d)!.pct!).toBeCloseTo(agOf(swift), 10);
  });
  it('the criterion is m·ln(SSR/m) + 2k over that part: two laws fitting it equally well are weighted by their parameter counts alone', () => {
    // The same curve given twice: as a three-parameter Swift, and as a Swift–Voce blend with α = 1 (pure Swift, seven
    // parameters): the same residuals, so the weights differ by the penalty 2k alone.
    const sv: LawSpec = { law: 'swiftVoce', alpha: 1, K: 600, eps0: 0.01, n: 0.22, sigma0: 300, Q: 150, b: 15 };
    const d = lawData(x, y);
    const r = lawUniformElongation([fit(swift, 0), fit(sv, 0)], E, [0, 100], d)!;
    // Equal residuals; Swift–Voce has 7 parameters, Swift 3: weights 1 : e^(−4).
    const w = Math.exp(-4);
    expect(r.laws[0]!.weight).toBeCloseTo(1 / (1 + w), 9);
    expect(r.laws[1]!.weight).toBeCloseTo(w / (1 + w), 9);
  });
});

describe('Ag on the noise-free property-test records (INVENTED, labCase): the laws read the top exactly', () => {
  it('Ag within 0.1 point of the truth (the curve\'s own maximum of force) on at least 239 of 240; the top model alone missed 73', () => {
    let off = 0;
    const worst: string[] = [];
    for (let seed = 0; seed < 240; seed++) {
      const c = labCase(seed);
      const rec = synthesizeLabRecord({ ...c.spec, noise: 0, rng: xoshiro128ss(seed) });
      let a;
      try { a = analyzeRecord(rec, { fit: false }); } catch { a = analyzeRecord(rec, { fit: false, elasticModulus: rec.truth.elasticModulus }); }
      const err = a.uniformElongationPct - rec.truth.uniformElongationPct;
      if (Math.abs(err) > 0.1) { off++; worst.push(`${c.what}: ${err.toFixed(3)}`); }
    }
    expect(off, worst.join('\n')).toBeLessThanOrEqual(1);
  }, 240_000);
});

describe("the laws' Ag gated by the top model's 99.9 % interval, not its 95 % one", () => {
  it('the gate is χ²₁(0.999): P(χ²₁ ≤ x) = erf(√(x/2)) = 0.999 (erf from npm simple-statistics 7.12.1, accurate to 1.2e-7)', () => {
    expect(Math.abs(errorFunction(Math.sqrt(LAW_GATE_CHI2 / 2)) - 0.999)).toBeLessThan(1e-5);
    // …and the 95 % interval's 3.84 the same way, so the two levels are what they say.
    expect(Math.abs(errorFunction(Math.sqrt(3.84 / 2)) - 0.95)).toBeLessThan(1e-4);
  });
  // Property-test records (INVENTED, labCase: Swift, and Ludwik with n 0.42–0.47) whose top model read Ag 0.9–1.5 points off,
  // with the laws outside its 95 % interval, while the laws fitted to the whole uniform curve read it within
  // 0.15–0.43 point: refused at 95 %, they are used at 99.9 %.
  for (const seed of [17, 57, 168]) {
    it(`seed ${seed}: Ag from the laws, within 0.45 point of the truth; the 95 % interval given is widened to hold it and holds the truth`, () => {
      const c = labCase(seed);
      const rec = synthesizeLabRecord({ ...c.spec, rng: xoshiro128ss(seed) });
      const a = analyzeRecord(rec);
      const fm = a.forceMaximum;
      const truth = rec.truth.uniformElongationPct;
      // The top model alone: off by more than 0.8 point.
      expect(Math.abs(fm.topModelUniformElongationPct - truth)).toBeGreaterThan(0.8);
      expect(fm.lawUniformElongation?.pct).not.toBeNull();
      expect(a.uniformElongationPct).toBe(fm.lawUniformElongation!.pct);
      expect(Math.abs(a.uniformElongationPct - truth)).toBeLessThan(0.45);
      const [lo, hi] = fm.uniformElongationInterval95;
      expect(a.uniformElongationPct).toBeGreaterThanOrEqual(lo);
      expect(a.uniformElongationPct).toBeLessThanOrEqual(hi);
      expect(truth).toBeGreaterThanOrEqual(lo);
      expect(truth).toBeLessThanOrEqual(hi);
    });
  }
});
