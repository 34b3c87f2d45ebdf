/**
 * PCA baseline: the d leading eigenvectors of the training covariance (Pearson, 1901;
 * Hotelling, 1933), each direction scaled to variance c.
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

/** Mean and the leading min(d, obsDim) principal directions [obsDim, d'] of the episodes. */
export function principalDirections(
  episodes: Episode[],
  dim: number,
): { x: Matrix; mean: Float64Array; w: Matrix; values: number[] } {
  const { x, mean } = stackObservations(episodes);
  const { values, vectors } = symmetricEigenpairs(covariance(x, mean));
  const keep = Math.min(dim, x.columns);
  return {
    x,
    mean,
    w: vectors.subMatrix(0, x.columns - 1, 0, keep - 1),
    values: values.slice(0, keep),
  };
}

/** The 'pca' method. */
export const fitPca: MethodFit = ({ method, dataset, spec, hooks }) => {
  const { x, mean, w, values } = principalDirections(dataset.train, spec.dim);
  const total = values.reduce((a, v) => a + v, 0);
  return Promise.resolve(
    affineResult(
      { method, dataset, spec, hooks },
      mean,
      scaleColumns(x, mean, w, spec.train.scale),
      {
        explainedVariance: total,
      },
    ),
  );
};
