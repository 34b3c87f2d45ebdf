/**
 * Random-projection baseline: a Gaussian matrix with N(0, 1/d) entries (Johnson &
 * Lindenstrauss, 1984; Dasgupta & Gupta, 2003), drawn from the job seed, each output scaled
 * to variance c.
 */
import { Matrix } from 'ml-matrix';
import { createRng } from '../../numeric/random.ts';
import { affineResult, scaleColumns, stackObservations } from '../linear-fit.ts';
import type { MethodFit } from '../method.ts';

/** The 'random' method. */
export const fitRandom: MethodFit = (context) => {
  const { dataset, spec } = context;
  const rng = createRng(spec.seed).fork('random-projection');
  const w = new Matrix(dataset.obsDim, spec.dim);
  const sd = 1 / Math.sqrt(spec.dim);
  for (let i = 0; i < w.rows; i++)
    for (let j = 0; j < w.columns; j++) w.set(i, j, rng.normal() * sd);
  const { x, mean } = stackObservations(dataset.train);
  return Promise.resolve(
    affineResult(context, mean, scaleColumns(x, mean, w, spec.train.scale), {}),
  );
};
