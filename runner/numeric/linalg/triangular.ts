/**
 * Triangular solves with a lower factor L ([n, n] row-major) and many right-hand sides, in
 * the two layouts the callers hold: columns of a [n, k] matrix (classic L X = B), or rows
 * of a [count, n] batch (one query per row, as bridge batches are stored). Every loop is
 * arranged so the inner loop walks contiguous memory (forward/back substitution,
 * Golub & Van Loan, Matrix Computations, 4th ed., §3.1).
 */
import type { Mat } from '../matrix.ts';

/** Solves L x = b for every row b of `rows` ([count, n]) in place. */
export function solveLowerRowsInPlace(
  l: Float64Array,
  n: number,
  rows: Float64Array,
  count: number,
): void {
  for (let q = 0; q < count; q++) {
    const o = q * n;
    for (let i = 0; i < n; i++) {
      const ri = i * n;
      let s = rows[o + i]!;
      for (let j = 0; j < i; j++) s -= l[ri + j]! * rows[o + j]!;
      rows[o + i] = s / l[ri + i]!;
    }
  }
}

/** Solves Lᵀ x = b for every row b of `rows` ([count, n]) in place (column-oriented back substitution). */
export function solveLowerTransposeRowsInPlace(
  l: Float64Array,
  n: number,
  rows: Float64Array,
  count: number,
): void {
  for (let q = 0; q < count; q++) {
    const o = q * n;
    for (let i = n - 1; i >= 0; i--) {
      const ri = i * n;
      const xi = rows[o + i]! / l[ri + i]!;
      rows[o + i] = xi;
      // Row i of L holds the coefficients of x_i in equations j < i of Lᵀ x = b.
      for (let j = 0; j < i; j++) rows[o + j] = rows[o + j]! - l[ri + j]! * xi;
    }
  }
}

/** Solves L X = B for B [n, k] in place (row-axpy form: contiguous rows of X). */
export function solveLowerColsInPlace(
  l: Float64Array,
  n: number,
  b: Float64Array,
  k: number,
): void {
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    const bi = i * k;
    for (let j = 0; j < i; j++) {
      const lij = l[ri + j]!;
      if (lij === 0) continue;
      const bj = j * k;
      for (let c = 0; c < k; c++) b[bi + c] = b[bi + c]! - lij * b[bj + c]!;
    }
    const inv = 1 / l[ri + i]!;
    for (let c = 0; c < k; c++) b[bi + c] = b[bi + c]! * inv;
  }
}

/** Solves Lᵀ X = B for B [n, k] in place. */
export function solveLowerTransposeColsInPlace(
  l: Float64Array,
  n: number,
  b: Float64Array,
  k: number,
): void {
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * n;
    const bi = i * k;
    const inv = 1 / l[ri + i]!;
    for (let c = 0; c < k; c++) b[bi + c] = b[bi + c]! * inv;
    for (let j = 0; j < i; j++) {
      const lij = l[ri + j]!;
      if (lij === 0) continue;
      const bj = j * k;
      for (let c = 0; c < k; c++) b[bj + c] = b[bj + c]! - lij * b[bi + c]!;
    }
  }
}

/** X = L⁻¹ B for a lower factor L and B [n, k]; returns a new matrix. */
export function solveLower(l: Mat, b: Mat): Mat {
  const x = { rows: b.rows, cols: b.cols, data: Float64Array.from(b.data) };
  solveLowerColsInPlace(l.data, l.rows, x.data, b.cols);
  return x;
}

/** X = L⁻ᵀ B for a lower factor L and B [n, k]; returns a new matrix. */
export function solveLowerTranspose(l: Mat, b: Mat): Mat {
  const x = { rows: b.rows, cols: b.cols, data: Float64Array.from(b.data) };
  solveLowerTransposeColsInPlace(l.data, l.rows, x.data, b.cols);
  return x;
}
