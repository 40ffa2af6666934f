import type { LawName } from '../flow/types.js';

/** A linear least-squares solve of y ≈ c0·u + c1·v (two basis columns), or null when singular. */
function twoColumn(u: ArrayLike<number>, v: ArrayLike<number>, y: ArrayLike<number>): [number, number] | null {
  let uu = 0, uv = 0, vv = 0, uy = 0, vy = 0;
  for (let i = 0; i < y.length; i++) {
    uu += u[i]! * u[i]!;
    uv += u[i]! * v[i]!;
    vv += v[i]! * v[i]!;
    uy += u[i]! * y[i]!;
    vy += v[i]! * y[i]!;
  }
  const det = uu * vv - uv * uv;
  if (!(Math.abs(det) > 1e-300) || !(Math.abs(det) > 1e-14 * uu * vv)) return null;
  return [(uy * vv - vy * uv) / det, (vy * uu - uy * uv) / det];
}

/** Σ(s0 + K·xⁿ − y)² in index order (Infinity when not finite): Ludwik's residual sum in the start grid. */
function ludwikSsr(x: ArrayLike<number>, y: ArrayLike<number>, s0: number, K: number, n: number): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += (s0 + K * Math.pow(x[i]!, n) - y[i]!) ** 2;
  return Number.isFinite(s) ? s : Infinity;
}

/** Σ(K·(e0 + x)ⁿ − y)² in index order (Infinity when not finite): Swift's residual sum in the start grid. */
function swiftSsr(x: ArrayLike<number>, y: ArrayLike<number>, K: number, e0: number, n: number): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += (K * Math.pow(e0 + x[i]!, n) - y[i]!) ** 2;
  return Number.isFinite(s) ? s : Infinity;
}

/**
 * ln(y − yShift) = a + b·ln(x + xShift) over the points where both are > 0: returns [b, exp(a)] or null. The
 * logs go into the scratch columns lx, ly (length ≥ x.length); the sums are twoColumn's with a column of ones
 * (1·1 = 1 and 1·v = v exactly, so the same numbers as twoColumn(ones, lx, ly)). Written without per-call
 * arrays or closures: the start grids call it a dozen times per law, and in a fresh process its loops ran
 * unoptimised (speed follow-up J).
 */
function powerLine(x: ArrayLike<number>, y: ArrayLike<number>, xShift: number, yShift: number, lx: Float64Array, ly: Float64Array): [number, number] | null {
  let k = 0;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i]! + xShift, yi = y[i]! - yShift;
    if (xi > 0 && yi > 0) { lx[k] = Math.log(xi); ly[k] = Math.log(yi); k++; }
  }
  if (k < 2) return null;
  let uu = 0, uv = 0, vv = 0, uy = 0, vy = 0;
  for (let i = 0; i < k; i++) {
    const v = lx[i]!, w = ly[i]!;
    uu += 1; uv += v; vv += v * v; uy += w; vy += v * w;
  }
  const det = uu * vv - uv * uv;
  if (!(Math.abs(det) > 1e-300) || !(Math.abs(det) > 1e-14 * uu * vv)) return null;
  const c0 = (uy * vv - vy * uv) / det, c1 = (vy * uu - uy * uv) / det;
  return [c1, Math.exp(c0)];
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
const logspace = (a: number, b: number, k: number) => Array.from({ length: k }, (_, i) => a * Math.pow(b / a, i / (k - 1)));

/**
 * Starting values for fitting `law` to a flow curve (x true plastic strain > 0, y true stress MPa),
 * from closed-form linearisations over a small grid: Hollomon by log–log regression; Ludwik by
 * log(σ − σ0) regression over a grid of σ0; Swift by log–log regression over a grid of ε0; Voce and
 * Hockett–Sherby by linear least squares in their stress parameters over a grid of rates (they are
 * linear in σ0, Q and in σsat, σ0 once b, or a and p, are fixed). Swift–Voce starts from a
 * 50/50 blend of the Swift and Voce starts. Returns parameters in LAW_PARAMETERS order.
 * Common practice for nonlinear fits (variable projection idea: G. H. Golub and V. Pereyra,
 * SIAM J. Numer. Anal. 10 (1973) 413–432).
 */
export function startValues(law: LawName, x: ArrayLike<number>, y: ArrayLike<number>): number[] {
  let ymin = Infinity, ymax = -Infinity;
  for (let i = 0; i < y.length; i++) { ymin = Math.min(ymin, y[i]!); ymax = Math.max(ymax, y[i]!); }
  switch (law) {
    case 'hollomon': {
      const c = powerLine(x, y, 0, 0, new Float64Array(x.length), new Float64Array(x.length));
      return c ? [clamp(c[1], 1e-3, 1e5), clamp(c[0], 1e-3, 1)] : [ymax, 0.1];
    }
    case 'ludwik': {
      let best: number[] = [0.9 * ymin, ymax - 0.9 * ymin, 0.5];
      let bestS = Infinity;
      const lx = new Float64Array(x.length), ly = new Float64Array(x.length);
      for (const c of [0, 0.3, 0.5, 0.7, 0.8, 0.9, 0.95, 0.98, 0.995]) {
        const s0 = c * ymin;
        const p = powerLine(x, y, 0, s0, lx, ly);
        if (!p) continue;
        const K = clamp(p[1], 1e-3, 1e5), n = clamp(p[0], 1e-3, 1);
        const s = ludwikSsr(x, y, s0, K, n);
        if (s < bestS) { bestS = s; best = [s0, K, n]; }
      }
      return best;
    }
    case 'swift': return swiftStart(x, y, ymax);
    case 'voce': return voceStart(x, y, ymin, ymax);
    case 'hockettSherby': {
      let best: number[] = [ymax * 1.05, ymin * 0.95, 10, 1];
      let bestS = Infinity;
      // xᵖ once per p and e^(−a·xᵖ) once per (p, a), reused by the residual sum (the same values as
      // evaluating the law point by point, so the same start).
      const n = x.length;
      const xp = new Float64Array(n), E = new Float64Array(n), oneMinusE = new Float64Array(n);
      // The residual sum at (a, p) with σsat and σ0 solved exactly (linear least squares); Infinity where they are
      // not admissible.
      let pNow = NaN;
      const at = (a: number, p: number): number => {
        if (p !== pNow) { for (let i = 0; i < n; i++) xp[i] = Math.pow(x[i]!, p); pNow = p; }
        for (let i = 0; i < n; i++) { E[i] = Math.exp(-a * xp[i]!); oneMinusE[i] = 1 - E[i]!; }
        const c = twoColumn(oneMinusE, E, y);
        if (!c) return Infinity;
        const [sat, s0] = c;
        if (!(sat > s0 && s0 >= 0)) return Infinity;
        let s = 0;
        for (let i = 0; i < n; i++) s += (sat - (sat - s0) * E[i]! - y[i]!) ** 2;
        if (!Number.isFinite(s)) return Infinity;
        if (s < bestS) { bestS = s; best = [sat, s0, a, p]; }
        return s;
      };
      // The grid: a coarse one in a for each p, then (the valley in a is narrow: a grid step of a factor 1.7 can
      // land far up its wall, 74 LM steps from such a start on the bench's 1,000,000-row record) a golden-section
      // search in ln a between each row's best point's neighbours (14 evaluations a row; common practice for
      // starts). It only lowers the start's residual sum; the fit itself is unchanged.
      const as = logspace(0.3, 3000, 18);
      const G = (Math.sqrt(5) - 1) / 2;
      for (const p of [0.4, 0.6, 0.8, 1, 1.3]) {
        let rowBest = -1, rowS = Infinity;
        as.forEach((a, k) => { const s = at(a, p); if (s < rowS) { rowS = s; rowBest = k; } });
        if (rowBest < 0) continue;
        let lo = Math.log(as[Math.max(0, rowBest - 1)]!), hi = Math.log(as[Math.min(as.length - 1, rowBest + 1)]!);
        let c = hi - G * (hi - lo), d = lo + G * (hi - lo);
        let fc = at(Math.exp(c), p), fd = at(Math.exp(d), p);
        for (let it = 0; it < 12; it++) {
          if (fc <= fd) { hi = d; d = c; fd = fc; c = hi - G * (hi - lo); fc = at(Math.exp(c), p); }
          else { lo = c; c = d; fc = fd; d = lo + G * (hi - lo); fd = at(Math.exp(d), p); }
        }
      }
      return best;
    }
    case 'swiftVoce': {
      const s = swiftStart(x, y, ymax);
      const v = voceStart(x, y, ymin, ymax);
      return [0.5, ...s, ...v];
    }
  }
}

function swiftStart(x: ArrayLike<number>, y: ArrayLike<number>, ymax: number): number[] {
  let best: number[] = [ymax, 0.01, 0.1];
  let bestS = Infinity;
  const lx = new Float64Array(x.length), ly = new Float64Array(x.length);
  for (const e0 of [1e-5, 1e-4, 3e-4, 1e-3, 3e-3, 0.01, 0.03, 0.1, 0.3]) {
    const p = powerLine(x, y, e0, 0, lx, ly);
    if (!p) continue;
    const K = clamp(p[1], 1e-3, 1e5), n = clamp(p[0], 1e-3, 1);
    const s = swiftSsr(x, y, K, e0, n);
    if (s < bestS) { bestS = s; best = [K, e0, n]; }
  }
  return best;
}

function voceStart(x: ArrayLike<number>, y: ArrayLike<number>, ymin: number, ymax: number): number[] {
  let best: number[] = [ymin, Math.max(ymax - ymin, 1), 10];
  let bestS = Infinity;
  const n = x.length;
  const ones = new Float64Array(n).fill(1), u = new Float64Array(n);
  for (const b of logspace(0.3, 3000, 24)) {
    for (let i = 0; i < n; i++) u[i] = -Math.expm1(-b * x[i]!);
    const c = twoColumn(ones, u, y);
    if (!c) continue;
    const s0 = Math.max(0, c[0]), Q = Math.max(0, c[1]);
    // The law's values are s0 + Q·u (u as above: the same numbers as evaluating it point by point).
    let s = 0;
    for (let i = 0; i < n; i++) s += (s0 + Q * u[i]! - y[i]!) ** 2;
    if (!Number.isFinite(s)) s = Infinity;
    if (s < bestS) { bestS = s; best = [s0, Q, b]; }
  }
  return best;
}
