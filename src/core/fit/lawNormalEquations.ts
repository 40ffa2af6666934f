import type { LawName } from '../flow/types.js';
import type { BlockMoments } from './blockMoments.js';
import type { NormalProblem } from './levenbergMarquardt.js';

/**
 * One point of a law: writes ∂σ/∂p into `gr` and returns σ. `lx` is ln x (used by the laws that
 * need it). Formulas as in {@link lawJacobian}; NaN or ±Infinity outside the law's domain.
 */
type PointFn = (x: number, lx: number, p: Float64Array, gr: Float64Array) => number;

const POINT: Record<LawName, PointFn> = {
  hollomon: (_x, lx, p, gr) => {
    const P = Math.exp(p[1]! * lx), s = p[0]! * P;
    gr[0] = P; gr[1] = s * lx;
    return s;
  },
  ludwik: (_x, lx, p, gr) => {
    const P = Math.exp(p[2]! * lx), kp = p[1]! * P;
    gr[0] = 1; gr[1] = P; gr[2] = kp * lx;
    return p[0]! + kp;
  },
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

/** Swift K(ε0 + x)ⁿ at parameters p[o..o+2]; gradient scaled by `c` into gr[at..at+2]; returns the unscaled stress. */
function swiftAt(x: number, p: Float64Array, o: number, c: number, gr: Float64Array, at: number): number {
  const K = p[o]!, k = p[o + 2]!;
  const u = p[o + 1]! + x, lu = Math.log(u), P = Math.exp(k * lu), s = K * P;
  gr[at] = c * P; gr[at + 1] = (c * k * s) / u; gr[at + 2] = c * s * lu;
  return s;
}

/** Voce σ0 + Q(1 − e^(−bx)) at parameters p[o..o+2]; gradient scaled by `c` into gr[at..at+2]. */
function voceAt(x: number, p: Float64Array, o: number, c: number, gr: Float64Array, at: number): number {
  const Q = p[o + 1]!, b = p[o + 2]!;
  const E = Math.exp(-b * x), om = -Math.expm1(-b * x);
  gr[at] = c; gr[at + 1] = c * om; gr[at + 2] = c * Q * x * E;
  return p[o]! + Q * om;
}

/** Data of a weighted law fit: strains x > 0, stresses y, optional weights w (counts of averaged points). */
export interface LawData {
  x: Float64Array;
  y: Float64Array;
  /** Weight of each point; null for 1 each. */
  w: Float64Array | null;
  /** ln x, computed once. */
  lx: Float64Array;
  /** Smallest and largest x. */
  lo: number;
  hi: number;
  /** Index of the first point whose x or y is not finite and > 0, or -1 (fitLaw refuses such data). */
  bad: number;
  /** Block averages of these data for a given block size, made once (see fitLaw). */
  blocks?: { size: number; data: LawData };
  /** Weighted averages of these data for fitLaw's coarse stage, made once (see coarseData). */
  coarse?: LawData;
  /** Scratch column for model values, reused by every law fitted to these data (see lawResidualStats). */
  scratch?: Float64Array;
  /** Block moments of these data for the full-curve statistics, made once (see curveResidualStats). */
  moments?: BlockMoments;
}

/** Packs strain/stress (and weights) for {@link lawNormalProblem}; ln x is computed once here. */
export function lawData(x: ArrayLike<number>, y: ArrayLike<number>, w: Float64Array | null = null): LawData {
  return packed(x, y, w);
}

/**
 * {@link lawData} for unweighted data whose ln x is already known (`lx[i]` = Math.log(x[i]) for every i, as
 * analyzeRecord's flow-curve pass takes it): the same LawData (range, first bad point), without the logarithm
 * pass. Units as lawData.
 * @example lawDataLogged(Float64Array.of(0.1), Float64Array.of(300), Float64Array.of(Math.log(0.1))).lo // 0.1
 */
export function lawDataLogged(x: Float64Array, y: Float64Array, lx: Float64Array): LawData {
  let lo = 0, hi = 0, seenLo = false, seenHi = false, bad = -1;
  for (let i = 0; i < x.length; i++) {
    const e = x[i]!, s = y[i]!;
    if (bad < 0 && (!(e > 0) || !(e < Infinity) || !(s > 0) || !(s < Infinity))) bad = i;
    if (seenLo ? e < lo : e < Infinity) { lo = e; seenLo = true; }
    if (seenHi ? e > hi : e > -Infinity) { hi = e; seenHi = true; }
  }
  return { x, y, w: null, lx, lo: seenLo ? lo : Infinity, hi: seenHi ? hi : -Infinity, bad };
}

/**
 * {@link lawData} for unweighted data whose range and first bad point are known (analyzeRecord's flow-curve pass
 * finds them with lawDataLogged's own comparisons, `flowColumns`): the same LawData without a pass over the data,
 * and ln x made only when first read (`lx[i]` = Math.log(x[i]), the numbers lawData makes). On a long flow curve
 * the fits work on block moments and averages and never read it: a column of 766,764 logarithms (6 MB of fresh
 * memory) is not made. `lo`, `hi`: smallest and largest x (Infinity and −Infinity for no data); `bad`: index of
 * the first point whose x or y is not finite and > 0, or −1. Units as lawData.
 * @example lawDataRanged(Float64Array.of(0.1), Float64Array.of(300), 0.1, 0.1, -1).lx[0] // Math.log(0.1)
 */
export function lawDataRanged(x: Float64Array, y: Float64Array, lo: number, hi: number, bad: number): LawData {
  let lx: Float64Array | null = null;
  return { x, y, w: null, get lx() { return (lx ??= Float64Array.from(x, Math.log)); }, lo, hi, bad };
}

function packed(x: ArrayLike<number>, y: ArrayLike<number>, w: Float64Array | null): LawData {
  const xs = x instanceof Float64Array ? x : Float64Array.from(x as ArrayLike<number>);
  const ys = y instanceof Float64Array ? y : Float64Array.from(y as ArrayLike<number>);
  const lx = new Float64Array(xs.length);
  // lo and hi start as 0 with flags (the first value below +∞, above −∞, as comparisons with ±∞ starts would
  // take): an ±Infinity start made V8 box every new extreme, one heap number a point of a rising curve.
  let lo = 0, hi = 0, seenLo = false, seenHi = false, bad = -1;
  for (let i = 0; i < xs.length; i++) {
    const e = xs[i]!, s = ys[i]!;
    if (bad < 0 && (!(e > 0) || !(e < Infinity) || !(s > 0) || !(s < Infinity))) bad = i;
    if (seenLo ? e < lo : e < Infinity) { lo = e; seenLo = true; }
    if (seenHi ? e > hi : e > -Infinity) { hi = e; seenHi = true; }
    lx[i] = Math.log(e);
  }
  return { x: xs, y: ys, w, lx, lo: seenLo ? lo : Infinity, hi: seenHi ? hi : -Infinity, bad };
}

/**
 * The least-squares problem of fitting `law` to weighted data, for {@link levenbergMarquardtNormal}:
 * S(p) = Σ wᵢ(σ(xᵢ; p) − yᵢ)², and JᵀWJ, JᵀWr built in ONE fused pass per call (each point's
 * analytic gradient goes straight into the m×m sums; no n×m Jacobian is stored). Parameters outside
 * `lower`…`upper` or a non-finite stress give Infinity (the step is rejected, never NaN).
 * Formulas: see {@link lawJacobian} (the same derivatives, checked against central differences).
 * Source of the normal-equation form: Å. Björck, *Numerical Methods for Least Squares Problems*
 * (SIAM 1996) §2.1 (from memory). Units: strain true plastic, stress MPa.
 * @example levenbergMarquardtNormal(lawNormalProblem('voce', lawData(x, y), lower, upper), start, { lower, upper })
 */
export function lawNormalProblem(law: LawName, d: LawData, lower: readonly number[], upper: readonly number[]): NormalProblem {
  if (law === 'swiftVoce') return swiftVoceProblem(d, lower, upper);
  if (law === 'hockettSherby') return hockettSherbyProblem(d, lower, upper);
  return pointProblem(law, d, lower, upper);
}

/**
 * {@link lawNormalProblem} through POINT's shared call site, for every law (the written-out forms of
 * the blend and Hockett–Sherby are checked against it bit for bit in test/core/fit/normal.test.ts).
 */
export function pointProblem(law: LawName, d: LawData, lower: readonly number[], upper: readonly number[]): NormalProblem {
  const pt = POINT[law];
  const m = lower.length;
  const gr = new Float64Array(m);
  const { x, y, w, lx } = d;
  const n = x.length;
  const inBox = (p: Float64Array) => {
    for (let j = 0; j < m; j++) if (!(p[j]! >= lower[j]! && p[j]! <= upper[j]!)) return false;
    return true;
  };
  return {
    m,
    cost(p) {
      if (!inBox(p)) return Infinity;
      let s = 0;
      for (let i = 0; i < n; i++) {
        const r = pt(x[i]!, lx[i]!, p, gr) - y[i]!;
        s += w ? w[i]! * r * r : r * r;
      }
      return Number.isFinite(s) ? s : Infinity;
    },
    normal(p, A, g) {
      A.fill(0);
      g.fill(0);
      if (!inBox(p)) return Infinity;
      const s = pointSums(pt, x, lx, y, w, n, m, p, gr, A, g);
      mirrorLower(A, m);
      return Number.isFinite(s) ? s : Infinity;
    },
  };
}

// The normal equations' data loops live in functions of their own, apart from the code that runs after them
// (the mirror of JᵀJ's lower triangle, the finite check). With the loop inside `normal`, the engine compiled
// `normal` on the stack during its first call's loop, before the code after the loop had run once, and the
// compiled code gave up at that code's first comparison ("insufficient type feedback"): measured 21–149 such
// deoptimisations of `normal` per 1,000,000-row analysis, each sending the next steps back to the slow tiers
// (speed follow-up K). The operations and their order are unchanged (test/core/fit/normal.test.ts).

/** Σ wᵢrᵢ² of POINT[law] over the data, adding Σ wᵢ∇ᵢ∇ᵢᵀ (lower triangle) into A and Σ wᵢ∇ᵢrᵢ into g. */
function pointSums(pt: PointFn, x: Float64Array, lx: Float64Array, y: Float64Array, w: Float64Array | null, n: number, m: number, p: Float64Array, gr: Float64Array, A: Float64Array, g: Float64Array): number {
  let s = 0;
  for (let i = 0; i < n; i++) {
    const r = pt(x[i]!, lx[i]!, p, gr) - y[i]!;
    const wi = w ? w[i]! : 1;
    s += wi * r * r;
    for (let a = 0; a < m; a++) {
      const ga = wi * gr[a]!;
      g[a] = g[a]! + ga * r;
      const row = a * m;
      for (let b = 0; b <= a; b++) A[row + b] = A[row + b]! + ga * gr[b]!;
    }
  }
  return s;
}

/** Copies the lower triangle of the m×m row-major A into its upper triangle. */
function mirrorLower(A: Float64Array, m: number): void {
  for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) A[b * m + a] = A[a * m + b]!;
}

/**
 * {@link lawNormalProblem} for the Swift–Voce blend with POINT.swiftVoce written out in the loops: the
 * same operations in the same order (so the same sums, bit for bit; test/core/fit checks the fits),
 * but a call the engine can inline. The blend's fit is the longest of the six (≈140 steps on a
 * 1,000,000-row record) and on the runner's critical path; through POINT's shared call site its
 * steps took twice as long (bench/RESULTS.md, issue 12 E).
 */
function swiftVoceProblem(d: LawData, lower: readonly number[], upper: readonly number[]): NormalProblem {
  const m = 7;
  const gr = new Float64Array(m);
  const { x, y, w } = d;
  const n = x.length;
  const inBox = (p: Float64Array) => {
    for (let j = 0; j < m; j++) if (!(p[j]! >= lower[j]! && p[j]! <= upper[j]!)) return false;
    return true;
  };
  return {
    m,
    cost(p) {
      if (!inBox(p)) return Infinity;
      const al = p[0]!, K = p[1]!, e0 = p[2]!, k = p[3]!, s0 = p[4]!, Q = p[5]!, b = p[6]!;
      let s = 0;
      for (let i = 0; i < n; i++) {
        const xi = x[i]!;
        const S = K * Math.exp(k * Math.log(e0 + xi));
        const om = -Math.expm1(-b * xi);
        const V = s0 + Q * om;
        const r = al * S + (1 - al) * V - y[i]!;
        s += w ? w[i]! * r * r : r * r;
      }
      return Number.isFinite(s) ? s : Infinity;
    },
    normal(p, A, g) {
      A.fill(0);
      g.fill(0);
      if (!inBox(p)) return Infinity;
      const s = swiftVoceSums(x, y, w, n, p, gr, A, g);
      mirrorLower(A, m);
      return Number.isFinite(s) ? s : Infinity;
    },
  };
}

/** {@link pointSums} of the Swift–Voce blend, POINT.swiftVoce written out (m = 7; see swiftVoceProblem). */
function swiftVoceSums(x: Float64Array, y: Float64Array, w: Float64Array | null, n: number, p: Float64Array, gr: Float64Array, A: Float64Array, g: Float64Array): number {
  const m = 7;
  const al = p[0]!, K = p[1]!, e0 = p[2]!, k = p[3]!, s0 = p[4]!, Q = p[5]!, b = p[6]!;
  const c = 1 - al;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const xi = x[i]!;
    // swiftAt(x, p, 1, al, gr, 1)
    const u = e0 + xi, lu = Math.log(u), P = Math.exp(k * lu), S = K * P;
    gr[1] = al * P; gr[2] = (al * k * S) / u; gr[3] = al * S * lu;
    // voceAt(x, p, 4, 1 − al, gr, 4)
    const E = Math.exp(-b * xi), om = -Math.expm1(-b * xi);
    gr[4] = c; gr[5] = c * om; gr[6] = c * Q * xi * E;
    const V = s0 + Q * om;
    gr[0] = S - V;
    const r = al * S + (1 - al) * V - y[i]!;
    const wi = w ? w[i]! : 1;
    s += wi * r * r;
    for (let a = 0; a < m; a++) {
      const ga = wi * gr[a]!;
      g[a] = g[a]! + ga * r;
      const row = a * m;
      for (let bb = 0; bb <= a; bb++) A[row + bb] = A[row + bb]! + ga * gr[bb]!;
    }
  }
  return s;
}

/**
 * {@link lawNormalProblem} for Hockett–Sherby with POINT.hockettSherby written out in the loops (the
 * same operations in the same order, as {@link swiftVoceProblem}): its fit is the second longest
 * (≈75 steps on a 1,000,000-row record) and the longest on the runner's helper thread.
 */
function hockettSherbyProblem(d: LawData, lower: readonly number[], upper: readonly number[]): NormalProblem {
  const m = 4;
  const gr = new Float64Array(m);
  const { y, w, lx } = d;
  const n = d.x.length;
  const inBox = (p: Float64Array) => {
    for (let j = 0; j < m; j++) if (!(p[j]! >= lower[j]! && p[j]! <= upper[j]!)) return false;
    return true;
  };
  return {
    m,
    cost(p) {
      if (!inBox(p)) return Infinity;
      const sat = p[0]!, s0 = p[1]!, a = p[2]!, e = p[3]!;
      const dd = sat - s0;
      let s = 0;
      for (let i = 0; i < n; i++) {
        const dE = dd * Math.exp(-a * Math.exp(e * lx[i]!));
        const r = (dd > 0 ? sat - dE : NaN) - y[i]!;
        s += w ? w[i]! * r * r : r * r;
      }
      return Number.isFinite(s) ? s : Infinity;
    },
    normal(p, A, g) {
      A.fill(0);
      g.fill(0);
      if (!inBox(p)) return Infinity;
      const s = hockettSherbySums(lx, y, w, n, p, gr, A, g);
      mirrorLower(A, m);
      return Number.isFinite(s) ? s : Infinity;
    },
  };
}

/** {@link pointSums} of Hockett–Sherby, POINT.hockettSherby written out (m = 4; see hockettSherbyProblem). */
function hockettSherbySums(lx: Float64Array, y: Float64Array, w: Float64Array | null, n: number, p: Float64Array, gr: Float64Array, A: Float64Array, g: Float64Array): number {
  const m = 4;
  const sat = p[0]!, s0 = p[1]!, a = p[2]!, e = p[3]!;
  const dd = sat - s0;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const li = lx[i]!;
    const X = Math.exp(e * li), E = Math.exp(-a * X), dE = dd * E;
    gr[0] = 1 - E; gr[1] = E; gr[2] = dE * X; gr[3] = dE * a * X * li;
    const r = (dd > 0 ? sat - dE : NaN) - y[i]!;
    const wi = w ? w[i]! : 1;
    s += wi * r * r;
    for (let q = 0; q < m; q++) {
      const ga = wi * gr[q]!;
      g[q] = g[q]! + ga * r;
      const row = q * m;
      for (let bb = 0; bb <= q; bb++) A[row + bb] = A[row + bb]! + ga * gr[bb]!;
    }
  }
  return s;
}

/**
 * The fitted law on the full curve in one pass: residuals (model − data), SSR, SST, and the lag-1
 * sum Σ rᵢrᵢ₋₁ (for the residuals' autocorrelation). Units MPa, MPa².
 */
export function lawResidualPass(law: LawName, d: LawData, p: Float64Array): { residuals: number[]; ssr: number; sst: number; lag1: number; ok: boolean } {
  return { residuals: lawResiduals(law, d, p), ...lawResidualStats(law, d, p) };
}

/**
 * SSR, SST and the lag-1 sum of the fitted law on the full curve, without keeping the residuals
 * (fitLaw makes those only when they are read). Units MPa².
 */
export function lawResidualStats(law: LawName, d: LawData, p: Float64Array): { ssr: number; sst: number; lag1: number; ok: boolean } {
  const { x, y, lx } = d;
  const n = x.length;
  // The model values first, in one tight loop per law (value only, no gradient; the same operations as
  // POINT, so the same numbers bit for bit). Measured on a 766,736-point curve: 7 passes took 480 ms
  // through POINT's shared call site, which V8 cannot inline across six laws (bench/RESULTS.md, issue 12 D).
  const m = (d.scratch ??= new Float64Array(n));
  lawValues(law, x, lx, p, m);
  let my = 0;
  for (let i = 0; i < n; i++) my += y[i]!;
  my /= n;
  let ssr = 0, sst = 0, lag1 = 0, prev = 0;
  for (let i = 0; i < n; i++) {
    const r = m[i]! - y[i]!;
    ssr += r * r;
    if (i > 0) lag1 += r * prev;
    prev = r;
    const dy = y[i]! - my;
    sst += dy * dy;
  }
  return { ssr, sst, lag1, ok: Number.isFinite(ssr) };
}

/** Residuals (model − data) of the law at `p` on every point of `d`, MPa. */
export function lawResiduals(law: LawName, d: LawData, p: Float64Array): number[] {
  const n = d.x.length, y = d.y;
  const m = (d.scratch ??= new Float64Array(n));
  lawValues(law, d.x, d.lx, p, m);
  const residuals = new Array<number>(n);
  for (let i = 0; i < n; i++) residuals[i] = m[i]! - y[i]!;
  return residuals;
}

/**
 * σ(xᵢ; p) of `law` into `out` (formulas of POINT, value only; NaN outside the law's domain). `lx` is
 * ln x. Units: strain true plastic, stress MPa. Formulas and sources: the law files in core/flow.
 * @example lawValues('hollomon', Float64Array.of(0.1), Float64Array.of(Math.log(0.1)), Float64Array.of(530, 0.44), out) // out[0] ≈ 192.6
 */
export function lawValues(law: LawName, x: Float64Array, lx: Float64Array, p: Float64Array, out: Float64Array): void {
  // One function per law (not one loop per case of a switch here): compiled while only some laws had run, a
  // shared function gave up at the first case without type feedback (3–4 times per analysis; speed follow-up K).
  const n = x.length;
  switch (law) {
    case 'hollomon': return hollomonValues(n, lx, p, out);
    case 'ludwik': return ludwikValues(n, lx, p, out);
    case 'swift': return swiftValues(n, x, p, out);
    case 'voce': return voceValues(n, x, p, out);
    case 'hockettSherby': return hockettSherbyValues(n, lx, p, out);
    case 'swiftVoce': return swiftVoceValues(n, x, p, out);
  }
}

function hollomonValues(n: number, lx: Float64Array, p: Float64Array, out: Float64Array): void {
  const K = p[0]!, e = p[1]!;
  for (let i = 0; i < n; i++) out[i] = K * Math.exp(e * lx[i]!);
}

function ludwikValues(n: number, lx: Float64Array, p: Float64Array, out: Float64Array): void {
  const s0 = p[0]!, K = p[1]!, e = p[2]!;
  for (let i = 0; i < n; i++) out[i] = s0 + K * Math.exp(e * lx[i]!);
}

function swiftValues(n: number, x: Float64Array, p: Float64Array, out: Float64Array): void {
  const K = p[0]!, e0 = p[1]!, e = p[2]!;
  for (let i = 0; i < n; i++) out[i] = K * Math.exp(e * Math.log(e0 + x[i]!));
}

function voceValues(n: number, x: Float64Array, p: Float64Array, out: Float64Array): void {
  const s0 = p[0]!, Q = p[1]!, b = p[2]!;
  for (let i = 0; i < n; i++) out[i] = s0 + Q * -Math.expm1(-b * x[i]!);
}

function hockettSherbyValues(n: number, lx: Float64Array, p: Float64Array, out: Float64Array): void {
  const sat = p[0]!, s0 = p[1]!, a = p[2]!, e = p[3]!;
  const dd = sat - s0;
  if (!(dd > 0)) { out.fill(NaN); return; }
  for (let i = 0; i < n; i++) out[i] = sat - dd * Math.exp(-a * Math.exp(e * lx[i]!));
}

function swiftVoceValues(n: number, x: Float64Array, p: Float64Array, out: Float64Array): void {
  const al = p[0]!, K = p[1]!, e0 = p[2]!, e = p[3]!, s0 = p[4]!, Q = p[5]!, b = p[6]!;
  for (let i = 0; i < n; i++) {
    const xi = x[i]!;
    out[i] = al * (K * Math.exp(e * Math.log(e0 + xi))) + (1 - al) * (s0 + Q * -Math.expm1(-b * xi));
  }
}
