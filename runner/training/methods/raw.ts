/**
 * Raw-observation baseline: the identity when obsDim ≤ d, else the d leading principal
 * directions (the best rank-d linear summary, Eckart & Young, 1936). Each dimension is scaled
 * to variance c like every baseline.
 */
import { Matrix } from 'ml-matrix';
import { affineResult, scaleColumns, stackObservations } from '../linear-fit.ts';
import type { MethodFit } from '../method.ts';
import { principalDirections } from './pca.ts';

/** The 'raw' method. */
export const fitRaw: MethodFit = (context) => {
  const { dataset, spec } = context;
  if (dataset.obsDim > spec.dim) {
    const { x, mean, w } = principalDirections(dataset.train, spec.dim);
    return Promise.resolve(
      affineResult(context, mean, scaleColumns(x, mean, w, spec.train.scale), {
        projection: 'principal',
      }),
    );
  }
  const { x, mean } = stackObservations(dataset.train);
  const w = Matrix.eye(dataset.obsDim);
  return Promise.resolve(
    affineResult(context, mean, scaleColumns(x, mean, w, spec.train.scale), {
      projection: 'identity',
    }),
  );
};
