import type { LawName } from '../flow/types.js';

/**
 * Values and analytic Jacobian of a law at fixed strains, for the fitter (one pass, shared powers and
 * exponentials; finite differences would cost one more pass per parameter). Parameters in
 * LAW_PARAMETERS order; writes f (n) and J (n×m row-major, ∂σ/∂p). Returns false outside the law's
 * domain (the fitter then rejects the point or falls back to differences).
 * Formulas (x = true plastic strain > 0): Hollomon σ = K·xⁿ: ∂K = xⁿ, ∂n = σ·ln x. Ludwik σ = σ0 + K·xⁿ:
 * ∂σ0 = 1. Swift σ = K(ε0 + x)ⁿ: ∂ε0 = nσ/(ε0 + x), ∂n = σ·ln(ε0 + x). Voce σ = σ0 + Q(1 − e^(−bx)):
 * ∂Q = 1 − e^(−bx), ∂b = Q·x·e^(−bx). Hockett–Sherby σ = σs − (σs − σ0)·e^(−a·xᵖ): ∂σs = 1 − E,
 * ∂σ0 = E, ∂a = (σs − σ0)·xᵖ·E, ∂p = (σs − σ0)·E·a·xᵖ·ln x. Swift–Voce α·S + (1 − α)·V: ∂α = S − V.
 * Checked against central differences of makeLaw's stress (test/core/fit/jacobian.test.ts).
 */
export function lawJacobian(law: LawName, x: ArrayLike<number>, p: Float64Array, f: Float64Array, J: Float64Array | null): boolean {
  const n = x.length;
  const lnx = law === 'hollomon' || law === 'ludwik' || law === 'hockettSherby' ? logsOf(x) : null;
  switch (law) {
    case 'hollomon': {
      const K = p[0]!, m = p[1]!;
      for (let i = 0; i < n; i++) {
        const lx = lnx![i]!, P = Math.exp(m * lx);
        f[i] = K * P;
        if (J) { J[i * 2] = P; J[i * 2 + 1] = K * P * lx; }
      }
      return true;
    }
    case 'ludwik': {
      const s0 = p[0]!, K = p[1]!, m = p[2]!;
      for (let i = 0; i < n; i++) {
        const lx = lnx![i]!, P = Math.exp(m * lx);
        f[i] = s0 + K * P;
        if (J) { J[i * 3] = 1; J[i * 3 + 1] = P; J[i * 3 + 2] = K * P * lx; }
      }
      return true;
    }
    case 'swift': return swiftPart(x, p, 0, 1, f, J, 3, 0);
    case 'voce': return vocePart(x, p, 0, 1, f, J, 3, 0);
    case 'hockettSherby': {
      const sat = p[0]!, s0 = p[1]!, a = p[2]!, q = p[3]!;
      if (!(s0 < sat)) return false;
      const d = sat - s0;
      for (let i = 0; i < n; i++) {
        const lx = lnx![i]!, X = Math.exp(q * lx), E = Math.exp(-a * X);
        f[i] = sat - d * E;
        if (J) { const r = i * 4; J[r] = 1 - E; J[r + 1] = E; J[r + 2] = d * X * E; J[r + 3] = d * E * a * X * lx; }
      }
      return true;
    }
    case 'swiftVoce': {
      const al = p[0]!;
      const S = new Float64Array(n), V = new Float64Array(n);
      const JS = J ? new Float64Array(n * 3) : null, JV = J ? new Float64Array(n * 3) : null;
      swiftPart(x, p, 1, 1, S, JS, 3, 0);
      vocePart(x, p, 4, 1, V, JV, 3, 0);
      for (let i = 0; i < n; i++) {
        f[i] = al * S[i]! + (1 - al) * V[i]!;
        if (J) {
          const r = i * 7;
          J[r] = S[i]! - V[i]!;
          for (let k = 0; k < 3; k++) { J[r + 1 + k] = al * JS![i * 3 + k]!; J[r + 4 + k] = (1 - al) * JV![i * 3 + k]!; }
        }
      }
      return true;
    }
  }
}

/** ln x of the fixed strains, computed once per strain array (a fit evaluates the model many times). */
const LOGS = new WeakMap<object, Float64Array>();
function logsOf(x: ArrayLike<number>): Float64Array {
  let l = LOGS.get(x as object);
  if (!l || l.length !== x.length) {
    l = Float64Array.from({ length: x.length }, (_, i) => Math.log(x[i]!));
    LOGS.set(x as object, l);
  }
  return l;
}

function swiftPart(x: ArrayLike<number>, p: Float64Array, o: number, scale: number, f: Float64Array, J: Float64Array | null, m: number, c: number): boolean {
  const K = p[o]!, e0 = p[o + 1]!, k = p[o + 2]!;
  for (let i = 0; i < x.length; i++) {
    const u = e0 + x[i]!, lu = Math.log(u), P = Math.exp(k * lu), s = K * P;
    f[i] = scale * s;
    if (J) { const r = i * m + c; J[r] = P; J[r + 1] = (k * s) / u; J[r + 2] = s * lu; }
  }
  return true;
}

function vocePart(x: ArrayLike<number>, p: Float64Array, o: number, scale: number, f: Float64Array, J: Float64Array | null, m: number, c: number): boolean {
  const s0 = p[o]!, Q = p[o + 1]!, b = p[o + 2]!;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i]!, E = Math.exp(-b * xi), om = -Math.expm1(-b * xi);
    f[i] = scale * (s0 + Q * om);
    if (J) { const r = i * m + c; J[r] = 1; J[r + 1] = om; J[r + 2] = Q * xi * E; }
  }
  return true;
}
