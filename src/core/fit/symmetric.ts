/**
 * Cholesky factorisation of a small symmetric positive-definite matrix (row-major, m×m), in place
 * into a new lower-triangular array. Returns null when a pivot is not positive relative to the
 * diagonal (rank-deficient or indefinite). Source: G. H. Golub and C. F. Van Loan, *Matrix
 * Computations*, 4th ed., Algorithm 4.2.1. Hand-written because the systems are at most 7×7.
 */
export function cholesky(a: Float64Array, m: number, relPivot = 1e-13): Float64Array | null {
  const L = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    let d = a[j * m + j]!;
    for (let k = 0; k < j; k++) d -= L[j * m + k]! * L[j * m + k]!;
    if (!(d > relPivot * Math.abs(a[j * m + j]!)) || !(d > 0)) return null;
    const ljj = Math.sqrt(d);
    L[j * m + j] = ljj;
    for (let i = j + 1; i < m; i++) {
      let s = a[i * m + j]!;
      for (let k = 0; k < j; k++) s -= L[i * m + k]! * L[j * m + k]!;
      L[i * m + j] = s / ljj;
    }
  }
  return L;
}

/** Solves L·Lᵀ·x = b for a Cholesky factor L (m×m). */
export function choleskySolve(L: Float64Array, m: number, b: Float64Array): Float64Array {
  const y = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    let s = b[i]!;
    for (let k = 0; k < i; k++) s -= L[i * m + k]! * y[k]!;
    y[i] = s / L[i * m + i]!;
  }
  const x = new Float64Array(m);
  for (let i = m - 1; i >= 0; i--) {
    let s = y[i]!;
    for (let k = i + 1; k < m; k++) s -= L[k * m + i]! * x[k]!;
    x[i] = s / L[i * m + i]!;
  }
  return x;
}

/** Inverse of a symmetric positive-definite matrix via its Cholesky factor; null when singular. */
export function invertSymmetric(a: Float64Array, m: number): Float64Array | null {
  // Scale to unit diagonal first so that the singularity test is independent of parameter units.
  const s = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const d = a[i * m + i]!;
    if (!(d > 0)) return null;
    s[i] = 1 / Math.sqrt(d);
  }
  const c = new Float64Array(m * m);
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) c[i * m + j] = a[i * m + j]! * s[i]! * s[j]!;
  const L = cholesky(c, m, 1e-12);
  if (!L) return null;
  const inv = new Float64Array(m * m);
  const e = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    e.fill(0);
    e[j] = 1;
    const col = choleskySolve(L, m, e);
    for (let i = 0; i < m; i++) inv[i * m + j] = col[i]! * s[i]! * s[j]!;
  }
  return inv;
}
