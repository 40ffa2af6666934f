// firstAtOrAbove (the elastic band's "first sample at or above a level", twenty-fourth session): block maxima and a scan
// inside the block must give the index the former bisection over the running maximum of every sample gave (kept below
// as the reference), on seeded rises with noise, plateaus, drops and ties, for levels below, inside and above the data.
import { describe, expect, it } from 'vitest';
import { xoshiro128ss } from '../../../src/core/index.js';
import { firstAtOrAbove } from '../../../src/core/tensile/elasticModulus.js';

/** The former lookup: running maximum by Math.max, bisection for the first index where it reaches the level. */
function reference(stress: ArrayLike<number>, m: number, level: number): number {
  const run = new Float64Array(m);
  let top = stress[0]!;
  for (let i = 0; i < m; i++) { top = Math.max(top, stress[i]!); run[i] = top; }
  let lo = 0, hi = m;
  while (lo < hi) { const mid = (lo + hi) >> 1; if (run[mid]! >= level) hi = mid; else lo = mid + 1; }
  return lo;
}

describe('firstAtOrAbove(stress, m)(level)', () => {
  it('the documented example (hand-checked)', () => {
    expect(firstAtOrAbove([1, 3, 2, 5], 4)(2.5)).toBe(1);
    expect(firstAtOrAbove([1, 3, 2, 5], 4)(6)).toBe(4);
    expect(firstAtOrAbove([1, 3, 2, 5], 3)(4)).toBe(3); // past m: not found
  });
  it('equals the bisection over the running maximum on 300 seeded rises (1 to 5,000 samples, 40 levels each)', () => {
    const r = xoshiro128ss(77);
    for (let t = 0; t < 300; t++) {
      const n = 1 + (r.nextU32() % 5000);
      const noise = 20 * r.nextFloat(), drop = r.nextU32() % 3 === 0;
      const s = Float64Array.from({ length: n }, (_, i) => {
        const e = i / n, v = e < 0.3 ? 1000 * e : 300 + 100 * (e - 0.3);
        return (drop && e > 0.3 && e < 0.4 ? v - 30 : v) + noise * (r.nextFloat() - 0.5);
      });
      if (t % 5 === 0) for (let i = 0; i < n; i += 7) s[i] = Math.round(s[i]! / 10) * 10; // ties
      const m = 1 + (r.nextU32() % n);
      const f = firstAtOrAbove(s, m);
      for (let k = 0; k < 40; k++) {
        const level = k === 0 ? s[r.nextU32() % n]! : -50 + 500 * r.nextFloat();
        expect(f(level), `rise ${t}, m ${m}, level ${level}`).toBe(reference(s, m, level));
      }
    }
  });
});
