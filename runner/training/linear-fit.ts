/**
 * Shared pieces of the linear baselines (PCA, random projection, raw, SFA): stacking the
 * training observations, moments, eigen decompositions (ml-matrix), and the final per-
 * dimension scaling to variance c so every method's marginal matches the contrastive target
 * N(0, cI) (docs/training.md, "Scaling of baselines").
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { Episode } from '../data/episode.ts';
import type { FitResult, MethodContext } from './method.ts';
import { restoreAffine, type SerialisedRepresentation } from './serialised.ts';
import { TrainingError } from './training-error.ts';

/** Training observations stacked: [n, obsDim] and their column means. */
export function stackObservations(episodes: Episode[]): { x: Matrix; mean: Float64Array } {
  const obsDim = episodes[0]?.obsDim ?? 0;
  const n = episodes.reduce((a, e) => a + e.steps, 0);
  if (n < 2) {
    throw new TrainingError(
      'dataset-too-short',
      `expected at least 2 training observations, got ${n}`,
      'data',
    );
  }
  const x = new Matrix(n, obsDim);
  const mean = new Float64Array(obsDim);
  let row = 0;
  for (const e of episodes) {
    for (let t = 0; t < e.steps; t++, row++) {
      for (let k = 0; k < obsDim; k++) {
        const v = e.obs[t * obsDim + k]!;
        x.set(row, k, v);
        mean[k] = mean[k]! + v / n;
      }
    }
  }
  return { x, mean };
}

/** Biased covariance of rows (centred by `mean`): [obsDim, obsDim]. */
export function covariance(x: Matrix, mean: Float64Array): Matrix {
  const centred = x.clone().subRowVector(Array.from(mean));
  return centred.transpose().mmul(centred).div(x.rows);
}

/** Eigenpairs of a symmetric matrix, sorted by eigenvalue (descending unless `ascending`). */
export function symmetricEigenpairs(
  m: Matrix,
  ascending = false,
): { values: number[]; vectors: Matrix } {
  const sym = new Matrix(m.rows, m.columns);
  for (let i = 0; i < m.rows; i++)
    for (let j = 0; j < m.columns; j++) sym.set(i, j, (m.get(i, j) + m.get(j, i)) / 2);
  const eig = new EigenvalueDecomposition(sym, { assumeSymmetric: true });
  const order = eig.realEigenvalues
    .map((v, i) => [v, i] as const)
    .sort((a, b) => (ascending ? a[0] - b[0] : b[0] - a[0]));
  const vectors = new Matrix(m.rows, order.length);
  order.forEach(([, i], col) => vectors.setColumn(col, eig.eigenvectorMatrix.getColumn(i)));
  return { values: order.map(([v]) => v), vectors };
}

/**
 * Scales each column of W so the projected training data has variance c per dimension.
 * A column with (near) zero variance is left as is: scaling noise up would invent signal.
 */
export function scaleColumns(x: Matrix, mean: Float64Array, w: Matrix, c: number): Matrix {
  const z = x.clone().subRowVector(Array.from(mean)).mmul(w);
  const scaled = w.clone();
  for (let j = 0; j < w.columns; j++) {
    const col = z.getColumn(j);
    const variance = col.reduce((a, v) => a + v * v, 0) / col.length;
    if (variance > 1e-12)
      scaled.setColumn(
        j,
        w.getColumn(j).map((v) => v * Math.sqrt(c / variance)),
      );
  }
  return scaled;
}

/** The FitResult of an affine baseline z = (x − mean) W. */
export function affineResult(
  context: MethodContext,
  mean: Float64Array,
  w: Matrix,
  info: Record<string, unknown>,
): FitResult {
  const serialised: SerialisedRepresentation = {
    method: context.method.name,
    label: context.method.label,
    dim: w.columns,
    obsDim: w.rows,
    model: { kind: 'affine' },
    arrays: {
      mean: { shape: [w.rows], data: Float32Array.from(mean) },
      W: { shape: [w.rows, w.columns], data: Float32Array.from(w.to1DArray()) },
    },
    meta: { scale: context.spec.train.scale },
  };
  if (w.columns !== context.spec.dim) {
    context.hooks.log(
      `${context.method.label}: dimension ${w.columns} (obsDim ${w.rows} < dim ${context.spec.dim})`,
    );
  }
  return {
    status: 'done',
    representation: restoreAffine(serialised),
    curves: [],
    info: { engine: 'closed-form', dim: w.columns, ...info },
    serialised,
  };
}
