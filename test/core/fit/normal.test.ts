// The written-out normal equations of the Swift–Voce blend and of Hockett–Sherby
// (src/core/fit/lawNormalEquations.ts) against the general form through each law's point function
// (POINT, whose derivatives test/core/fit/fitter.test.ts checks against central differences): the
// same cost, JᵀWJ and JᵀWr, bit for bit, on random data and parameters (seeded), weighted or not.
import { describe, expect, it } from 'vitest';
import { xoshiro128ss } from '../../../src/core/index.js';
import { lawBounds } from '../../../src/core/fit/fitLaw.js';
import { lawData, lawNormalProblem, pointProblem } from '../../../src/core/fit/lawNormalEquations.js';
import type { LawName } from '../../../src/core/flow/types.js';

describe('lawNormalProblem: written-out loops equal the general form', () => {
  for (const law of ['swiftVoce', 'hockettSherby'] as LawName[]) {
    it(`${law}: cost and normal equations identical to pointProblem on 200 random weighted and unweighted curves`, () => {
      const r = xoshiro128ss(law.length);
      const { lower, upper } = lawBounds(law);
      let compared = 0;
      for (let t = 0; t < 200; t++) {
        const n = 5 + (r.nextU32() % 300);
        const x = Float64Array.from({ length: n }, (_, i) => 1e-4 + (i + r.nextFloat()) * 0.5 / n);
        const y = Float64Array.from(x, (e) => 200 + 400 * Math.pow(e, 0.2) + 5 * (r.nextFloat() - 0.5));
        const w = t % 2 ? Float64Array.from(x, () => 1 + (r.nextU32() % 50)) : null;
        const d = lawData(x, y, w);
        const p = Float64Array.from(lower, (lo, j) => {
          const hi = Math.min(upper[j]!, lo + 2000);
          return lo + (hi - lo) * r.nextFloat();
        });
        // Plausible blends often: alpha in (0, 1), small ε0, exponents below 1.
        if (law === 'swiftVoce') { p[0] = r.nextFloat(); p[2] = 0.001 + 0.05 * r.nextFloat(); p[3] = 0.05 + 0.5 * r.nextFloat(); p[6] = 1 + 40 * r.nextFloat(); }
        else { p[0] = 500 + 300 * r.nextFloat(); p[1] = 100 + 300 * r.nextFloat(); p[2] = 0.5 + 20 * r.nextFloat(); p[3] = 0.3 + 1.2 * r.nextFloat(); }
        const a = lawNormalProblem(law, d, lower, upper), b = pointProblem(law, d, lower, upper);
        const m = a.m;
        const A1 = new Float64Array(m * m), g1 = new Float64Array(m), A2 = new Float64Array(m * m), g2 = new Float64Array(m);
        const s1 = a.normal(p, A1, g1), s2 = b.normal(p, A2, g2);
        expect(Object.is(s1, s2), `normal's sum, case ${t}`).toBe(true);
        expect(Object.is(a.cost(p), b.cost(p)), `cost, case ${t}`).toBe(true);
        for (let k = 0; k < m * m; k++) if (!Object.is(A1[k], A2[k])) expect(A1[k], `A[${k}], case ${t}`).toBe(A2[k]);
        for (let k = 0; k < m; k++) if (!Object.is(g1[k], g2[k])) expect(g1[k], `g[${k}], case ${t}`).toBe(g2[k]);
        if (Number.isFinite(s1)) compared++;
      }
      expect(compared).toBeGreaterThan(150); // most cases are finite sums, so the comparison is not of Infinity with Infinity
    });
  }
});
