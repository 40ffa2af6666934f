import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { coldWorkWindow, makeLaw, strainForHardness, taborHardness, type LawSpec } from '../../../src/core/index.js';
import { expectRelClose } from '../../helpers.js';

// One law of each kind (illustrative parameters chosen for this test, near the flow-law tests' samples; not a material).
const LAWS: LawSpec[] = [
  { law: 'hollomon', K: 530, n: 0.44 },
  { law: 'ludwik', sigma0: 200, K: 400, n: 0.5 },
  { law: 'swift', K: 600, eps0: 0.01, n: 0.2 },
  { law: 'voce', sigma0: 200, Q: 150, b: 10 },
  { law: 'hockettSherby', sigmaSat: 400, sigma0: 150, a: 5, p: 0.8 },
  { law: 'swiftVoce', K: 600, eps0: 0.01, n: 0.2, sigma0: 200, Q: 150, b: 10, alpha: 0.5 },
];

describe('Tabor hardness: invariants over every law', () => {
  it('HV never falls as strain accumulates (the window\'s closed form relies on it)', () => {
    fc.assert(fc.property(fc.constantFrom(...LAWS), fc.double({ min: 0, max: 2, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }),
      fc.double({ min: 1, max: 5, noNaN: true }), fc.double({ min: 0, max: 0.3, noNaN: true }), (spec, e, de, c, er) => {
        const law = makeLaw(spec);
        const m = { taborFactor: c, representativeStrain: er };
        expect(taborHardness(law, e + de, m)).toBeGreaterThanOrEqual(taborHardness(law, e, m));
      }));
  });
  it('strainForHardness(taborHardness(ε̄)) = ε̄ where the law is strictly rising', () => {
    fc.assert(fc.property(fc.constantFrom(...LAWS), fc.double({ min: 0.001, max: 0.8, noNaN: true }), (spec, e) => {
      const law = makeLaw(spec);
      const m = { taborFactor: 2.8, representativeStrain: 0.08 };
      if (!(law.slope(e + 0.08) > 1e-6 * law.stress(e + 0.08))) return; // flat (saturated): the inverse is ill-conditioned
      const back = strainForHardness(law, taborHardness(law, e, m), m);
      expect(back).not.toBeNull();
      expectRelClose(back!, e, 1e-6, spec.law);
    }));
  });
  it('a window from hardness targets holds at its ends for every law', () => {
    fc.assert(fc.property(fc.constantFrom(...LAWS), fc.double({ min: 0.01, max: 0.4, noNaN: true }), (spec, e) => {
      const law = makeLaw(spec);
      const hv = taborHardness(law, e);
      const w = coldWorkWindow(law, 0, { minHardnessHV: hv * 0.999, maxHardnessHV: hv * 1.001 }, null);
      expect(w.empty).toBe(false);
      expect(w.strainFrom!).toBeLessThanOrEqual(e + 1e-9);
      expect(w.strainTo === null || w.strainTo >= e - 1e-9).toBe(true);
    }));
  });
});
