// The flow curve's logarithms taken once (speed follow-up J): lawDataLogged must pack what lawData packs, and
// nValueFromLogs must give what nValueFitLogs gives, bit for bit, on seeded curves (with bad points for lawData);
// and the n-value against a known power law (σ = 530·εp^0.44, values chosen by hand: n and K come back).
import { describe, expect, it } from 'vitest';
import { xoshiro128ss } from '../../../src/core/index.js';
import { lawData, lawDataLogged } from '../../../src/core/fit/lawNormalEquations.js';
import { nValueFitLogs, nValueFromLogs } from '../../../src/core/tensile/nValue.js';

describe('logs taken once for the law fits and the n-value', () => {
  it('lawDataLogged packs the same range, first bad point and ln x as lawData (200 seeded curves, some with bad points)', () => {
    const r = xoshiro128ss(31);
    for (let t = 0; t < 200; t++) {
      const n = 3 + (r.nextU32() % 500);
      const x = Float64Array.from({ length: n }, (_, i) => 1e-4 + i * 1e-3 * r.nextFloat());
      const y = Float64Array.from(x, (e) => 300 + 500 * Math.pow(e, 0.2));
      if (t % 4 === 1) y[r.nextU32() % n] = t % 8 === 1 ? -1 : 0;
      if (t % 4 === 2) x[r.nextU32() % n] = t % 8 === 2 ? Infinity : 0;
      const a = lawData(x, y), b = lawDataLogged(x, y, Float64Array.from(x, Math.log));
      expect([Object.is(a.lo, b.lo), Object.is(a.hi, b.hi), a.bad === b.bad, a.lx.every((v, i) => Object.is(v, b.lx[i]))], `curve ${t}`).toEqual([true, true, true, true]);
    }
  });
  it('nValueFromLogs equals nValueFitLogs bit for bit on curves with every point usable (100 seeded curves)', () => {
    const r = xoshiro128ss(32);
    for (let t = 0; t < 100; t++) {
      const n = 3 + (r.nextU32() % 2000);
      const x = Float64Array.from({ length: n }, (_, i) => 0.002 + i * 2e-4 + 1e-5 * r.nextFloat());
      const y = Float64Array.from(x, (e) => 600 * Math.pow(0.01 + e, 0.22) + (r.nextFloat() - 0.5));
      const d = lawData(x, y);
      const a = nValueFitLogs(x, y, d.lx), b = nValueFromLogs(d.lx, Float64Array.from(y, Math.log), d.lo, d.hi);
      expect(JSON.stringify(b), `curve ${t}`).toBe(JSON.stringify(a));
      expect(Object.is(a.n, b.n) && Object.is(a.K, b.K) && Object.is(a.r2, b.r2), `curve ${t}`).toBe(true);
    }
  });
  it('recovers n and K of an exact power law (σ = 530·εp^0.44, hand-chosen)', () => {
    const x = Float64Array.from({ length: 50 }, (_, i) => 0.01 + i * 0.004);
    const y = Float64Array.from(x, (e) => 530 * e ** 0.44);
    const f = nValueFromLogs(Float64Array.from(x, Math.log), Float64Array.from(y, Math.log), x[0]!, x[49]!);
    expect(Math.abs(f.n - 0.44)).toBeLessThan(1e-12);
    expect(Math.abs(f.K / 530 - 1)).toBeLessThan(1e-12);
  });
});
