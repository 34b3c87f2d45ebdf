/**
 * Dense Cholesky factorisation A = L Lᵀ on row-major Float64Arrays, written directly
 * because the general ml-matrix routine is several times slower for the small matrices of
 * the bridge hot path. Cholesky–Banachiewicz (row by row) order: both inner-loop operands
 * are contiguous rows of L (Golub & Van Loan, Matrix Computations, 4th ed., Alg. 4.2.1
 * reorders the same computation).
 */
import type { Mat } from '../matrix.ts';
import { NumericError } from './errors.ts';

/**
 * Overwrites the lower triangle of `a` ([n, n] row-major, symmetric; only the lower
 * triangle is read) with L and zeroes the strict upper triangle.
 * Returns -1 on success, or the index of the first non-positive pivot.
 */
export function choleskyInPlace(a: Float64Array, n: number): number {
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    for (let j = 0; j <= i; j++) {
      const rj = j * n;
      let s = a[ri + j]!;
      for (let k = 0; k < j; k++) s -= a[ri + k]! * a[rj + k]!;
      if (i === j) {
        // NaN fails this test too, so a non-finite input never yields a "factor".
        if (!(s > 0) || !Number.isFinite(s)) return i;
        a[ri + i] = Math.sqrt(s);
      } else {
        a[ri + j] = s / a[rj + j]!;
      }
    }
    for (let j = i + 1; j < n; j++) a[ri + j] = 0;
  }
  return -1;
}

/** Lower Cholesky factor of a symmetric positive definite matrix; throws `not-positive-definite`. */
export function cholesky(m: Mat, what = 'matrix'): Mat {
  if (m.rows !== m.cols) {
    throw new NumericError(
      'shape-mismatch',
      `${what}: expected a square matrix, got ${m.rows}×${m.cols}`,
    );
  }
  const l = { rows: m.rows, cols: m.cols, data: Float64Array.from(m.data) };
  const failed = choleskyInPlace(l.data, m.rows);
  if (failed >= 0) {
    throw new NumericError(
      'not-positive-definite',
      `${what} (${m.rows}×${m.cols}): expected symmetric positive definite, got a non-positive pivot at index ${failed}; regularise it (add εI) or check its source`,
    );
  }
  return l;
}

/** log det A = 2 Σ log L_ii from a lower Cholesky factor L of A. */
export function logDetFromCholesky(l: Mat): number {
  let s = 0;
  for (let i = 0; i < l.rows; i++) s += Math.log(l.data[i * l.cols + i]!);
  return 2 * s;
}
