/**
 * Least-squares parabola y = c0 + c1·u + c2·u² in the centred, scaled variable u = (x − x̄)/h over
 * indices [from, to): {@link polynomialFit} of degree 2 (Draper & Smith, *Applied Regression Analysis*,
 * ch. 5), kept as its own entry because it is public (`quadraticFit`, `QuadraticFit.vertex`).
 * Units: those of x and y. Valid: at least 3 points with distinct x.
 * @returns null when the system is singular.
 * @example quadraticFit([0, 1, 2, 3], [0, 1, 4, 9], 0, 4)!.at(2) // 4
 */
export function quadraticFit(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number): QuadraticFit | null {
  const n = to - from;
  if (n < 3) return null;
  const f = polynomialFit(x, y, from, to, 2, n === 3);
  return f ? new QuadraticFit(f.c[0]!, f.c[1]!, f.c[2]!, f.xm, f.h, n, f.ssr) : null;
}

export class QuadraticFit {
  constructor(readonly c0: number, readonly c1: number, readonly c2: number, readonly xm: number, readonly h: number, readonly n: number, readonly ssr: number) {}
  at(x: number): number {
    const u = (x - this.xm) / this.h;
    return this.c0 + this.c1 * u + this.c2 * u * u;
  }
  /** x of the vertex, or null for a straight line. */
  vertex(): number | null {
    return this.c2 !== 0 ? this.xm - (this.h * this.c1) / (2 * this.c2) : null;
  }
}

/**
 * Centred moving average of y over [from, to) with an odd window w (shrinking at the ends), one pass
 * with a running sum ({@link averageTopSpan} reads the top of it without the column).
 * Units: those of y.
 * @example movingAverage([1, 2, 3, 4, 5], 0, 5, 3) // Float64Array [1.5, 2, 3, 4, 4.5]
 */
export function movingAverage(y: ArrayLike<number>, from: number, to: number, w: number): Float64Array {
  const out = new Float64Array(Math.max(0, to - from));
  slide(y, from, to, w, STORE, 0, out);
  return out;
}

/**
 * What forceMaximum reads of {@link movingAverage}(y, from, to, w), without its column of averages: the first highest
 * average and the first and last index whose average is at least `level(highest)`. Two passes that make the same
 * additions and subtractions in the same order as movingAverage, so the same averages bit for bit; the column itself
 * (8 MB on a 1,000,000-row record) is never made. Written here because fresh memory costs a page fault per 4 KiB: on
 * the machines this project is measured on, 11 µs each, so 20 ms for that column against 2–3 ms for the second pass
 * (bench/RESULTS.md, twenty-fourth session).
 * Units: those of y. Valid: to > from, w ≥ 1 odd.
 * @returns [at, highest, first, last], indices counted from `from`.
 * @example Array.from(averageTopSpan([1, 2, 3, 4, 3], 0, 5, 1, (t) => t - 1)) // [3, 4, 2, 4]
 */
export function averageTopSpan(y: ArrayLike<number>, from: number, to: number, w: number, level: (highest: number) => number): Float64Array {
  const res = new Float64Array(4);
  slide(y, from, to, w, TOP, 0, res);
  slide(y, from, to, w, BAND, level(res[1]!), res);
  return res;
}

/** What {@link slide} does with each average: store it, keep the first highest, or keep the band's first and last. */
const STORE = 0, TOP = 1, BAND = 2;

/**
 * The centred moving average's three stretches, with the same additions and subtractions in the same order (so the
 * same numbers whatever is done with them): the window growing at the start, the full window (one sample in, one
 * out: no Math.max/min, no inner loops; on a 1,000,000-row record forceMaximum's average over the hardening branch ran
 * slowly unoptimised in the general form, speed follow-up J), and the window shrinking at the end. Each average is
 * stored into res[i] (STORE), or the first highest kept in res[0], res[1] (TOP), or the first and last index whose
 * average is not below `lev` in res[2], res[3], −1 if none (BAND: `!(v < lev)`, as scans over the column read it).
 */
function slide(y: ArrayLike<number>, from: number, to: number, w: number, mode: number, lev: number, res: Float64Array): void {
  const n = to - from;
  const half = Math.max(0, (w - 1) >> 1);
  let lo = 0, hi = -1, sum = 0, best = 0, at = 0, first = -1, last = -1;
  let i = 0;
  for (const head = Math.min(n, half + 1); i < head; i++) {
    const a = Math.max(0, i - half), b = Math.min(n - 1, i + half);
    while (hi < b) sum += y[from + ++hi]!;
    while (lo < a) sum -= y[from + lo++]!;
    const v = sum / (hi - lo + 1);
    if (mode === STORE) res[i] = v; else if (mode === BAND) { if (!(v < lev)) { if (first < 0) first = i; last = i; } } else if (i === 0 || v > best) { best = v; at = i; }
  }
  if (i <= n - 1 - half) {
    // Here hi = i − 1 + half and lo = i − 1 − half (the previous step's window) and each step moves both by one.
    const full = 2 * half + 1, end = n - 1 - half;
    if (mode === STORE) sum = fullWindow(y, from, half, i, end, sum, full, res);
    else if (mode === BAND) {
      res[2] = first; res[3] = last;
      sum = fullWindowBand(y, from, half, i, end, sum, full, lev, res);
      first = res[2]!; last = res[3]!;
    } else {
      res[0] = at; res[1] = best;
      sum = fullWindowBest(y, from, half, i, end, sum, full, res);
      at = res[0]!; best = res[1]!;
    }
    hi = end + half; lo = end - half;
    i = end + 1;
  }
  for (; i < n; i++) {
    const a = Math.max(0, i - half), b = Math.min(n - 1, i + half);
    while (hi < b) sum += y[from + ++hi]!;
    while (lo < a) sum -= y[from + lo++]!;
    const v = sum / (hi - lo + 1);
    if (mode === STORE) res[i] = v; else if (mode === BAND) { if (!(v < lev)) { if (first < 0) first = i; last = i; } } else if (v > best) { best = v; at = i; }
  }
  if (mode === BAND) { res[2] = first; res[3] = last; } else if (mode === TOP) { res[0] = at; res[1] = best; }
}

/** slide's full stretch for the highest average (res[0], res[1] in and out); returns the sum. */
function fullWindowBest(y: ArrayLike<number>, from: number, half: number, first: number, end: number, sum: number, full: number, res: Float64Array): number {
  let s = sum, at = res[0]!, best = res[1]!;
  for (let i = first; i <= end; i++) {
    s += y[from + i + half]!;
    s -= y[from + i - half - 1]!;
    const v = s / full;
    if (v > best) { best = v; at = i; }
  }
  res[0] = at; res[1] = best;
  return s;
}

/** slide's full stretch for the band (res[2], res[3] in and out); returns the sum. */
function fullWindowBand(y: ArrayLike<number>, from: number, half: number, first: number, end: number, sum: number, full: number, lev: number, res: Float64Array): number {
  let s = sum, f = res[2]!, l = res[3]!;
  for (let i = first; i <= end; i++) {
    s += y[from + i + half]!;
    s -= y[from + i - half - 1]!;
    if (!(s / full < lev)) { if (f < 0) f = i; l = i; }
  }
  res[2] = f; res[3] = l;
  return s;
}

/** movingAverage's full-window stretch, i = first…end: sum += y[i + half], sum −= y[i − half − 1], out[i] = sum/full; returns the sum. */
function fullWindow(y: ArrayLike<number>, from: number, half: number, first: number, end: number, sum: number, full: number, out: Float64Array): number {
  let s = sum;
  for (let i = first; i <= end; i++) {
    s += y[from + i + half]!;
    s -= y[from + i - half - 1]!;
    out[i] = s / full;
  }
  return s;
}

/**
 * Least-squares polynomial of degree `deg` (1–3) in u = (x − x̄)/h over [from, to), by the normal
 * equations solved with partial pivoting (Draper & Smith, *Applied Regression Analysis*, ch. 5; centring
 * and scaling keep a cubic's 4×4 system well conditioned). Written here: one pass, no allocation per point.
 * `exact`: allow deg + 1 points (an interpolating polynomial); otherwise at least deg + 2.
 * @returns the coefficients c[0..deg] in u, x̄, h, the point count and the residual sum of squares, or null when singular or too few points.
 * @example polynomialFit([0, 1, 2, 3, 4], [0, 1, 8, 27, 64], 0, 5, 3)!.at(2) // 8
 */
export function polynomialFit(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, deg: number, exact = false): PolyFit | null {
  const n = to - from, m = deg + 1;
  if (n < deg + (exact ? 1 : 2)) return null;
  const xm = sumOf(x, from, to) / n;
  const h = largestDeviation(x, from, to, xm);
  if (!(h > 0)) return null;
  const S = new Float64Array(2 * m - 1), T = new Float64Array(m);
  if (deg === 2) quadraticSums(x, y, from, to, xm, h, S, T);
  else {
    for (let i = from; i < to; i++) {
      const u = (x[i]! - xm) / h, v = y[i]!;
      let p = 1;
      for (let k = 0; k < 2 * m - 1; k++) { S[k]! += p; if (k < m) T[k]! += v * p; p *= u; }
    }
  }
  const A: number[][] = [];
  for (let r = 0; r < m; r++) { const row: number[] = []; for (let c = 0; c < m; c++) row.push(S[r + c]!); row.push(T[r]!); A.push(row); }
  for (let c = 0; c < m; c++) {
    let piv = c;
    for (let r = c + 1; r < m; r++) if (Math.abs(A[r]![c]!) > Math.abs(A[piv]![c]!)) piv = r;
    if (!(Math.abs(A[piv]![c]!) > 1e-12 * n)) return null;
    [A[c], A[piv]] = [A[piv]!, A[c]!];
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const f = A[r]![c]! / A[c]![c]!;
      for (let k = c; k <= m; k++) A[r]![k]! -= f * A[c]![k]!;
    }
  }
  const c = A.map((row, r) => row[m]! / row[r]!);
  let ssr = 0;
  if (deg === 2) ssr = quadraticSsr(x, y, from, to, xm, h, c[0]!, c[1]!, c[2]!);
  else {
    for (let i = from; i < to; i++) {
      const u = (x[i]! - xm) / h;
      let v = 0;
      for (let k = m - 1; k >= 0; k--) v = v * u + c[k]!;
      ssr += (y[i]! - v) ** 2;
    }
  }
  return new PolyFit(c, xm, h, n, ssr);
}

// polynomialFit's point loops for the parabola, the degree every caller in the analysis uses, written out with the
// same operations in the same order as the general loops (so the same sums, bit for bit), in small functions the
// engine optimises at once: on a 1,000,000-row record the windows of the proof strengths and the modulus hold
// tens of thousands of samples each, and the general loops ran unoptimised (speed follow-up J).

/** Σ x[i] over [from, to), in index order. */
function sumOf(x: ArrayLike<number>, from: number, to: number): number {
  let s = 0;
  for (let i = from; i < to; i++) s += x[i]!;
  return s;
}

/** max |x[i] − xm| over [from, to) by Math.max from 0, in index order. */
function largestDeviation(x: ArrayLike<number>, from: number, to: number, xm: number): number {
  let h = 0;
  for (let i = from; i < to; i++) h = Math.max(h, Math.abs(x[i]! - xm));
  return h;
}

/** S[k] = Σ uᵏ (k = 0…4) and T[k] = Σ y·uᵏ (k = 0…2), u = (x − xm)/h, powers by repeated multiplication from 1. */
function quadraticSums(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, xm: number, h: number, S: Float64Array, T: Float64Array): void {
  let s0 = 0, s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
  for (let i = from; i < to; i++) {
    const u = (x[i]! - xm) / h, v = y[i]!;
    const p2 = u * u, p3 = p2 * u, p4 = p3 * u;
    s0 += 1; t0 += v;
    s1 += u; t1 += v * u;
    s2 += p2; t2 += v * p2;
    s3 += p3; s4 += p4;
  }
  S[0] = s0; S[1] = s1; S[2] = s2; S[3] = s3; S[4] = s4;
  T[0] = t0; T[1] = t1; T[2] = t2;
}

/** Σ (y − P(u))² with P(u) = ((0·u + c2)·u + c1)·u + c0 (Horner from 0, as PolyFit.at), u = (x − xm)/h. */
function quadraticSsr(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, xm: number, h: number, c0: number, c1: number, c2: number): number {
  let ssr = 0;
  for (let i = from; i < to; i++) {
    const u = (x[i]! - xm) / h;
    const v = ((0 * u + c2) * u + c1) * u + c0;
    ssr += (y[i]! - v) ** 2;
  }
  return ssr;
}

export class PolyFit {
  /** Coefficients in u = (x − xm)/h, the centre and scale, the number of points and the residual sum of squares. */
  constructor(readonly c: readonly number[], readonly xm: number, readonly h: number, readonly n = 0, readonly ssr = 0) {}
  at(x: number): number {
    const u = (x - this.xm) / this.h;
    let v = 0;
    for (let k = this.c.length - 1; k >= 0; k--) v = v * u + this.c[k]!;
    return v;
  }
  /** Largest value on [xa, xb] and where: end points and the roots of the derivative inside. */
  maxOn(xa: number, xb: number): { x: number; y: number } {
    const cand = [xa, xb];
    const [, c1 = 0, c2 = 0, c3 = 0] = this.c;
    // derivative in u: c1 + 2c2 u + 3c3 u²
    if (Math.abs(c3) > 1e-300) {
      const A = 3 * c3, B = 2 * c2, C = c1, D = B * B - 4 * A * C;
      if (D >= 0) { const q = -0.5 * (B + Math.sign(B || 1) * Math.sqrt(D)); cand.push(this.xm + this.h * (q / A)); if (q !== 0) cand.push(this.xm + this.h * (C / q)); }
    } else if (Math.abs(c2) > 1e-300) cand.push(this.xm - (this.h * c1) / (2 * c2));
    let best = { x: xa, y: this.at(xa) };
    for (const x of cand) if (x >= xa && x <= xb) { const y = this.at(x); if (y > best.y) best = { x, y }; }
    return best;
  }
}

/**
 * Lag-1 autocorrelation of the residuals of the line a + b·x over [from, to): ρ = Σ rᵢrᵢ₋₁ / Σ rᵢ², clamped to
 * [0, 0.9] (a negative ρ is taken as 0; 0.9 keeps the variance factor (1 + ρ)/(1 − ρ) at most 19). Used to widen
 * intervals for load noise correlated from sample to sample (the AR(1) variance factor; Bayley & Hammersley,
 * J. R. Stat. Soc. Suppl. 8, 1946). Units: those of x and y; ρ dimensionless. 0 for a perfect fit.
 * @example lineResidualLag1([0, 1, 2, 3], [0, 1, 2, 3], 0, 4, 0, 1) // 0
 */
export function lineResidualLag1(x: ArrayLike<number>, y: ArrayLike<number>, from: number, to: number, a: number, b: number): number {
  let s00 = 0, s01 = 0, prev = 0;
  for (let i = from; i < to; i++) {
    const r = y[i]! - (a + b * x[i]!);
    s00 += r * r;
    if (i > from) s01 += r * prev;
    prev = r;
  }
  return s00 > 0 ? Math.min(0.9, Math.max(0, s01 / s00)) : 0;
}

/**
 * Solves the k×k linear system S·c = T (S row-major, k small: the normal equations of a local model) by
 * Gauss–Jordan elimination with partial pivoting (Golub & Van Loan, Matrix Computations, §3.4). A pivot below
 * `relPivot` times |S₀₀| counts as singular. Returns null when singular, never NaN. Units: those of T over S.
 * @example solveSmall(new Float64Array([2, 0, 0, 4]), new Float64Array([2, 8]), 2, 1e-14) // [1, 2]
 */
export function solveSmall(S: Float64Array, T: Float64Array, k: number, relPivot: number): Float64Array | null {
  const W = k + 1;
  const M = new Float64Array(k * W);
  for (let r = 0; r < k; r++) { for (let q = 0; q < k; q++) M[r * W + q] = S[r * k + q]!; M[r * W + k] = T[r]!; }
  const scale = Math.abs(M[0]!) || 1;
  for (let col = 0; col < k; col++) {
    let piv = col;
    for (let r = col + 1; r < k; r++) if (Math.abs(M[r * W + col]!) > Math.abs(M[piv * W + col]!)) piv = r;
    if (!(Math.abs(M[piv * W + col]!) > relPivot * scale)) return null;
    if (piv !== col) for (let q = 0; q < W; q++) { const t = M[col * W + q]!; M[col * W + q] = M[piv * W + q]!; M[piv * W + q] = t; }
    for (let r = 0; r < k; r++) {
      if (r === col) continue;
      const fct = M[r * W + col]! / M[col * W + col]!;
      if (fct !== 0) for (let q = col; q < W; q++) M[r * W + q]! -= fct * M[col * W + q]!;
    }
  }
  const out = new Float64Array(k);
  for (let r = 0; r < k; r++) out[r] = M[r * W + k]! / M[r * W + r]!;
  return out;
}
