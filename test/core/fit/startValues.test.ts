// startValues for Voce and Hockett–Sherby reuse e^(−b·x) and xᵖ between the linear solve and the residual sum, and
// Hollomon, Ludwik and Swift fit their log–log lines in scratch columns without closures (src/core/fit/startValues.ts). The start must be the same number as the plain form, which evaluates the law
// point by point (the form before the change, written out here): a different start would change the fits.
// Curves are INVENTED from known laws with seeded noise.
import { describe, expect, it } from 'vitest';
import { makeLaw, startValues, xoshiro128ss, type LawSpec } from '../../../src/core/index.js';

const logspace = (a: number, b: number, k: number) => Array.from({ length: k }, (_, i) => a * Math.pow(b / a, i / (k - 1)));
function twoColumn(u: ArrayLike<number>, v: ArrayLike<number>, y: ArrayLike<number>): [number, number] | null {
  let uu = 0, uv = 0, vv = 0, uy = 0, vy = 0;
  for (let i = 0; i < y.length; i++) { uu += u[i]! * u[i]!; uv += u[i]! * v[i]!; vv += v[i]! * v[i]!; uy += u[i]! * y[i]!; vy += v[i]! * y[i]!; }
  const det = uu * vv - uv * uv;
  if (!(Math.abs(det) > 1e-300) || !(Math.abs(det) > 1e-14 * uu * vv)) return null;
  return [(uy * vv - vy * uv) / det, (vy * uu - uy * uv) / det];
}
function ssr(f: (e: number) => number, x: ArrayLike<number>, y: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += (f(x[i]!) - y[i]!) ** 2;
  return Number.isFinite(s) ? s : Infinity;
}
function plainVoce(x: number[], y: number[]): number[] {
  const ymin = Math.min(...y), ymax = Math.max(...y);
  let best = [ymin, Math.max(ymax - ymin, 1), 10], bestS = Infinity;
  const ones = x.map(() => 1);
  for (const b of logspace(0.3, 3000, 24)) {
    const u = x.map((e) => -Math.expm1(-b * e));
    const c = twoColumn(ones, u, y);
    if (!c) continue;
    const s0 = Math.max(0, c[0]), Q = Math.max(0, c[1]);
    const s = ssr((e) => s0 + Q * -Math.expm1(-b * e), x, y);
    if (s < bestS) { bestS = s; best = [s0, Q, b]; }
  }
  return best;
}
function plainHockettSherby(x: number[], y: number[]): number[] {
  const ymin = Math.min(...y), ymax = Math.max(...y);
  let best = [ymax * 1.05, ymin * 0.95, 10, 1], bestS = Infinity;
  const at = (a: number, p: number): number => {
    const E = x.map((e) => Math.exp(-a * Math.pow(e, p)));
    const c = twoColumn(E.map((v) => 1 - v), E, y);
    if (!c) return Infinity;
    const [sat, s0] = c;
    if (!(sat > s0 && s0 >= 0)) return Infinity;
    const s = ssr((e) => sat - (sat - s0) * Math.exp(-a * Math.pow(e, p)), x, y);
    if (s < bestS) { bestS = s; best = [sat, s0, a, p]; }
    return s;
  };
  // The grid in a for each p, then a golden-section search in ln a between the row's best point's neighbours.
  const as = logspace(0.3, 3000, 18), G = (Math.sqrt(5) - 1) / 2;
  for (const p of [0.4, 0.6, 0.8, 1, 1.3]) {
    let k = -1, rowS = Infinity;
    as.forEach((a, i) => { const s = at(a, p); if (s < rowS) { rowS = s; k = i; } });
    if (k < 0) continue;
    let lo = Math.log(as[Math.max(0, k - 1)]!), hi = Math.log(as[Math.min(as.length - 1, k + 1)]!);
    let c = hi - G * (hi - lo), d = lo + G * (hi - lo), fc = at(Math.exp(c), p), fd = at(Math.exp(d), p);
    for (let it = 0; it < 12; it++) {
      if (fc <= fd) { hi = d; d = c; fd = fc; c = hi - G * (hi - lo); fc = at(Math.exp(c), p); }
      else { lo = c; c = d; fc = fd; d = lo + G * (hi - lo); fd = at(Math.exp(d), p); }
    }
  }
  return best;
}

/** The former log–log line: arrays by push, a column of ones, twoColumn. */
function plainPowerLine(x: ArrayLike<number>, y: ArrayLike<number>): [number, number] | null {
  const lx: number[] = [], ly: number[] = [];
  for (let i = 0; i < x.length; i++) if (x[i]! > 0 && y[i]! > 0) { lx.push(Math.log(x[i]!)); ly.push(Math.log(y[i]!)); }
  if (lx.length < 2) return null;
  const c = twoColumn(lx.map(() => 1), lx, ly);
  return c ? [c[1], Math.exp(c[0])] : null;
}
const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
function plainHollomon(x: number[], y: number[]): number[] {
  const c = plainPowerLine(x, y);
  return c ? [clamp(c[1], 1e-3, 1e5), clamp(c[0], 1e-3, 1)] : [Math.max(...y), 0.1];
}
function plainLudwik(x: number[], y: number[]): number[] {
  const ymin = Math.min(...y), ymax = Math.max(...y);
  let best = [0.9 * ymin, ymax - 0.9 * ymin, 0.5], bestS = Infinity;
  for (const c of [0, 0.3, 0.5, 0.7, 0.8, 0.9, 0.95, 0.98, 0.995]) {
    const s0 = c * ymin;
    const p = plainPowerLine(x, y.map((v) => v - s0));
    if (!p) continue;
    const K = clamp(p[1], 1e-3, 1e5), n = clamp(p[0], 1e-3, 1);
    const s = ssr((e) => s0 + K * Math.pow(e, n), x, y);
    if (s < bestS) { bestS = s; best = [s0, K, n]; }
  }
  return best;
}
function plainSwift(x: number[], y: number[]): number[] {
  let best = [Math.max(...y), 0.01, 0.1], bestS = Infinity;
  for (const e0 of [1e-5, 1e-4, 3e-4, 1e-3, 3e-3, 0.01, 0.03, 0.1, 0.3]) {
    const p = plainPowerLine(x.map((v) => v + e0), y);
    if (!p) continue;
    const K = clamp(p[1], 1e-3, 1e5), n = clamp(p[0], 1e-3, 1);
    const s = ssr((e) => K * Math.pow(e0 + e, n), x, y);
    if (s < bestS) { bestS = s; best = [K, e0, n]; }
  }
  return best;
}

describe('startValues(law, x, y) for Voce and Hockett–Sherby', () => {
  it('gives the same start, bit for bit, as evaluating each candidate law point by point (20 seeded curves each)', () => {
    const laws: LawSpec[] = [{ law: 'voce', sigma0: 250, Q: 180, b: 12 }, { law: 'hockettSherby', sigmaSat: 600, sigma0: 200, a: 8, p: 0.8 }, { law: 'swift', K: 600, eps0: 0.01, n: 0.22 }];
    for (let t = 0; t < 20; t++) {
      const r = xoshiro128ss(100 + t);
      const truth = makeLaw(laws[t % laws.length]!);
      const x = Array.from({ length: 50 + (t * 37) % 350 }, (_, i) => 0.002 + i * (0.2 + 0.01 * t) / 400);
      const y = x.map((e) => truth.stress(e) + 3 * (r.nextFloat() - 0.5));
      expect(startValues('voce', x, y), `voce, curve ${t}`).toEqual(plainVoce(x, y));
      expect(startValues('hockettSherby', x, y), `hockettSherby, curve ${t}`).toEqual(plainHockettSherby(x, y));
    }
  });
});

describe('startValues(law, x, y) for Hollomon, Ludwik, Swift and the blend', () => {
  it('gives the same start, bit for bit, as the former log–log lines through arrays and closures (30 seeded curves each)', () => {
    const laws: LawSpec[] = [{ law: 'swift', K: 600, eps0: 0.01, n: 0.22 }, { law: 'ludwik', sigma0: 180, K: 520, n: 0.45 }, { law: 'voce', sigma0: 250, Q: 180, b: 12 }];
    for (let t = 0; t < 30; t++) {
      const r = xoshiro128ss(300 + t);
      const truth = makeLaw(laws[t % laws.length]!);
      const x = Array.from({ length: 50 + (t * 37) % 350 }, (_, i) => 0.002 + i * (0.2 + 0.01 * t) / 400);
      const y = x.map((e) => truth.stress(e) + 3 * (r.nextFloat() - 0.5));
      const same = (a: number[], b: number[]) => a.length === b.length && a.every((v, i) => Object.is(v, b[i]));
      expect(same(startValues('hollomon', x, y), plainHollomon(x, y)), `hollomon, curve ${t}`).toBe(true);
      expect(same(startValues('ludwik', x, y), plainLudwik(x, y)), `ludwik, curve ${t}`).toBe(true);
      expect(same(startValues('swift', x, y), plainSwift(x, y)), `swift, curve ${t}`).toBe(true);
      expect(same(startValues('swiftVoce', x, y), [0.5, ...plainSwift(x, y), ...plainVoce(x, y)]), `swiftVoce, curve ${t}`).toBe(true);
    }
  });
});
