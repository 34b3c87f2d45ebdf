/**
 * Linear slow feature analysis (Wiskott & Sejnowski, 2002, §2–3): whiten the observations,
 * then take the eigenvectors of the covariance of temporal differences with the smallest
 * eigenvalues (slowest first). Closed form, no iteration. Differences are taken within
 * episodes only.
 */
import { Matrix } from 'ml-matrix';
import type { Episode } from '../../data/episode.ts';
import {
  affineResult,
  covariance,
  scaleColumns,
  stackObservations,
  symmetricEigenpairs,
} from '../linear-fit.ts';
import type { MethodFit } from '../method.ts';
import { TrainingError } from '../training-error.ts';

/** Whitening matrix [obsDim, r] over the r directions with non-negligible variance. */
function whitening(cov: Matrix): Matrix {
  const { values, vectors } = symmetricEigenpairs(cov);
  const top = values[0] ?? 0;
  const kept = values.filter((v) => v > top * 1e-9 && v > 0).length;
  const w = new Matrix(cov.rows, kept);
  for (let j = 0; j < kept; j++)
    w.setColumn(
      j,
      vectors.getColumn(j).map((v) => v / Math.sqrt(values[j]!)),
    );
  return w;
}

/** Covariance of one-step differences of the whitened signal, [r, r]. */
function differenceCovariance(episodes: Episode[], mean: Float64Array, white: Matrix): Matrix {
  const r = white.columns;
  const acc = new Matrix(r, r);
  let count = 0;
  for (const e of episodes) {
    if (e.steps < 2) continue;
    const x = new Matrix(e.steps, e.obsDim);
    for (let t = 0; t < e.steps; t++)
      for (let k = 0; k < e.obsDim; k++) x.set(t, k, e.obs[t * e.obsDim + k]! - mean[k]!);
    const z = x.mmul(white);
    const dz = z.subMatrix(1, e.steps - 1, 0, r - 1).sub(z.subMatrix(0, e.steps - 2, 0, r - 1));
    acc.add(dz.transpose().mmul(dz));
    count += e.steps - 1;
  }
  if (count === 0)
    throw new TrainingError(
      'dataset-too-short',
      'expected episodes with 2 or more steps for slow feature analysis, got none',
      'data',
    );
  return acc.div(count);
}

/** Projection [obsDim, d'] onto the slowest d' = min(d, rank) features, slowest first. */
export function slowFeatures(
  episodes: Episode[],
  dim: number,
): { x: Matrix; mean: Float64Array; w: Matrix; slowness: number[] } {
  const { x, mean } = stackObservations(episodes);
  const white = whitening(covariance(x, mean));
  const { values, vectors } = symmetricEigenpairs(
    differenceCovariance(episodes, mean, white),
    true,
  );
  const keep = Math.min(dim, white.columns);
  return {
    x,
    mean,
    w: white.mmul(vectors.subMatrix(0, white.columns - 1, 0, keep - 1)),
    slowness: values.slice(0, keep),
  };
}

/** The 'sfa' method. */
export const fitSfa: MethodFit = (context) => {
  const { x, mean, w, slowness } = slowFeatures(context.dataset.train, context.spec.dim);
  return Promise.resolve(
    affineResult(context, mean, scaleColumns(x, mean, w, context.spec.train.scale), { slowness }),
  );
};
