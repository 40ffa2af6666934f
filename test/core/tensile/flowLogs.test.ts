// The flow curve's logarithms (speed follow-ups J, K and the twenty-fourth session): lawDataLogged and lawDataRanged
// must pack what lawData packs (lawDataRanged's ln x made only when read), and the n-value from flowColumns' one-pass
// sums (nValueFromSums) must agree with the two-pass regression of nValueFit (linearFit: means first, Draper & Smith
// ch. 1) to 1e-12 on seeded curves; and the n-value of a known power law (σ = 530·εp^0.44, values chosen by hand).
import { describe, expect, it } from 'vitest';
import { synthesizeRecord, xoshiro128ss } from '../../../src/core/index.js';
import { lawData, lawDataLogged, lawDataRanged } from '../../../src/core/fit/lawNormalEquations.js';
import { flowColumns, type LogSums } from '../../../src/core/tensile/flowColumns.js';
import { nValueFit, nValueFromSums } from '../../../src/core/tensile/nValue.js';

/** The sums of LogSums by their definition (about the middle point's logarithms), written out here. */
function sumsOf(x: ArrayLike<number>, y: ArrayLike<number>): LogSums {
  const k = x.length, c = k >> 1, cx = Math.log(x[c]!), cy = Math.log(y[c]!);
  let sx = 0, sy = 0, sxx = 0, sxy = 0, syy = 0;
  for (let i = 0; i < k; i++) {
    const dx = Math.log(x[i]!) - cx, dy = Math.log(y[i]!) - cy;
    sx += dx; sy += dy; sxx += dx * dx; sxy += dx * dy; syy += dy * dy;
  }
  return { k, cx, cy, sx, sy, sxx, sxy, syy };
}
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

describe('logs for the law fits and the n-value', () => {
  it('lawDataLogged and lawDataRanged pack the same range, first bad point and ln x as lawData (200 seeded curves, some with bad points)', () => {
    const r = xoshiro128ss(31);
    for (let t = 0; t < 200; t++) {
      const n = 3 + (r.nextU32() % 500);
      const x = Float64Array.from({ length: n }, (_, i) => 1e-4 + i * 1e-3 * r.nextFloat());
      const y = Float64Array.from(x, (e) => 300 + 500 * Math.pow(e, 0.2));
      if (t % 4 === 1) y[r.nextU32() % n] = t % 8 === 1 ? -1 : 0;
      if (t % 4 === 2) x[r.nextU32() % n] = t % 8 === 2 ? Infinity : 0;
      const a = lawData(x, y), b = lawDataLogged(x, y, Float64Array.from(x, Math.log)), c = lawDataRanged(x, y, a.lo, a.hi, a.bad);
      expect([Object.is(a.lo, b.lo), Object.is(a.hi, b.hi), a.bad === b.bad, a.lx.every((v, i) => Object.is(v, b.lx[i]))], `curve ${t}`).toEqual([true, true, true, true]);
      expect(c.lx.length === n && a.lx.every((v, i) => Object.is(v, c.lx[i])), `curve ${t}: lawDataRanged's ln x`).toBe(true);
      expect(c.lx, 'made once').toBe(c.lx);
    }
  });
  it('nValueFromSums agrees with nValueFit to 1e-12 on flowColumns of 60 seeded records (noise, toe, 300–150,000 points)', () => {
    const r = xoshiro128ss(32);
    let long = 0;
    for (let t = 0; t < 60; t++) {
      // INVENTED records: Swift hardening, E 70–210 GPa, noise 0–3 MPa, steps giving 300 to 150,000 flow points.
      const E = 70_000 + 140_000 * r.nextFloat();
      const step = t % 4 === 0 ? 2e-6 : 2e-4 * (0.2 + r.nextFloat());
      const rec = synthesizeRecord({
        law: { law: 'swift', K: 500 + 400 * r.nextFloat(), eps0: 0.002 + 0.01 * r.nextFloat(), n: 0.05 + 0.4 * r.nextFloat() }, elasticModulus: E,
        rng: xoshiro128ss(2000 + t), noise: 3 * r.nextFloat(), step, necking: { extraStrain: 0.03, dropTo: 0.8 },
      });
      let iMax = 0;
      for (let i = 1; i < rec.stress.length; i++) if (rec.stress[i]! > rec.stress[iMax]!) iMax = i;
      const f = flowColumns(rec.strain, rec.stress, 0, E, iMax, 0, 0.002);
      expect(f.bad, `record ${t}`).toBe(-1);
      const a = nValueFromSums(f.logSums, f.lo, f.hi), b = nValueFit(f.strain, f.stress);
      expect([rel(a.n, b.n), rel(a.K, b.K), Math.abs(a.r2 - b.r2)].every((v) => v < 1e-12), `record ${t}: n ${a.n} vs ${b.n}, K ${a.K} vs ${b.K}, r2 ${a.r2} vs ${b.r2}`).toBe(true);
      expect([a.points, a.range], `record ${t}`).toEqual([b.points, b.range]);
      // the sums are the ones their definition gives
      const s = sumsOf(f.strain, f.stress);
      expect([f.logSums.k, f.logSums.cx, f.logSums.cy, f.logSums.sx, f.logSums.syy]).toEqual([s.k, s.cx, s.cy, s.sx, s.syy]);
      if (f.strain.length > 100_000) long++;
    }
    expect(long).toBeGreaterThanOrEqual(4);
  });
  it('recovers n and K of an exact power law (σ = 530·εp^0.44, hand-chosen)', () => {
    const x = Float64Array.from({ length: 50 }, (_, i) => 0.01 + i * 0.004);
    const y = Float64Array.from(x, (e) => 530 * e ** 0.44);
    const f = nValueFromSums(sumsOf(x, y), x[0]!, x[49]!);
    expect(Math.abs(f.n - 0.44)).toBeLessThan(1e-12);
    expect(Math.abs(f.K / 530 - 1)).toBeLessThan(1e-12);
    expect(f.r2).toBeCloseTo(1, 12);
  });
  it('refuses fewer than 3 points and equal strains, as nValueFit does', () => {
    expect(() => nValueFromSums(sumsOf([0.01, 0.02], [300, 310]), 0.01, 0.02)).toThrow(/at least 3 points/);
    expect(() => nValueFromSums(sumsOf([0.01, 0.01, 0.01], [300, 310, 320]), 0.01, 0.01)).toThrow(/two distinct x/);
  });
});
