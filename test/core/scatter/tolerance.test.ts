import { describe, expect, it } from 'vitest';
import { noncentralTCdf, normalCdf, normalQuantile, normalSampler, normalToleranceFactor, orderStatisticLowerRank, xoshiro128ss } from '../../../src/core/index.js';
import { expectAbsClose, expectRelClose } from '../../helpers.js';

// One-sided normal tolerance factors k (lower bound x̄ − k·s), as printed to 3 decimals in
// M. G. Natrella, *Experimental Statistics*, NBS Handbook 91 (1963), Table A-7 (from Lieberman 1958).
// The printed values below are FROM MEMORY (the table was not at hand); each is therefore also
// checked against an independent computation, SciPy 1.10.1 `scipy.stats.nct.ppf(γ, n−1, z_p·√n)/√n`
// (Debian python3-scipy, run 2026-12-01; 6 decimals kept), and by a Monte Carlo coverage check below.
// Tolerance against the printed table: half a unit in the last printed place (0.0005), i.e. the
// table's own rounding. Against SciPy: 2·10⁻⁵ relative (Φ here is good to ~10⁻⁷; measured agreement
// is ~10⁻⁶).
const NATRELLA_A7: Array<[n: number, p: number, gamma: number, k: number]> = [
  [5, 0.90, 0.95, 3.407], [5, 0.95, 0.95, 4.203], [5, 0.99, 0.95, 5.741],
  [10, 0.90, 0.95, 2.355], [10, 0.95, 0.95, 2.911], [10, 0.99, 0.95, 3.981],
  [20, 0.90, 0.95, 1.926], [20, 0.95, 0.95, 2.396], [20, 0.99, 0.95, 3.295],
  [30, 0.90, 0.95, 1.777], [30, 0.95, 0.95, 2.220], [30, 0.99, 0.95, 3.064],
  [10, 0.90, 0.99, 3.048], [10, 0.95, 0.99, 3.738],
];
const SCIPY: Array<[n: number, p: number, gamma: number, k: number]> = [
  [3, 0.90, 0.95, 6.155281], [3, 0.99, 0.99, 23.895563],
  [5, 0.90, 0.90, 2.742348], [10, 0.90, 0.90, 2.065668], [10, 0.95, 0.90, 2.568373],
  [10, 0.90, 0.95, 2.354640], [15, 0.95, 0.95, 2.566000], [20, 0.99, 0.99, 3.831558],
  [50, 0.90, 0.95, 1.645565], [100, 0.95, 0.95, 1.926539], [100, 0.99, 0.99, 2.849648],
];

describe('normalToleranceFactor(n, coverage, confidence)', () => {
  for (const [n, p, g, k] of NATRELLA_A7) {
    it(`n ${n}, p ${p}, γ ${g} gives ${k} as printed in Natrella NBS Handbook 91 Table A-7 (from memory)`, () => {
      const r = normalToleranceFactor(n, p, g);
      expect(r.converged).toBe(true);
      expectAbsClose(r.k, k, 0.0005, `k(${n}, ${p}, ${g})`);
    });
  }
  for (const [n, p, g, k] of SCIPY) {
    it(`n ${n}, p ${p}, γ ${g} gives ${k} as SciPy's noncentral t computes`, () => {
      expectRelClose(normalToleranceFactor(n, p, g).k, k, 2e-5, `k(${n}, ${p}, ${g})`);
    });
  }
  it('tends to z_p as n grows (the limit of the noncentral-t method; z_0.90 = 1.281552, Abramowitz & Stegun Table 26.5)', () => {
    const k = normalToleranceFactor(1_000_000, 0.9, 0.95).k;
    // Large-n expansion k ≈ z_p + z_γ·√(1/n + z_p²/(2n)) (NIST e-Handbook §7.2.6.3 approximation): 1.281552 + 0.00227.
    expectAbsClose(k, 1.281552 + 1.644854 * Math.sqrt(1e-6 + (1.281552 ** 2) / 2e6), 2e-5, 'k(1e6)');
  });
  it('covers: x̄ − k·s lies below the 10 % point of N(0,1) in 95 % of seeded samples of 10 (Monte Carlo, 20000 trials)', () => {
    // Independent of the quadrature: draws samples of n = 10 and counts. Binomial sd of the rate
    // √(0.95·0.05/20000) = 0.0015; tolerance 4 sd = 0.006.
    const k = normalToleranceFactor(10, 0.9, 0.95).k;
    const z = normalSampler(xoshiro128ss(20261201));
    const q10 = -1.2815516; // 10 % point of N(0,1), Abramowitz & Stegun Table 26.5
    let ok = 0;
    const trials = 20000;
    for (let t = 0; t < trials; t++) {
      let s1 = 0, s2 = 0;
      const xs: number[] = [];
      for (let i = 0; i < 10; i++) { const x = z(); xs.push(x); s1 += x; }
      const m = s1 / 10;
      for (const x of xs) s2 += (x - m) ** 2;
      if (m - k * Math.sqrt(s2 / 9) <= q10) ok++;
    }
    expectAbsClose(ok / trials, 0.95, 0.006, 'coverage rate');
  });
  it('rejects n 1, coverage 1 and confidence 0 naming the field, value and range', () => {
    expect(() => normalToleranceFactor(1, 0.9, 0.95)).toThrow(/n: got 1, allowed an integer in \[2/);
    expect(() => normalToleranceFactor(10, 1, 0.95)).toThrow(/coverage: got 1, allowed a number in/);
    expect(() => normalToleranceFactor(10, 0.9, 0)).toThrow(/confidence: got 0, allowed/);
  });
});

describe('noncentralTCdf(t, ν, δ)', () => {
  it('with δ = 0 is Student t: P(T ≤ 2.262) = 0.975 for ν = 9 (Student t table, e.g. Abramowitz & Stegun Table 26.10)', () => {
    expectAbsClose(noncentralTCdf(2.262157, 9, 0), 0.975, 2e-6, 't 9 df');
  });
  it('matches SciPy nct.cdf(3, 5, 1.5) = 0.8402053 (scipy.stats.nct, 1.10.1, run 2026-12-01)', () => {
    expectAbsClose(noncentralTCdf(3, 5, 1.5), SCIPY_NCT_CDF_3_5_15, 2e-6, 'nct cdf');
  });
});
const SCIPY_NCT_CDF_3_5_15 = 0.8402053;

describe('normalCdf and normalQuantile', () => {
  it('normalQuantile(0.95) = 1.644854 and normalCdf(1.959964) = 0.975 (Abramowitz & Stegun, Table 26.5)', () => {
    expectAbsClose(normalQuantile(0.95), 1.6448536, 5e-7, 'z0.95');
    expectAbsClose(normalCdf(1.959964), 0.975, 2e-7, 'Φ(1.96)');
  });
});

describe('orderStatisticLowerRank(n, coverage, confidence)', () => {
  it('needs 59 observations for a 95 %/95 % bound from the smallest (Wilks 1941; common practice "59 runs")', () => {
    expect(orderStatisticLowerRank(59, 0.95, 0.95)).toBe(1);
    expect(orderStatisticLowerRank(58, 0.95, 0.95)).toBeNull();
  });
  it('needs 29 observations for 90 %/95 % (1 − 0.9^29 = 0.953 ≥ 0.95 > 1 − 0.9^28 = 0.948, computed)', () => {
    expect(orderStatisticLowerRank(29, 0.9, 0.95)).toBe(1);
    expect(orderStatisticLowerRank(28, 0.9, 0.95)).toBeNull();
  });
  it('for n 1000, p 0.9, γ 0.95 gives the rank whose binomial tail just reaches γ (checked by direct summation)', () => {
    const r = orderStatisticLowerRank(1000, 0.9, 0.95)!;
    const tail = (rr: number) => { // P(B ≥ rr), B ~ Bin(1000, 0.1), by direct summation of pmf
      let s = 0;
      for (let k = rr; k <= 1000; k++) s += Math.exp(lnChoose(1000, k) + k * Math.log(0.1) + (1000 - k) * Math.log(0.9));
      return s;
    };
    expect(tail(r)).toBeGreaterThanOrEqual(0.95);
    expect(tail(r + 1)).toBeLessThan(0.95);
    // Normal approximation of the rank: 100 − 1.645·√90 ≈ 84.4 (mean nq, sd √(nqp)), so r is in the 80s.
    expect(r).toBeGreaterThan(80);
    expect(r).toBeLessThan(88);
  });
});
function lnChoose(n: number, k: number): number {
  let s = 0;
  for (let i = 1; i <= k; i++) s += Math.log((n - k + i) / i);
  return s;
}
