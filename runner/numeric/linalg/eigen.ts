/**
 * Symmetric eigendecomposition: a thin bridge to ml-matrix's EigenvalueDecomposition
 * (tridiagonal QL, from JAMA). Not on any hot path, so the general routine serves.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { Mat } from '../matrix.ts';
import { NumericError } from './errors.ts';

/** Eigenvalues in descending order and the matching unit eigenvectors as the columns of `vectors`. */
export function symmetricEigen(m: Mat): { values: Float64Array; vectors: Mat } {
  if (m.rows !== m.cols) {
    throw new NumericError(
      'shape-mismatch',
      `symmetricEigen: expected a square matrix, got ${m.rows}×${m.cols}`,
    );
  }
  const n = m.rows;
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) {
    const row: number[] = [];
    // Average with the transpose so tiny asymmetries from rounding do not matter.
    for (let j = 0; j < n; j++) row.push(0.5 * (m.data[i * n + j]! + m.data[j * n + i]!));
    rows.push(row);
  }
  const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
  const raw = evd.realEigenvalues;
  const vecs = evd.eigenvectorMatrix;
  const order = raw.map((_, i) => i).sort((a, b) => raw[b]! - raw[a]!);
  const values = new Float64Array(n);
  const vectors = new Float64Array(n * n);
  order.forEach((src, dst) => {
    values[dst] = raw[src]!;
    for (let i = 0; i < n; i++) vectors[i * n + dst] = vecs.get(i, src);
  });
  return { values, vectors: { rows: n, cols: n, data: vectors } };
}
