// The flow-curve pass with the law fits' range and first bad point taken in it (speed follow-up K): flowColumns must
// give, bit for bit, what the former two passes gave (and the n-value's sums of the same logarithms) — the former loop of analyzeRecord (kept below as the
// reference) and lawDataLogged's pass over its output — on seeded records (cycles, noise, a toe, samples with
// non-positive stress) and on hand-made columns; and the flow curve of a hand example by Dowling's conversions.
import { describe, expect, it } from 'vitest';
import { synthesizeRecord, xoshiro128ss } from '../../../src/core/index.js';
import { lawDataLogged } from '../../../src/core/fit/lawNormalEquations.js';
import { flowColumns } from '../../../src/core/tensile/flowColumns.js';

/** analyzeRecord's flow-curve loop before follow-up K (the reference). */
function formerFlowColumns(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, E: number, iMax: number, fromIndex: number, fromTrue: number) {
  const m = iMax + 1;
  const xs = new Float64Array(m), ys = new Float64Array(m), lxs = new Float64Array(m), lys = new Float64Array(m);
  let nf = 0, runMax = 0, any = false;
  for (let i = 0; i <= iMax; i++) {
    const e = strain[i]! - toe;
    if (any && e <= runMax) continue;
    any = true;
    runMax = e;
    if (e <= -1 || i < fromIndex) continue;
    const s = stress[i]! * (1 + e);
    const ep = Math.log1p(e) - s / E;
    if (ep >= fromTrue && ep > 0) { xs[nf] = ep; ys[nf] = s; lxs[nf] = Math.log(ep); lys[nf++] = Math.log(s); }
  }
  return { strain: xs.subarray(0, nf), stress: ys.subarray(0, nf), logStrain: lxs.subarray(0, nf), logStress: lys.subarray(0, nf) };
}

/** Σ(a − c) of the finite terms' count and sum, for the logSums check (the middle point's log as centre). */
function centredSum(a: Float64Array): { c: number; s: number } {
  const c = a.length ? a[a.length >> 1]! : 0;
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i]! - c;
  return { c, s };
}

const sameBits = (a: Float64Array, b: Float64Array) => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));

function expectSame(strain: ArrayLike<number>, stress: ArrayLike<number>, toe: number, E: number, iMax: number, from: number, fromTrue: number, label: string) {
  const got = flowColumns(strain, stress, toe, E, iMax, from, fromTrue);
  const ref = formerFlowColumns(strain, stress, toe, E, iMax, from, fromTrue);
  const packed = lawDataLogged(ref.strain, ref.stress, ref.logStrain);
  expect([sameBits(got.strain, ref.strain), sameBits(got.stress, ref.stress)], label).toEqual([true, true]);
  // The n-value's sums over the same points' logarithms (the logs themselves are no longer kept).
  if (ref.strain.length > 0 && packed.bad < 0) {
    const x = centredSum(ref.logStrain), y = centredSum(ref.logStress);
    expect([got.logSums.k, got.logSums.cx, got.logSums.cy, got.logSums.sx, got.logSums.sy], label).toEqual([ref.strain.length, x.c, y.c, x.s, y.s]);
  }
  expect([Object.is(got.lo, packed.lo), Object.is(got.hi, packed.hi), got.bad === packed.bad], label).toEqual([true, true, true]);
  return got;
}

describe('flowColumns(strain, stress, toe, E, iMax, from, fromTrue): one pass for the flow curve and the fits\' range', () => {
  it('equals the former loop and lawDataLogged bit for bit on 60 seeded records (noise, toe, unload–reload cycles)', () => {
    const r = xoshiro128ss(121);
    let points = 0;
    for (let t = 0; t < 60; t++) {
      // INVENTED records: Swift hardening, E 70–210 GPa, noise 0–3 MPa, some with a toe and three cycles.
      const E = 70_000 + 140_000 * r.nextFloat();
      const rec = synthesizeRecord({
        law: { law: 'swift', K: 500 + 400 * r.nextFloat(), eps0: 0.002 + 0.01 * r.nextFloat(), n: 0.1 + 0.3 * r.nextFloat() }, elasticModulus: E,
        rng: xoshiro128ss(1000 + t), noise: 3 * r.nextFloat(), step: 2e-4, ...(t % 3 === 1 ? { toe: 0.001 } : {}),
        ...(t % 4 === 2 ? { cycles: { plasticStrains: [0.02, 0.05, 0.08], unloadTo: 0.1 } } : {}),
        necking: { extraStrain: 0.03, dropTo: 0.8 },
      });
      const n = rec.strain.length;
      const iMax = Math.floor(n * (0.5 + 0.4 * r.nextFloat()));
      const got = expectSame(rec.strain, rec.stress, t % 3 === 1 ? 0.001 : 0, E, iMax, Math.floor(n * 0.05 * r.nextFloat()), 0.002 * r.nextFloat(), `record ${t}`);
      expect(got.bad, `record ${t}`).toBe(-1);
      points += got.strain.length;
    }
    expect(points).toBeGreaterThan(10_000); // the comparison is of real flow curves, not of empty columns
  });
  it('finds the first bad point (true stress ≤ 0 or infinite) and the range as lawDataLogged does, on 200 seeded columns', () => {
    const r = xoshiro128ss(122);
    let withBad = 0;
    for (let t = 0; t < 200; t++) {
      const n = 20 + (r.nextU32() % 400);
      const strain = Float64Array.from({ length: n }, (_, i) => i * 2e-4 + 1e-5 * r.nextFloat());
      const stress = Float64Array.from(strain, (e) => 300 + 2000 * e + r.nextFloat());
      if (t % 2) for (let k = 0; k < 3; k++) stress[10 + (r.nextU32() % (n - 10))] = t % 4 === 1 ? 0 : -5;
      // A stress so large and negative that σ = s(1 + e) is −∞ and εp +∞ (kept, and the first kept point when at 0).
      if (t % 8 === 2) stress[t % 16 === 2 ? 0 : 5 + (r.nextU32() % (n - 5))] = -1.7e308;
      const got = expectSame(strain, stress, 0, 200_000, n - 1, 0, 0, `columns ${t}`);
      if (got.bad >= 0) withBad++;
    }
    expect(withBad).toBeGreaterThan(50);
  });
  it('kept points with εp = +∞ (σ/E overflowing) give lawDataLogged\'s range and first bad point (hand-made extremes)', () => {
    // E 1e-290 MPa: a stress of −5 MPa gives εp ≈ 5e290 (kept), −1.7e308 gives εp = +∞ (kept), positive stresses εp < 0.
    for (const at of [[0], [3], [0, 4], [1, 2, 3, 4, 5]]) {
      const strain = [0, 0.001, 0.002, 0.003, 0.004, 0.005, 0.006];
      const stress = [300, -5, 320, -5, 330, -5, 340];
      for (const i of at) stress[i] = -1.7e308;
      const got = expectSame(strain, stress, 0, 1e-290, 6, 0, 0, `+∞ at ${at}`);
      expect(got.bad).toBe(0);
    }
  });
  it('no point on the flow curve: empty columns, lo = Infinity, hi = −Infinity, bad = −1 (lawDataLogged\'s values)', () => {
    const got = expectSame([0, 0.001, 0.002], [0, 200, 400], 0, 200_000, 2, 0, 0.002, 'elastic only');
    expect([got.strain.length, got.lo, got.hi, got.bad]).toEqual([0, Infinity, -Infinity, -1]);
  });
  it('converts by Dowling §4.5 (σ = s(1 + e), εp = ln(1 + e) − σ/E) and leaves out the falling samples of a cycle (hand example)', () => {
    // e 0.01, 0.02, 0.015 (unloading: left out), 0.03 with s 300, 320, 200, 330 MPa, E 200 GPa.
    const got = flowColumns([0.01, 0.02, 0.015, 0.03], [300, 320, 200, 330], 0, 200_000, 3, 0, 0);
    const want = [[0.01, 300], [0.02, 320], [0.03, 330]].map(([e, s]) => [Math.log1p(e!) - (s! * (1 + e!)) / 200_000, s! * (1 + e!)]);
    expect(Array.from(got.strain)).toEqual(want.map((w) => w[0]));
    expect(Array.from(got.stress)).toEqual(want.map((w) => w[1]));
    expect([got.lo, got.hi]).toEqual([want[0]![0], want[2]![0]]);
  });
});
