// The local models' written-out loops (speed follow-up J: movingAverage's full-window stretch, polynomialFit's
// parabola sums) against the general loops they replaced, kept here as the reference: the same numbers bit for
// bit on random data (seeded), and the documented examples (hand-computed).
import { describe, expect, it } from 'vitest';
import { xoshiro128ss } from '../../../src/core/index.js';
import { averageTopSpan, movingAverage, polynomialFit } from '../../../src/core/tensile/localFit.js';

/** The former movingAverage: one loop, window bounds by Math.max/min, a running sum. */
function movingAverageReference(y: ArrayLike<number>, from: number, to: number, w: number): Float64Array {
  const n = to - from;
  const out = new Float64Array(Math.max(0, n));
  const half = Math.max(0, (w - 1) >> 1);
  let lo = 0, hi = -1, sum = 0;
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - half), b = Math.min(n - 1, i + half);
    while (hi < b) sum += y[from + ++hi]!;
    while (lo < a) sum -= y[from + lo++]!;
    out[i] = sum / (hi - lo + 1);
  }
  return out;
}

/** The former general point sums of polynomialFit and its residual sum, for degree `deg`. */
function polySumsReference(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, deg: number, c: readonly number[]) {
  const n = to - from, m = deg + 1;
  let xm = 0;
  for (let i = from; i < to; i++) xm += x[i]!;
  xm /= n;
  let h = 0;
  for (let i = from; i < to; i++) h = Math.max(h, Math.abs(x[i]! - xm));
  const S = new Float64Array(2 * m - 1), T = new Float64Array(m);
  for (let i = from; i < to; i++) {
    const u = (x[i]! - xm) / h, v = y[i]!;
    let p = 1;
    for (let k = 0; k < 2 * m - 1; k++) { S[k]! += p; if (k < m) T[k]! += v * p; p *= u; }
  }
  // The former elimination (partial pivoting, as polynomialFit solves it) on these sums.
  const A: number[][] = [];
  for (let r = 0; r < m; r++) { const row: number[] = []; for (let q = 0; q < m; q++) row.push(S[r + q]!); row.push(T[r]!); A.push(row); }
  for (let q = 0; q < m; q++) {
    let piv = q;
    for (let r = q + 1; r < m; r++) if (Math.abs(A[r]![q]!) > Math.abs(A[piv]![q]!)) piv = r;
    [A[q], A[piv]] = [A[piv]!, A[q]!];
    for (let r = 0; r < m; r++) {
      if (r === q) continue;
      const f = A[r]![q]! / A[q]![q]!;
      for (let k = q; k <= m; k++) A[r]![k]! -= f * A[q]![k]!;
    }
  }
  const coef = A.map((row, r) => row[m]! / row[r]!);
  let ssr = 0;
  for (let i = from; i < to; i++) {
    const u = (x[i]! - xm) / h;
    let v = 0;
    for (let k = m - 1; k >= 0; k--) v = v * u + c[k]!;
    ssr += (y[i]! - v) ** 2;
  }
  return { xm, h, ssr, coef };
}

const same = (a: ArrayLike<number>, b: ArrayLike<number>) => a.length === b.length && Array.from(a).every((v, i) => Object.is(v, b[i]));

describe('movingAverage', () => {
  it('the documented example (hand-computed: ends average the shrunken window)', () => {
    expect(Array.from(movingAverage([1, 2, 3, 4, 5], 0, 5, 3))).toEqual([1.5, 2, 3, 4, 4.5]);
  });
  it('equals the single-loop form bit for bit: 400 random series, windows 1 to longer than the series, offsets', () => {
    const r = xoshiro128ss(12);
    for (let t = 0; t < 400; t++) {
      const len = 1 + (r.nextU32() % 300);
      const y = Float64Array.from({ length: len }, (_, i) => 300 + 0.7 * i + 50 * (r.nextFloat() - 0.5));
      const from = r.nextU32() % Math.max(1, len >> 2), to = from + 1 + (r.nextU32() % (len - from));
      const w = 1 + 2 * (r.nextU32() % 80);
      const a = movingAverage(y, from, to, w), b = movingAverageReference(y, from, to, w);
      expect(same(a, b), `case ${t}: n ${to - from}, w ${w}`).toBe(true);
      // and as a plain array (the other element kind the analysis passes)
      expect(same(movingAverage(Array.from(y), from, to, w), b), `case ${t} (number[])`).toBe(true);
    }
  });
});

describe('averageTopSpan (forceMaximum without the column of averages)', () => {
  it('the documented example (hand-computed)', () => {
    expect(Array.from(averageTopSpan([1, 2, 3, 4, 3], 0, 5, 1, (t) => t - 1))).toEqual([3, 4, 2, 4]);
  });
  it('reads what the single-loop average column gives: first highest, its value, first and last average at least the level', () => {
    const r = xoshiro128ss(31);
    for (let t = 0; t < 400; t++) {
      const len = 1 + (r.nextU32() % 400);
      // a rise, a flat noisy top and a fall (the shape forceMaximum reads), with ties every few series
      const y = Float64Array.from({ length: len }, (_, i) => 400 - 2e-3 * (i - len / 2) ** 2 + 8 * (r.nextFloat() - 0.5));
      const yt = t % 4 === 0 ? y.map((v) => Math.min(v, 395)) : y;
      const from = r.nextU32() % Math.max(1, len >> 2), to = from + 1 + (r.nextU32() % (len - from));
      const w = 1 + 2 * (r.nextU32() % 60);
      const drop = t % 7 === 0 ? 0 : 10 * r.nextFloat();
      const ref = movingAverageReference(yt, from, to, w);
      const top = Math.max(...ref), at = ref.indexOf(top), lev = top - drop;
      let first = -1, last = -1;
      ref.forEach((v, i) => { if (!(v < lev)) { if (first < 0) first = i; last = i; } });
      const got = averageTopSpan(yt, from, to, w, (h) => h - drop);
      expect([got[0], got[1], got[2], got[3]], `case ${t}: n ${to - from}, w ${w}`).toEqual([at, top, first, last]);
      expect(Object.is(got[1], top)).toBe(true);
    }
  });
  it('a level of NaN (no noise estimate) takes the whole range, as the scans over the column did', () => {
    expect(Array.from(averageTopSpan([1, 5, 2, 1], 0, 4, 1, () => NaN))).toEqual([1, 5, 0, 3]);
  });
});

describe('polynomialFit, degree 2', () => {
  it('recovers an exact parabola (y = 2 − 3x + 0.5x², hand-chosen)', () => {
    const x = [0, 1, 2, 3, 4, 5, 6], y = x.map((v) => 2 - 3 * v + 0.5 * v * v);
    const f = polynomialFit(x, y, 0, 7, 2)!;
    expect(f.at(2.5)).toBeCloseTo(2 - 7.5 + 3.125, 12);
    expect(f.ssr).toBeLessThan(1e-20);
  });
  it('centre, scale, coefficients and residual sum equal the general loops bit for bit on 300 random windows', () => {
    const r = xoshiro128ss(7);
    for (let t = 0; t < 300; t++) {
      const len = 5 + (r.nextU32() % 500);
      const x = Float64Array.from({ length: len }, (_, i) => 1e-3 + i * 2.7e-6 + 1e-7 * r.nextFloat());
      const y = Float64Array.from(x, (e) => 400 + 2e5 * e - 3e6 * e * e + (r.nextFloat() - 0.5));
      const from = r.nextU32() % (len - 4), to = from + 4 + (r.nextU32() % (len - from - 3));
      const f = polynomialFit(x, y, from, to, 2);
      if (!f) continue;
      const ref = polySumsReference(x, y, from, to, 2, f.c);
      expect(Object.is(f.xm, ref.xm) && Object.is(f.h, ref.h) && Object.is(f.ssr, ref.ssr) && same(f.c, ref.coef), `case ${t}`).toBe(true);
    }
  });
});
