// The written-out normal equations of the Swift–Voce blend and of Hockett–Sherby
// (src/core/fit/lawNormalEquations.ts) against the general form through each law's point function
// (POINT, whose derivatives test/core/fit/fitter.test.ts checks against central differences): the
// same cost, JᵀWJ and JᵀWr, bit for bit, on random data and parameters (seeded), weighted or not.
import { describe, expect, it } from 'vitest';
import { xoshiro128ss } from '../../../src/core/index.js';
import { lawBounds } from '../../../src/core/fit/fitLaw.js';
import { lawData, lawNormalProblem, lawValues, pointProblem } from '../../../src/core/fit/lawNormalEquations.js';
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

// Speed follow-up K moved the data loops of every `normal` into functions of their own and split lawValues into one
// function per law (so the engine does not give up on code compiled before it ran). The former single-loop forms
// are kept here as references: every law's normal equations and values must be the same bits.
type Pt = (x: number, lx: number, p: Float64Array, gr: Float64Array) => number;
const swiftAt = (x: number, p: Float64Array, o: number, c: number, gr: Float64Array, at: number) => {
  const K = p[o]!, k = p[o + 2]!;
  const u = p[o + 1]! + x, lu = Math.log(u), P = Math.exp(k * lu), s = K * P;
  gr[at] = c * P; gr[at + 1] = (c * k * s) / u; gr[at + 2] = c * s * lu;
  return s;
};
const voceAt = (x: number, p: Float64Array, o: number, c: number, gr: Float64Array, at: number) => {
  const Q = p[o + 1]!, b = p[o + 2]!;
  const E = Math.exp(-b * x), om = -Math.expm1(-b * x);
  gr[at] = c; gr[at + 1] = c * om; gr[at + 2] = c * Q * x * E;
  return p[o]! + Q * om;
};
const FORMER_POINT: Record<string, Pt> = {
  hollomon: (_x, lx, p, gr) => { const P = Math.exp(p[1]! * lx), s = p[0]! * P; gr[0] = P; gr[1] = s * lx; return s; },
  ludwik: (_x, lx, p, gr) => { const P = Math.exp(p[2]! * lx), kp = p[1]! * P; gr[0] = 1; gr[1] = P; gr[2] = kp * lx; return p[0]! + kp; },
  swift: (x, _lx, p, gr) => swiftAt(x, p, 0, 1, gr, 0),
  voce: (x, _lx, p, gr) => voceAt(x, p, 0, 1, gr, 0),
  hockettSherby: (_x, lx, p, gr) => {
    const sat = p[0]!, s0 = p[1]!, a = p[2]!;
    const d = sat - s0, X = Math.exp(p[3]! * lx), E = Math.exp(-a * X), dE = d * E;
    gr[0] = 1 - E; gr[1] = E; gr[2] = dE * X; gr[3] = dE * a * X * lx;
    return d > 0 ? sat - dE : NaN;
  },
  swiftVoce: (x, _lx, p, gr) => {
    const al = p[0]!;
    const S = swiftAt(x, p, 1, al, gr, 1);
    const V = voceAt(x, p, 4, 1 - al, gr, 4);
    gr[0] = S - V;
    return al * S + (1 - al) * V;
  },
};
/** The former `normal` of pointProblem: one loop over the data, then the mirror, in one function. */
function formerNormal(law: string, d: { x: Float64Array; y: Float64Array; w: Float64Array | null; lx: Float64Array }, p: Float64Array, m: number, A: Float64Array, g: Float64Array): number {
  const pt = FORMER_POINT[law]!, gr = new Float64Array(m), { x, y, w, lx } = d, n = x.length;
  A.fill(0); g.fill(0);
  let s = 0;
  for (let i = 0; i < n; i++) {
    const r = pt(x[i]!, lx[i]!, p, gr) - y[i]!;
    const wi = w ? w[i]! : 1;
    s += wi * r * r;
    for (let a = 0; a < m; a++) {
      const ga = wi * gr[a]!;
      g[a] = g[a]! + ga * r;
      for (let b = 0; b <= a; b++) A[a * m + b] = A[a * m + b]! + ga * gr[b]!;
    }
  }
  for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) A[b * m + a] = A[a * m + b]!;
  return Number.isFinite(s) ? s : Infinity;
}

describe('lawNormalProblem and lawValues: the same bits as the former single-loop forms (speed follow-up K)', () => {
  const laws: LawName[] = ['hollomon', 'ludwik', 'swift', 'voce', 'hockettSherby', 'swiftVoce'];
  for (const law of laws) {
    it(`${law}: normal equations and values on 100 seeded weighted and unweighted curves`, () => {
      const r = xoshiro128ss(700 + law.length);
      const { lower, upper } = lawBounds(law);
      let finite = 0;
      for (let t = 0; t < 100; t++) {
        const n = 5 + (r.nextU32() % 300);
        const x = Float64Array.from({ length: n }, (_, i) => 1e-4 + (i + r.nextFloat()) * 0.5 / n);
        const y = Float64Array.from(x, (e) => 200 + 400 * Math.pow(e, 0.2) + 5 * (r.nextFloat() - 0.5));
        const w = t % 2 ? Float64Array.from(x, () => 1 + (r.nextU32() % 50)) : null;
        const d = lawData(x, y, w);
        // Parameters inside the box, in each law's plausible region.
        const p = Float64Array.from(lower, (lo, j) => lo + (Math.min(upper[j]!, lo + 1000) - lo) * r.nextFloat());
        if (law === 'hollomon') { p[0] = 300 + 600 * r.nextFloat(); p[1] = 0.05 + 0.5 * r.nextFloat(); }
        if (law === 'ludwik') { p[0] = 100 + 200 * r.nextFloat(); p[1] = 300 + 600 * r.nextFloat(); p[2] = 0.1 + 0.6 * r.nextFloat(); }
        if (law === 'swift') { p[0] = 300 + 600 * r.nextFloat(); p[1] = 0.001 + 0.05 * r.nextFloat(); p[2] = 0.05 + 0.5 * r.nextFloat(); }
        if (law === 'voce') { p[0] = 100 + 300 * r.nextFloat(); p[1] = 50 + 300 * r.nextFloat(); p[2] = 1 + 40 * r.nextFloat(); }
        if (law === 'hockettSherby') { p[0] = 500 + 300 * r.nextFloat(); p[1] = 100 + 300 * r.nextFloat(); p[2] = 0.5 + 20 * r.nextFloat(); p[3] = 0.3 + 1.2 * r.nextFloat(); }
        if (law === 'swiftVoce') { p[0] = r.nextFloat(); p[2] = 0.001 + 0.05 * r.nextFloat(); p[3] = 0.05 + 0.5 * r.nextFloat(); p[6] = 1 + 40 * r.nextFloat(); }
        for (let j = 0; j < p.length; j++) p[j] = Math.min(upper[j]!, Math.max(lower[j]!, p[j]!));
        const prob = lawNormalProblem(law, d, lower, upper), m = prob.m;
        const A1 = new Float64Array(m * m), g1 = new Float64Array(m), A2 = new Float64Array(m * m), g2 = new Float64Array(m);
        const s1 = prob.normal(p, A1, g1), s2 = formerNormal(law, d, p, m, A2, g2);
        expect(Object.is(s1, s2), `sum, case ${t}`).toBe(true);
        for (let k = 0; k < m * m; k++) if (!Object.is(A1[k], A2[k])) expect(A1[k], `A[${k}], case ${t}`).toBe(A2[k]);
        for (let k = 0; k < m; k++) if (!Object.is(g1[k], g2[k])) expect(g1[k], `g[${k}], case ${t}`).toBe(g2[k]);
        // Values: the former lawValues is POINT's value (the same operations).
        const out = new Float64Array(n), gr = new Float64Array(m);
        lawValues(law, d.x, d.lx, p, out);
        for (let i = 0; i < n; i++) {
          const v = FORMER_POINT[law]!(d.x[i]!, d.lx[i]!, p, gr);
          if (!Object.is(out[i], v)) expect(out[i], `value ${i}, case ${t}`).toBe(v);
        }
        if (Number.isFinite(s1)) finite++;
      }
      expect(finite).toBeGreaterThan(80); // finite sums, not Infinity against Infinity
    });
  }
});
