/**
 * Triangular solves with a lower factor L ([n, n] row-major) and many right-hand sides, in
 * the two layouts the callers hold: columns of a [n, k] matrix (classic L X = B), or rows
 * of a [count, n] batch (one query per row, as bridge batches are stored). Every loop is
 * arranged so the inner loop walks contiguous memory (forward/back substitution,
 * Golub & Van Loan, Matrix Computations, 4th ed., §3.1).
 */
import type { Mat } from '../matrix.ts';

/**
 * Solves L x = b for every row b of `rows` ([count, n]) in place. Two rows at a time, so
 * each load of L feeds two multiply-adds (forward substitution in dot-product form).
 */
export function solveLowerRowsInPlace(
  l: Float64Array,
  n: number,
  rows: Float64Array,
  count: number,
): void {
  let q = 0;
  for (; q + 1 < count; q += 2) {
    const o0 = q * n;
    const o1 = o0 + n;
    for (let i = 0; i < n; i++) {
      const ri = i * n;
      let s0 = rows[o0 + i]!;
      let s1 = rows[o1 + i]!;
      for (let j = 0; j < i; j++) {
        const lij = l[ri + j]!;
        s0 -= lij * rows[o0 + j]!;
        s1 -= lij * rows[o1 + j]!;
      }
      const lii = l[ri + i]!;
      rows[o0 + i] = s0 / lii;
      rows[o1 + i] = s1 / lii;
    }
  }
  if (q < count) {
    const o = q * n;
    for (let i = 0; i < n; i++) {
      const ri = i * n;
      let s = rows[o + i]!;
      for (let j = 0; j < i; j++) s -= l[ri + j]! * rows[o + j]!;
      rows[o + i] = s / l[ri + i]!;
    }
  }
}

/**
 * Solves U x = b for an upper triangular U ([n, n] row-major, e.g. Lᵀ stored explicitly)
 * and every row b of `rows` ([count, n]) in place: back substitution in dot-product form,
 * two rows at a time.
 */
export function solveUpperRowsInPlace(
  u: Float64Array,
  n: number,
  rows: Float64Array,
  count: number,
): void {
  let q = 0;
  for (; q + 1 < count; q += 2) {
    const o0 = q * n;
    const o1 = o0 + n;
    for (let i = n - 1; i >= 0; i--) {
      const ri = i * n;
      let s0 = rows[o0 + i]!;
      let s1 = rows[o1 + i]!;
      for (let j = i + 1; j < n; j++) {
        const uij = u[ri + j]!;
        s0 -= uij * rows[o0 + j]!;
        s1 -= uij * rows[o1 + j]!;
      }
      const uii = u[ri + i]!;
      rows[o0 + i] = s0 / uii;
      rows[o1 + i] = s1 / uii;
    }
  }
  if (q < count) {
    const o = q * n;
    for (let i = n - 1; i >= 0; i--) {
      const ri = i * n;
      let s = rows[o + i]!;
      for (let j = i + 1; j < n; j++) s -= u[ri + j]! * rows[o + j]!;
      rows[o + i] = s / u[ri + i]!;
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
