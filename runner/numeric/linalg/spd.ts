/**
 * Symmetric positive definite helpers built on the Cholesky factor: solves, the inverse
 * (for outputs such as covariances, never inside a per-query loop) and the log-determinant.
 */
import type { Mat } from '../matrix.ts';
import { cholesky, logDetFromCholesky } from './cholesky.ts';
import { symmetrizeInPlace } from './multiply.ts';
import { solveLowerColsInPlace, solveLowerTransposeColsInPlace } from './triangular.ts';

/** X = A⁻¹ B for A symmetric positive definite [n, n] and B [n, k]. */
export function solveSpd(a: Mat, b: Mat, what = 'matrix'): Mat {
  const l = cholesky(a, what);
  return solveWithCholesky(l, b);
}

/** X = (L Lᵀ)⁻¹ B given the lower factor L. */
export function solveWithCholesky(l: Mat, b: Mat): Mat {
  const x = Float64Array.from(b.data);
  solveLowerColsInPlace(l.data, l.rows, x, b.cols);
  solveLowerTransposeColsInPlace(l.data, l.rows, x, b.cols);
  return { rows: b.rows, cols: b.cols, data: x };
}

/** (L Lᵀ)⁻¹ from the lower factor, symmetrised. */
export function inverseFromCholesky(l: Mat): Mat {
  const n = l.rows;
  const x = new Float64Array(n * n);
  for (let i = 0; i < n; i++) x[i * n + i] = 1;
  solveLowerColsInPlace(l.data, n, x, n);
  solveLowerTransposeColsInPlace(l.data, n, x, n);
  return symmetrizeInPlace({ rows: n, cols: n, data: x });
}

/** A⁻¹ for A symmetric positive definite; throws `not-positive-definite` otherwise. */
export function inverseSpd(a: Mat, what = 'matrix'): Mat {
  return inverseFromCholesky(cholesky(a, what));
}

/** log det A for A symmetric positive definite. */
export function logDetSpd(a: Mat, what = 'matrix'): number {
  return logDetFromCholesky(cholesky(a, what));
}
