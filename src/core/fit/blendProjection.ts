import { lawBounds } from './fitLaw.js';
import { levenbergMarquardtNormal, type NormalProblem } from './levenbergMarquardt.js';
import type { LawData } from './lawNormalEquations.js';
import { cholesky, choleskySolve } from './symmetric.js';

/** Moment vector of one point: φ1 = (ε0+ε)ⁿ, φ2 = 1, φ3 = 1 − e^(−bε), ∂φ1/∂ε0, ∂φ1/∂n, ∂φ3/∂b, σ. */
const V = 7;
const Y = 6;

/**
 * The weighted moments Σ w·vᵢvⱼ of the moment vector (see V) over the data at θ = (ε0, n, b), both
 * triangles; false outside the domain (ε0 + ε ≤ 0 or a value not finite).
 */
function blendMoments(d: LawData, e0: number, n: number, b: number, mom: Float64Array): boolean {
  mom.fill(0);
  const v = new Float64Array(V);
  const { x, y, w } = d;
  for (let i = 0; i < x.length; i++) {
    const e = x[i]!, u = e0 + e;
    if (!(u > 0)) return false;
    const pw = Math.pow(u, n), ex = Math.exp(-b * e);
    v[0] = pw; v[1] = 1; v[2] = 1 - ex; v[3] = (n * pw) / u; v[4] = pw * Math.log(u); v[5] = e * ex; v[Y] = y[i]!;
    const wi = w ? w[i]! : 1;
    for (let a = 0; a < V; a++) {
      const t = wi * v[a]!;
      for (let c = a; c < V; c++) mom[a * V + c] = mom[a * V + c]! + t * v[c]!;
    }
  }
  for (let a = 0; a < V; a++) for (let c = 0; c < a; c++) mom[a * V + c] = mom[c * V + a]!;
  for (let k = 0; k < V * V; k++) if (!Number.isFinite(mom[k]!)) return false;
  return true;
}

/** Least squares over the columns `idx` of the moments (scaled to unit diagonal first); null when singular. */
function solveColumns(mom: Float64Array, idx: readonly number[]): Float64Array | null {
  const k = idx.length;
  const s = idx.map((a) => 1 / Math.sqrt(mom[a * V + a]!));
  if (!s.every((t) => Number.isFinite(t))) return null;
  const A = new Float64Array(k * k), r = new Float64Array(k);
  for (let a = 0; a < k; a++) {
    r[a] = mom[idx[a]! * V + Y]! * s[a]!;
    for (let c = 0; c < k; c++) A[a * k + c] = mom[idx[a]! * V + idx[c]!]! * s[a]! * s[c]!;
  }
  const L = cholesky(A, k, 1e-15);
  if (!L) return null;
  const z = choleskySolve(L, k, r);
  for (let a = 0; a < k; a++) z[a] = z[a]! * s[a]!;
  return z;
}

/**
 * The non-negative least-squares coefficients (c1, c2, c3) ≥ 0 of φ1, φ2, φ3 from the moments, by trying
 * every set of free columns (seven for three columns) and keeping the feasible one of least sum of squares.
 */
function nonNegativeCoefficients(mom: Float64Array): { c: Float64Array; free: number[] } | null {
  let best: { c: Float64Array; free: number[]; S: number } | null = null;
  for (let mask = 1; mask < 8; mask++) {
    const free = [0, 1, 2].filter((k) => (mask >> k) & 1);
    const z = solveColumns(mom, free);
    if (!z || !z.every((t) => t >= 0)) continue;
    const c = new Float64Array(3);
    free.forEach((k, a) => { c[k] = z[a]!; });
    // Σ(Φc − σ)² from the moments, only to rank the sets (the exact cost is summed point by point).
    let S = mom[Y * V + Y]!;
    for (let a = 0; a < 3; a++) {
      S -= 2 * c[a]! * mom[a * V + Y]!;
      for (let b = 0; b < 3; b++) S += c[a]! * c[b]! * mom[a * V + b]!;
    }
    if (!best || S < best.S) best = { c, free, S };
  }
  return best && { c: best.c, free: best.free };
}

/**
 * The Swift–Voce blend with α held as a variable-projection problem in θ = (ε0, n, b): the stress
 * c1·(ε0+ε)ⁿ + c2 + c3·(1 − e^(−bε)) is linear in c = (αK, (1−α)σ0, (1−α)Q), so for each θ the c ≥ 0 of
 * least squares is solved exactly and the solver moves θ alone, with Kaufman's Jacobian of the
 * projected residual. Sources: G. H. Golub and V. Pereyra, SIAM J. Numer. Anal. 10 (1973) 413–432
 * (variable projection); L. Kaufman, BIT 15 (1975) 49–57 (the simplified Jacobian). Units: strain
 * true plastic, stress MPa.
 */
function blendProjectionProblem(d: LawData): NormalProblem & { coefficients(th: Float64Array): Float64Array | null } {
  const mom = new Float64Array(V * V);
  const solve = (th: Float64Array) => (blendMoments(d, th[0]!, th[1]!, th[2]!, mom) ? nonNegativeCoefficients(mom) : null);
  const normal = (th: Float64Array, JtJ: Float64Array | null, g: Float64Array | null): number => {
    const sol = solve(th);
    if (!sol) return Infinity;
    const { c, free } = sol;
    const e0 = th[0]!, n = th[1]!, b = th[2]!;
    // Exact cost and gradient g = Dᵀr (r = Φc − σ, D the columns c1·∂φ1/∂ε0, c1·∂φ1/∂n, c3·∂φ3/∂b) point by point.
    let S = 0, g0 = 0, g1 = 0, g2 = 0;
    const { x, y, w } = d;
    for (let i = 0; i < x.length; i++) {
      const e = x[i]!, u = e0 + e;
      const pw = Math.pow(u, n), ex = Math.exp(-b * e);
      const r = c[0]! * pw + c[1]! + c[2]! * (1 - ex) - y[i]!;
      const wi = w ? w[i]! : 1;
      S += wi * r * r;
      g0 += wi * r * c[0]! * ((n * pw) / u);
      g1 += wi * r * c[0]! * pw * Math.log(u);
      g2 += wi * r * c[2]! * e * ex;
    }
    if (!Number.isFinite(S)) return Infinity;
    if (!JtJ || !g) return S;
    g[0] = g0; g[1] = g1; g[2] = g2;
    // JᵀJ = DᵀD − DᵀΦ_F (Φ_FᵀΦ_F)⁻¹ Φ_FᵀD over the free columns F (Kaufman), from the moments.
    const dc = [c[0]!, c[0]!, c[2]!]; // coefficient multiplying each derivative column 3, 4, 5
    const k = free.length;
    const P = new Float64Array(k * k);
    for (let a = 0; a < k; a++) for (let q = 0; q < k; q++) P[a * k + q] = mom[free[a]! * V + free[q]!]!;
    const L = cholesky(P, k, 1e-15);
    for (let j = 0; j < 3; j++) {
      for (let l = 0; l < 3; l++) {
        let s = dc[j]! * dc[l]! * mom[(3 + j) * V + 3 + l]!;
        if (L) {
          const pl = new Float64Array(k);
          for (let a = 0; a < k; a++) pl[a] = dc[l]! * mom[(3 + l) * V + free[a]!]!;
          const z = choleskySolve(L, k, pl);
          for (let a = 0; a < k; a++) s -= dc[j]! * mom[(3 + j) * V + free[a]!]! * z[a]!;
        }
        JtJ[j * 3 + l] = s;
      }
    }
    return S;
  };
  return { m: 3, cost: (th) => normal(th, null, null), normal, coefficients: (th) => solve(th)?.c ?? null };
}

/**
 * A start for the Swift–Voce blend with α held at `alpha`, found by variable projection
 * ({@link blendProjectionProblem}) from θ = (ε0, n, b) of `start`: the least-squares (ε0, n, b) and
 * K = c1/α, σ0 = c2/(1−α), Q = c3/(1−α), each within its LAW_PARAMETERS range (lawBounds). fitLawGroup uses it when the
 * blend's own fit does not converge (on a real record, TS275_0003, it crawled 500 steps along a curved
 * valley; projected, the same minimum as SciPy's is found in about ten), then polishes it with fitLaw.
 * Units: strain true plastic, stresses MPa. Valid: 0 < alpha < 1, data with ε > 0.
 * @returns the blend's parameters by name, or null when the projection has no solution.
 * @example blendProjectedStart(lawData(eps, sigma), { eps0: 0.01, n: 0.2, b: 10 }, 0.5) // { alpha: 0.5, K, eps0, n, sigma0, Q, b }
 */
export function blendProjectedStart(d: LawData, start: { eps0: number; n: number; b: number }, alpha: number): Record<string, number> | null {
  // LAW_PARAMETERS order: alpha, K, eps0, n, sigma0, Q, b.
  const bounds = lawBounds('swiftVoce');
  const lower = [2, 3, 6].map((j) => bounds.lower[j]!), upper = [2, 3, 6].map((j) => bounds.upper[j]!);
  const th0 = [start.eps0, start.n, start.b].map((v, j) => Math.min(upper[j]!, Math.max(lower[j]!, v)));
  const problem = blendProjectionProblem(d);
  if (!Number.isFinite(problem.cost(Float64Array.from(th0)))) return null;
  const res = levenbergMarquardtNormal(problem, th0, { lower, upper });
  const c = problem.coefficients(res.params);
  if (!c) return null;
  const clip = (j: number, v: number) => Math.min(bounds.upper[j]!, Math.max(bounds.lower[j]!, v));
  return {
    alpha, K: clip(1, c[0]! / alpha), eps0: res.params[0]!, n: res.params[1]!,
    sigma0: clip(4, c[1]! / (1 - alpha)), Q: clip(5, c[2]! / (1 - alpha)), b: res.params[2]!,
  };
}
