import { InputError } from '../errors.js';
import { cholesky, choleskySolve } from './symmetric.js';

/**
 * A model evaluated at fixed abscissae: returns the predictions for parameter vector `p`, or null
 * when `p` is outside the model's domain (the step is then rejected, never turned into NaN).
 */
export type Model = (p: Float64Array) => Float64Array | null;

export interface LmOptions {
  /** Lower and upper bound of each parameter (finite or ±Infinity); lower = upper holds that parameter at the value. */
  lower: readonly number[];
  upper: readonly number[];
  /** Most iterations; defaults to {@link LM_DEFAULTS}.maxIterations. */
  maxIterations?: number;
  /** Stop when an accepted step lowers the cost by less than this fraction. */
  costTolerance?: number;
  /** Stop when every step component is below this fraction of its parameter. */
  stepTolerance?: number;
  /** Analytic Jacobian: fills `out` (n×m row-major) at `p`; returns false to fall back to differences. */
  jacobian?: (p: Float64Array, out: Float64Array) => boolean;
}

/** The one place the solver defaults live. */
export const LM_DEFAULTS = { maxIterations: 500, costTolerance: 1e-10, stepTolerance: 1e-9, gradientTolerance: 1e-10 } as const;

export interface LmResult {
  params: Float64Array;
  /** True when a tolerance was met before the iteration limit. */
  converged: boolean;
  iterations: number;
  /** Residual sum of squares Σ(model − y)² at `params`. */
  residual: number;
  /** Why it stopped, in words. */
  reason: string;
  /** Jacobian at `params` (n×m, row-major), for the covariance. */
  jacobian: Float64Array;
  /** Model values at `params`. */
  predicted: Float64Array;
  /** Per parameter: true when it ended on a bound with the gradient pushing outward (never for a held one). */
  atBound: boolean[];
}

/**
 * A least-squares problem as the solver sees it: the cost and the normal equations at a parameter
 * vector, so a caller can build JᵀJ and Jᵀr in one fused pass over its data without ever holding
 * the n×m Jacobian (see `fit/lawNormalEquations.ts`).
 */
export interface NormalProblem {
  /** Number of parameters. */
  m: number;
  /** S(p) = Σ wᵢ·(f(p)ᵢ − yᵢ)², or Infinity outside the model's domain. */
  cost(p: Float64Array): number;
  /**
   * Fills JtJ (m×m, row-major, both triangles) with Σ wᵢ·∇fᵢ∇fᵢᵀ and g (m) with Σ wᵢ·∇fᵢ·rᵢ (rᵢ = fᵢ − yᵢ)
   * at p and returns S(p), the same number `cost(p)` returns (the solver takes trial costs from it);
   * Infinity outside the domain.
   */
  normal(p: Float64Array, JtJ: Float64Array, g: Float64Array): number;
}

/** What {@link levenbergMarquardtNormal} returns: the solution and JᵀJ there (for the covariance). */
export interface NormalLmResult {
  params: Float64Array;
  converged: boolean;
  iterations: number;
  /** S at `params`. */
  residual: number;
  reason: string;
  /** JᵀJ at `params` (m×m, row-major). */
  JtJ: Float64Array;
  atBound: boolean[];
}

/**
 * The same bounded Levenberg–Marquardt as {@link levenbergMarquardt} (Marquardt scaling, Nielsen's
 * damping update, active-set projection on the box), working on the normal equations a problem
 * builds itself: memory O(m²) instead of O(n·m), one pass over the data per accepted step.
 * Sources as for {@link levenbergMarquardt}. Units: those of the model.
 * @throws InputError when the start is outside the box or the cost is not finite there.
 * @example levenbergMarquardtNormal(lawNormalProblem('voce', x, y, null), start, { lower, upper }).params
 */
export function levenbergMarquardtNormal(problem: NormalProblem, start: readonly number[], opts: LmOptions): NormalLmResult {
  const m = start.length;
  const { lower, upper } = opts;
  const maxIt = opts.maxIterations ?? LM_DEFAULTS.maxIterations;
  const ftol = opts.costTolerance ?? LM_DEFAULTS.costTolerance;
  const xtol = opts.stepTolerance ?? LM_DEFAULTS.stepTolerance;
  const p = Float64Array.from(start);
  for (let j = 0; j < m; j++) {
    if (!(p[j]! >= lower[j]! && p[j]! <= upper[j]!)) throw new InputError(`start[${j}]`, p[j], `a number in [${lower[j]}, ${upper[j]}]`);
  }
  const JtJ = new Float64Array(m * m);
  const g = new Float64Array(m);
  // A trial point's cost comes from `normal` into these, kept when the step is taken: one pass over the data
  // per accepted step instead of a cost pass and a normal pass (the same S, so the same steps and fits).
  const JtJq = new Float64Array(m * m);
  const gq = new Float64Array(m);
  let S = problem.normal(p, JtJ, g);
  if (!Number.isFinite(S)) throw new InputError('start', Array.from(p), 'a start where the model gives finite values');
  let lambda = 1e-3;
  let nu = 2;
  let it = 0;
  let converged = false;
  let reason = 'iteration limit reached';
  let atBound: boolean[] = new Array(m).fill(false);
  outer: for (it = 1; it <= maxIt; it++) {
    // Active set: on a bound with the descent direction (−g) pointing out of the box.
    // A parameter whose box is one point (lower = upper) is held: never free, never reported on a bound.
    atBound = Array.from({ length: m }, (_, j) => lower[j]! < upper[j]! && ((p[j]! <= lower[j]! && g[j]! > 0) || (p[j]! >= upper[j]! && g[j]! < 0)));
    const free: number[] = [];
    for (let j = 0; j < m; j++) if (!atBound[j] && lower[j]! < upper[j]! && JtJ[j * m + j]! > 0) free.push(j);
    let gmax = 0;
    for (const j of free) gmax = Math.max(gmax, Math.abs(g[j]!) / Math.sqrt(JtJ[j * m + j]! * Math.max(S, 1e-300)));
    if (free.length === 0 || gmax < LM_DEFAULTS.gradientTolerance) {
      converged = true;
      reason = free.length === 0 ? 'every parameter is held at a bound' : 'gradient below tolerance';
      break;
    }
    const k = free.length;
    const A = new Float64Array(k * k);
    const rhs = new Float64Array(k);
    for (let retry = 0; retry < 60; retry++) {
      for (let a = 0; a < k; a++) {
        const fa = free[a]!;
        rhs[a] = -g[fa]!;
        for (let b = 0; b < k; b++) A[a * k + b] = JtJ[fa * m + free[b]!]!;
        A[a * k + a] = JtJ[fa * m + fa]! * (1 + lambda);
      }
      const L = cholesky(A, k, 1e-15);
      if (!L) {
        lambda *= 4;
        continue;
      }
      const d = choleskySolve(L, k, rhs);
      const q = Float64Array.from(p);
      let small = true;
      for (let a = 0; a < k; a++) {
        const j = free[a]!;
        q[j] = Math.min(upper[j]!, Math.max(lower[j]!, p[j]! + d[a]!));
        if (Math.abs(q[j]! - p[j]!) > xtol * (Math.abs(p[j]!) + xtol)) small = false;
      }
      const Sq = problem.normal(q, JtJq, gq);
      if (Sq < S) {
        const drop = (S - Sq) / Math.max(S, 1e-300);
        // Gain ratio ρ = actual / predicted fall of S (predicted from the linear model, with the projected step).
        let pred = 0;
        for (let a = 0; a < k; a++) {
          const j = free[a]!;
          const dj = q[j]! - p[j]!;
          let jd = 0;
          for (let b = 0; b < k; b++) jd += JtJ[j * m + free[b]!]! * (q[free[b]!]! - p[free[b]!]!);
          pred += -2 * g[j]! * dj - dj * jd;
        }
        const rho = pred > 0 ? (S - Sq) / pred : 0.5;
        p.set(q);
        S = Sq;
        JtJ.set(JtJq);
        g.set(gq);
        lambda = Math.max(lambda * Math.max(1 / 3, 1 - (2 * rho - 1) ** 3), 1e-10);
        nu = 2;
        if (drop < ftol || small) {
          converged = true;
          reason = drop < ftol ? 'relative fall of the cost below tolerance' : 'step below tolerance';
          break outer;
        }
        continue outer;
      }
      if (small) {
        converged = true;
        reason = 'no smaller cost within the step tolerance';
        break outer;
      }
      lambda *= nu;
      nu *= 2;
      if (lambda > 1e16) {
        converged = true;
        reason = 'no descent direction left (damping at its limit)';
        break outer;
      }
    }
  }
  if (it > maxIt) it = maxIt;
  return { params: p, converged, iterations: it, residual: S, reason, JtJ, atBound };
}

/**
 * Levenberg–Marquardt least squares with box bounds, for models of a few parameters.
 *
 * Minimises S(p) = Σᵢ (f(p)ᵢ − yᵢ)² subject to lower ≤ p ≤ upper. Each iteration solves
 * (JᵀJ + λ·diag(JᵀJ))·δ = −Jᵀr (Marquardt's scaling, so the step is invariant to parameter units),
 * projects p + δ onto the box, and accepts it when S falls (λ ← λ·max(1/3, 1 − (2ρ − 1)³) with ρ the ratio of actual to predicted
 * fall), else λ ← ν·λ, ν ← 2ν and retries (Nielsen's damping update, H. B. Nielsen, IMM-REP-1999-05, DTU).
 * Parameters sitting on a bound whose gradient pushes outward are held fixed for that iteration
 * (an active-set projection); a parameter whose bounds are equal is held at that value throughout. The Jacobian is by forward differences, step √ε·max(|p|, 1e-6·scale),
 * taken backward when the forward point is outside the box or the model's domain.
 *
 * Sources: K. Levenberg, *Q. Appl. Math.* 2 (1944) 164–168; D. W. Marquardt, *J. SIAM* 11 (1963)
 * 431–441; J. J. Moré, "The Levenberg–Marquardt algorithm: implementation and theory", in
 * G. A. Watson (ed.), *Numerical Analysis*, Springer LNM vol. 630 (1978) 105–116. Hand-written rather than taken from a library because bounds and the
 * `converged` flag are needed, the systems are tiny (≤ 7 unknowns, Cholesky), and it is checked
 * against ml-levenberg-marquardt and SciPy's curve_fit (test/core/fit, bench/fit.mjs).
 * Units: those of the model. Valid: n ≥ m data, finite start inside the box.
 * @throws InputError when the start is outside the box or the model cannot be evaluated there.
 * @example levenbergMarquardt((p) => Float64Array.from(x, (xi) => p[0]! * xi), y, [1], { lower: [0], upper: [10] })
 */
export function levenbergMarquardt(model: Model, y: ArrayLike<number>, start: readonly number[], opts: LmOptions): LmResult {
  const m = start.length;
  const n = y.length;
  const { lower, upper } = opts;
  const cost = (f: Float64Array | null): number => {
    if (!f) return Infinity;
    let s = 0;
    for (let i = 0; i < n; i++) {
      const r = f[i]! - y[i]!;
      s += r * r;
    }
    return Number.isFinite(s) ? s : Infinity;
  };
  const J = new Float64Array(n * m);
  const jac = (p: Float64Array, fp: Float64Array) => {
    if (opts.jacobian && opts.jacobian(p, J)) return;
    const q = Float64Array.from(p);
    for (let j = 0; j < m; j++) {
      const scale = Math.max(Math.abs(p[j]!), 1e-6 * Math.max(1, Math.abs(upper[j]!) < Infinity ? Math.abs(upper[j]!) : 1), 1e-12);
      let h = 1.4901161193847656e-8 * scale;
      let g: Float64Array | null = null;
      if (p[j]! + h <= upper[j]!) {
        q[j] = p[j]! + h;
        g = model(q);
      }
      if (!g || !Number.isFinite(cost(g))) {
        h = -h;
        q[j] = p[j]! + h;
        g = q[j]! >= lower[j]! ? model(q) : null;
      }
      q[j] = p[j]!;
      for (let i = 0; i < n; i++) J[i * m + j] = g ? (g[i]! - fp[i]!) / h : 0;
    }
  };
  // The last model evaluation, so the normal equations at an accepted trial point reuse it.
  let lastP: Float64Array | null = null;
  let lastF: Float64Array | null = null;
  const evaluate = (p: Float64Array): Float64Array | null => {
    if (lastP && lastP.every((v, j) => v === p[j])) return lastF;
    lastP = Float64Array.from(p);
    lastF = model(p);
    return lastF;
  };
  let jacAt: Float64Array | null = null;
  const problem: NormalProblem = {
    m,
    cost: (p) => cost(evaluate(p)),
    normal: (p, JtJ, g) => {
      const f = evaluate(p);
      const S = cost(f);
      if (!Number.isFinite(S)) return Infinity;
      jac(p, f!);
      jacAt = Float64Array.from(p);
      JtJ.fill(0);
      g.fill(0);
      for (let i = 0; i < n; i++) {
        const r = f![i]! - y[i]!;
        const row = i * m;
        for (let a = 0; a < m; a++) {
          const ja = J[row + a]!;
          g[a] = g[a]! + ja * r;
          for (let b = 0; b <= a; b++) JtJ[a * m + b] = JtJ[a * m + b]! + ja * J[row + b]!;
        }
      }
      for (let a = 0; a < m; a++) for (let b = 0; b < a; b++) JtJ[b * m + a] = JtJ[a * m + b]!;
      return S;
    },
  };
  const res = levenbergMarquardtNormal(problem, start, opts);
  const predicted = evaluate(res.params)!;
  if (!jacAt || !(jacAt as Float64Array).every((v, j) => v === res.params[j])) jac(res.params, predicted);
  return { params: res.params, converged: res.converged, iterations: res.iterations, residual: res.residual, reason: res.reason, jacobian: J, predicted, atBound: res.atBound };
}
