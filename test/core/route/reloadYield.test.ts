import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  evaluateRoute, forcePeaks, hockettSherby, hollomon, makeLaw, PROOF_OFFSET, reloadYield, strainForReloadYield,
  type LawSpec, type Material, type Step, type Targets,
} from '../../../src/core/index.js';
import { analyzeRecord } from '../../../src/core/index.js';
import { parseRecordText } from '../../../src/records/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// Reload yield = the engineering 0.2 % proof strength on the formed part's own section (issue 14).
// Sources of the definitions checked here:
// - ISO 6892-1 §3.10.3 (proof strength, plastic extension): Rp0.2 is force over the ORIGINAL section
//   of the specimen; the formed part is that specimen, so Rp0.2 = F/A₁ at 0.2 % further plastic strain.
// - Constant volume (Dieter, *Mechanical Metallurgy*, 3rd ed., §8-3): A = A₁·e^(−(ε − ε̄)), so the
//   engineering stress of that test is σ(ε)·e^(ε̄ − ε) and Rm is its maximum over ε ≥ ε̄ (ISO 6892-1:
//   Rm = maximum force over the original section).
// Hence Rp0.2 = σ(ε̄ + 0.002)·e^(−0.002) ≤ Rm for every law: checked here over all six laws, random
// routes and (partial) anneals, with Rm compared to a brute-force maximum of that curve.
const SEED = 20261202;

const lawArb: fc.Arbitrary<LawSpec> = fc.oneof(
  fc.record({ law: fc.constant('hollomon' as const), K: fc.double({ min: 100, max: 3000, noNaN: true }), n: fc.double({ min: 0.02, max: 1, noNaN: true }) }),
  fc.record({ law: fc.constant('ludwik' as const), sigma0: fc.double({ min: 0, max: 800, noNaN: true }), K: fc.double({ min: 50, max: 2000, noNaN: true }), n: fc.double({ min: 0.05, max: 1, noNaN: true }) }),
  fc.record({ law: fc.constant('swift' as const), K: fc.double({ min: 100, max: 3000, noNaN: true }), eps0: fc.double({ min: 0, max: 0.3, noNaN: true }), n: fc.double({ min: 0.02, max: 1, noNaN: true }) }),
  fc.record({ law: fc.constant('voce' as const), sigma0: fc.double({ min: 0, max: 800, noNaN: true }), Q: fc.double({ min: 0, max: 600, noNaN: true }), b: fc.double({ min: 0.5, max: 200, noNaN: true }) }),
  // p over the whole allowed range (0, 2]: p > 1 is an S-shaped curve whose force can peak twice.
  fc.record({ law: fc.constant('hockettSherby' as const), sigma0: fc.double({ min: 0, max: 500, noNaN: true }), sigmaSat: fc.double({ min: 520, max: 1500, noNaN: true }), a: fc.double({ min: 0.5, max: 30, noNaN: true }), p: fc.double({ min: 0.2, max: 2, noNaN: true }) }),
  fc.record({ law: fc.constant('swiftVoce' as const), alpha: fc.double({ min: 0, max: 1, noNaN: true }), K: fc.double({ min: 100, max: 3000, noNaN: true }), eps0: fc.double({ min: 0.001, max: 0.05, noNaN: true }), n: fc.double({ min: 0.05, max: 0.6, noNaN: true }), sigma0: fc.double({ min: 50, max: 800, noNaN: true }), Q: fc.double({ min: 20, max: 600, noNaN: true }), b: fc.double({ min: 1, max: 60, noNaN: true }) }),
);

const formStep: fc.Arbitrary<Step> = fc.oneof(
  fc.record({ kind: fc.constant('roll' as const), reductionPct: fc.double({ min: 0, max: 60, noNaN: true }) }),
  fc.record({ kind: fc.constant('stretch' as const), strain: fc.double({ min: 0, max: 0.4, noNaN: true }) }),
  fc.record({ kind: fc.constant('strain' as const), strain: fc.double({ min: 0, max: 1.2, noNaN: true }) }),
  fc.record({ kind: fc.constant('strain' as const), strain: fc.double({ min: 0, max: 0.01, noNaN: true }) }),
);
const annealStep: fc.Arbitrary<Step> = fc.oneof(
  fc.constant({ kind: 'anneal' as const }),
  fc.record({ kind: fc.constant('anneal' as const), softeningFraction: fc.double({ min: 0.01, max: 1, noNaN: true }) }),
);
const routeArb = fc.array(fc.oneof({ weight: 4, arbitrary: formStep }, { weight: 1, arbitrary: annealStep }), { minLength: 1, maxLength: 10 });

const material = (spec: LawSpec): Material => ({ name: 'm', elasticModulus: 200000, poissonRatio: 0.3, law: makeLaw(spec) });

/** Brute force: the largest engineering stress σ(ε)·e^(ε̄ − ε) of a tensile test of state ε̄, ε on a fine grid. */
function bruteRm(law: Material['law'], eps: number): number {
  let best = -Infinity;
  // 0.0005 steps up to 3 past ε̄, then coarser to 10 (Considère points of these laws lie below 3).
  for (let e = eps; e <= eps + 3; e += 0.0005) best = Math.max(best, law.stress(e) * Math.exp(eps - e));
  for (let e = eps + 3; e <= eps + 10; e += 0.01) best = Math.max(best, law.stress(e) * Math.exp(eps - e));
  for (const pk of forcePeaks(law)) if (pk >= eps) best = Math.max(best, law.stress(pk) * Math.exp(eps - pk));
  return best;
}

describe('reloadYield(law, ε̄) = σ(ε̄ + 0.002)·e^(−0.002)', () => {
  it('Hollomon closed form, Callister annealed copper K 530 MPa, n 0.44 (Callister 2nd ed. p. 199)', () => {
    // Hand value: 530·0.202^0.44·e^(−0.002) = 261.6748 MPa (ISO 6892-1 offset 0.2 %, constant volume);
    // 2e-7 is the rounding of the hand value to 4 decimals.
    expectRelClose(reloadYield(hollomon({ K: 530, n: 0.44 }), 0.2), 261.6748, 2e-7);
  });
  it('strainForReloadYield inverts it: ε̄ = σ⁻¹(Y·e^0.002) − 0.002', () => {
    fc.assert(fc.property(lawArb, fc.double({ min: 0, max: 1.5, noNaN: true }), (spec, eps) => {
      const law = makeLaw(spec);
      fc.pre(law.slope(eps + PROOF_OFFSET) > 1e-6 * law.stress(eps + PROOF_OFFSET));
      const back = strainForReloadYield(law, reloadYield(law, eps));
      expect(back).not.toBeNull();
      expect(Math.abs(back! - eps)).toBeLessThan(1e-7 * (1 + eps));
    }), { seed: SEED, numRuns: 400 });
  });
});

describe('ledger: Rp0.2 ≤ Rm at every step (fast-check, all six laws, routes with full and partial anneals)', () => {
  it('reload yield ≤ tensile strength, yield ratio ≤ 1, and Rm is the true maximum of the test curve', () => {
    fc.assert(fc.property(lawArb, routeArb, (spec, steps) => {
      const m = material(spec);
      const l = evaluateRoute({ material: m, start: { thickness: 3 }, steps });
      for (const r of [l.initial, ...l.rows]) {
        // No clamp hides a failure here: the raw values, with one part in 10¹² for rounding.
        expect(r.reloadYield).toBeLessThanOrEqual(r.tensileStrength * (1 + 1e-12));
        // yieldRatio is clamped to ≤ 1 by construction, so "≤ 1" could not fail: check it is the ratio itself.
        expect(r.yieldRatio).toBe(Math.min(1, r.reloadYield / r.tensileStrength));
        const eps = 'accumulatedStrain' in r ? r.accumulatedStrain : 0;
        const brute = bruteRm(m.law, eps);
        expect(r.tensileStrength).toBeGreaterThanOrEqual(brute * (1 - 1e-12));
        expect(r.tensileStrength).toBeLessThanOrEqual(brute * (1 + 1e-5)); // grid step 0.0005: error ≪ 1e-5
      }
    }), { seed: SEED, numRuns: 250 });
  });
  it('closed form for Hollomon and Voce at every row: K(ε̄+0.002)ⁿ·e^(−0.002), (σ0 + Q(1 − e^(−b(ε̄+0.002))))·e^(−0.002)', () => {
    const hv = fc.oneof(
      fc.record({ law: fc.constant('hollomon' as const), K: fc.double({ min: 100, max: 3000, noNaN: true }), n: fc.double({ min: 0.02, max: 1, noNaN: true }) }),
      fc.record({ law: fc.constant('voce' as const), sigma0: fc.double({ min: 0, max: 800, noNaN: true }), Q: fc.double({ min: 0, max: 600, noNaN: true }), b: fc.double({ min: 0.5, max: 200, noNaN: true }) }),
    );
    fc.assert(fc.property(hv, routeArb, (spec, steps) => {
      const l = evaluateRoute({ material: material(spec), start: { thickness: 3 }, steps });
      for (const r of l.rows) {
        const e = r.accumulatedStrain + 0.002;
        const sigma = spec.law === 'hollomon' ? spec.K * e ** spec.n : spec.sigma0 + spec.Q * (1 - Math.exp(-spec.b * e));
        expectRelClose(r.reloadYield, sigma * Math.exp(-0.002), 1e-13, `${spec.law} row ${r.index}`);
      }
    }), { seed: SEED, numRuns: 200 });
  });
  it('an S-shaped Hockett–Sherby law (p = 2) whose force falls at yield and peaks again keeps Rp0.2 ≤ Rm', () => {
    // σ = 1000 − 800·exp(−5ε²): dσ/dε − σ < 0 at yield, > 0 later; the maximum force (ISO 6892-1 Rm,
    // Ag read there) is at the later peak, where dσ/dε = σ again (Considère).
    const law = hockettSherby({ sigmaSat: 1000, sigma0: 200, a: 5, p: 2 });
    const eu = law.uniformStrain();
    expect(forcePeaks(law)).toEqual([eu]);
    expect(Math.abs(law.slope(eu) - law.stress(eu))).toBeLessThan(1e-9 * law.stress(eu));
    expect(law.stress(eu) * Math.exp(-eu)).toBeGreaterThan(law.stress(0)); // above the force at yield
    const l = evaluateRoute({ material: { name: 's', elasticModulus: 200000, law }, start: {}, steps: [{ kind: 'strain', strain: 0.1 }] });
    const r = l.rows[0]!;
    expect(r.reloadYield).toBeLessThanOrEqual(r.tensileStrength);
    expect(r.tensileStrength).toBeGreaterThan(r.flowStress); // the later force peak, not σ(ε̄)
  });
  it('open data: an S-shaped Hockett–Sherby fit (p > 1) of 42CrMoS4 reproduces the producers\' Rm and Ag, with Rp0.2 < Rm', () => {
    // Fraunhofer IWM / IWT Bremen, Platform MaterialDigital, demodata_tensiletest_42CrMoS4 (CC BY 4.0,
    // test/fixtures/42crmos4/ATTRIBUTION.md): reported Rm and Ag in each file's header. The two 850 °C
    // specimens fit Hockett–Sherby with p ≈ 1.3–1.4, whose force falls just after yield (first
    // Considère point 0). Read at the maximum force instead, the law gives Rm within 0.7 % and Ag within
    // 0.8 points of the reported values (measured 0.65 %/0.59 % and +0.14/−0.80 points); tolerances
    // 1.5 % and 1.0 point. Taking the first Considère point would give Ag 0 and Rm ≈ σ(0), 5 % low.
    for (const f of ['46NT71.csv', '46NT73.csv']) {
      const rec = parseRecordText(readFileSync(join(import.meta.dirname, '..', '..', 'fixtures', '42crmos4', f), 'utf8'), { file: f });
      const ref = (k: string) => Number(rec.metadata.get(k)!.value);
      const fit = analyzeRecord(rec, {}).fits!.fits.find((x) => x.law === 'hockettSherby')!;
      expect(fit.converged).toBe(true);
      expect(fit.params.p!).toBeGreaterThan(1);
      const law = makeLaw({ law: 'hockettSherby', ...fit.params } as LawSpec);
      const l = evaluateRoute({ material: { name: f, elasticModulus: 200000, law }, start: {}, steps: [] });
      expectRelClose(l.initial.tensileStrength, ref('ultimate tensile strength'), 0.015, `${f} Rm`);
      expectAbsClose(l.initial.remainingUniformElongationPct, ref('uniform elongation'), 1.0, `${f} Ag`);
      expect(l.initial.reloadYield).toBeLessThan(l.initial.tensileStrength);
    }
  });
});

describe('cold-work window ends invert the same reload yield (a plan at each end meets its target to 1e-6)', () => {
  const targetsArb: fc.Arbitrary<Targets> = fc.record({
    minYield: fc.option(fc.double({ min: 50, max: 1500, noNaN: true }), { nil: undefined }),
    maxYield: fc.option(fc.double({ min: 50, max: 2500, noNaN: true }), { nil: undefined }),
    minTensile: fc.option(fc.double({ min: 50, max: 1500, noNaN: true }), { nil: undefined }),
    minRemainingElongationPct: fc.option(fc.double({ min: 0, max: 40, noNaN: true }), { nil: undefined }),
  }).map((t) => Object.fromEntries(Object.entries(t).filter(([, v]) => v !== undefined)) as Targets)
    .filter((t) => Object.keys(t).length > 0 && !(t.minYield !== undefined && t.maxYield !== undefined && t.minYield > t.maxYield));

  it('running the route at the window\'s lower and upper strain meets every target, the limiting one at margin ≈ 0', () => {
    let ends = 0;
    fc.assert(fc.property(lawArb, fc.double({ min: 0, max: 0.8, noNaN: true }), fc.double({ min: 0.05, max: 1, noNaN: true }), targetsArb, (spec, pre, f, targets) => {
      const m = material(spec);
      const route = (s: number): Step[] => [{ kind: 'strain', strain: pre }, { kind: 'anneal', softeningFraction: f }, { kind: 'strain', strain: s }];
      const w = evaluateRoute({ material: m, start: {}, steps: route(0), targets }).coldWorkWindow;
      fc.pre(!w.empty);
      const check = (s: number, limiting: string | null) => {
        fc.pre(s <= 5);
        const l = evaluateRoute({ material: m, start: {}, steps: route(s), targets });
        for (const t of l.targets) {
          const scale = Math.max(1, Math.abs(t.limit));
          expect(t.margin, `${t.name} at strain ${s}`).toBeGreaterThanOrEqual(-1e-6 * scale);
          if (t.name === limiting) { expect(Math.abs(t.margin), `${t.name} at its own window end`).toBeLessThanOrEqual(1e-6 * scale); ends++; }
        }
      };
      if (w.strainFrom! > 0) check(w.strainFrom!, w.limitedBy.from);
      if (w.strainTo !== null) check(w.strainTo, w.limitedBy.to);
    }), { seed: SEED, numRuns: 400 });
    expect(ends).toBeGreaterThan(50); // the property did exercise window ends
  });
});
