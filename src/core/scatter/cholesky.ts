import { InputError } from '../errors.js';
import { sig4 } from '../numeric/sig4.js';

/**
 * Cholesky factor L (lower triangular, R = L·Lᵀ) of a symmetric positive-definite matrix, by the
 * Cholesky–Banachiewicz algorithm (Golub & Van Loan, *Matrix Computations*, 4th ed., Alg. 4.2.1).
 * Used to give independent standard normal deviates z the correlation R: x = L·z.
 * Units: none (a correlation or covariance matrix). Valid range: symmetric, positive definite.
 * @throws InputError naming `path` when the matrix is not square, not symmetric, or not positive
 * definite (the message names the first pivot that is not positive).
 * @example cholesky([[1, -0.5], [-0.5, 1]]) // [[1, 0], [-0.5, 0.8660254]]
 */
export function cholesky(a: readonly (readonly number[])[], path = 'correlation'): number[][] {
  const n = a.length;
  for (let i = 0; i < n; i++) {
    const row = a[i]!;
    if (row.length !== n) throw new InputError(`${path}[${i}]`, row.length, `a row of ${n} numbers (a square matrix)`);
    for (let j = 0; j < n; j++) {
      if (!Number.isFinite(row[j]!)) throw new InputError(`${path}[${i}][${j}]`, row[j], 'a finite number');
      if (Math.abs(row[j]! - a[j]![i]!) > 1e-12 * Math.max(1, Math.abs(row[j]!))) {
        throw new InputError(`${path}[${i}][${j}]`, row[j], `the same value as [${j}][${i}] (${a[j]![i]}): a symmetric matrix`);
      }
    }
  }
  const L: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i]![j]!;
      for (let k = 0; k < j; k++) s -= L[i]![k]! * L[j]![k]!;
      if (i === j) {
        if (!(s > 1e-12)) {
          throw new InputError(path, a.map((r) => [...r]), 'a positive-definite matrix (every leading minor > 0)',
            `not positive definite at pivot ${i + 1} (remaining variance ${sig4(s)}); the correlations contradict each other`);
        }
        L[i]![i] = Math.sqrt(s);
      } else {
        L[i]![j] = s / L[j]![j]!;
      }
    }
  }
  return L;
}
