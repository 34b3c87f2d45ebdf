/**
 * 2-D projections of test representations for the report's scatter plots, coloured by the
 * true state: PCA (top two eigenvectors of the sample covariance; Pearson 1901, Hotelling
 * 1933) or UMAP (McInnes, Healy & Melville 2018, through the umap-js package, seeded by the
 * evaluation seed). Plot data only: this suite returns no metrics.
 */
import { UMAP } from 'umap-js';
import { symmetricEigen } from '../../numeric/linalg/index.ts';
import type { EvalContext, SuiteOutput } from '../context.ts';
import { sampleCovariance } from '../moments.ts';
import { taskRng } from '../tasks.ts';

/** Most points projected (a seeded subsample beyond this keeps plots and UMAP fast). */
export const PROJECTION_LIMIT = 1000;

export interface Projection {
  method: 'pca' | 'umap';
  /** [points, 2] */
  points: number[][];
  /** Episode index and step of each point. */
  episode: number[];
  step: number[];
  /** [points, stateDim] true state for colouring, when known. */
  state?: number[][];
  /** PCA only: share of the variance each of the two axes explains. */
  explained?: number[];
}

/** Runs the projections suite. */
export function runProjectionsSuite(context: EvalContext): SuiteOutput {
  const picks = pickPoints(context);
  const { dim } = context;
  const rows = picks.map(([ep, t]) =>
    Array.from(context.test[ep]!.codes.subarray(t * dim, (t + 1) * dim)),
  );
  const projection: Projection = {
    method: context.config.projection,
    points: [],
    episode: picks.map((p) => p[0]),
    step: picks.map((p) => p[1]),
  };
  const stateDim = context.dataset.stateDim;
  if (stateDim > 0 && picks.every(([ep]) => context.test[ep]!.state !== undefined)) {
    projection.state = picks.map(([ep, t]) =>
      Array.from(context.test[ep]!.state!.subarray(t * stateDim, (t + 1) * stateDim)),
    );
  }
  if (context.config.projection === 'umap' && rows.length > 3) {
    const rng = taskRng(context.config.seed, 'projections:umap');
    const umap = new UMAP({
      nComponents: 2,
      nNeighbors: Math.min(15, rows.length - 1),
      random: rng.next,
    });
    projection.points = umap.fit(rows);
  } else {
    projection.method = 'pca';
    Object.assign(projection, projectPca(rows, dim));
  }
  return { metrics: [], artifacts: { projection } };
}

function pickPoints(context: EvalContext): [number, number][] {
  const all: [number, number][] = [];
  context.test.forEach((e, ep) => {
    for (let t = 0; t < e.steps; t++) all.push([ep, t]);
  });
  if (all.length <= PROJECTION_LIMIT) return all;
  const rng = taskRng(context.config.seed, 'projections:points');
  for (let i = 0; i < PROJECTION_LIMIT; i++) {
    const j = i + rng.int(all.length - i);
    [all[i], all[j]] = [all[j]!, all[i]!];
  }
  return all.slice(0, PROJECTION_LIMIT);
}

/** Coordinates on the top two principal axes (a second axis of zeros when dim = 1). */
export function projectPca(
  rows: number[][],
  dim: number,
): { points: number[][]; explained: number[] } {
  const n = rows.length;
  if (n < 2) return { points: rows.map(() => [0, 0]), explained: [NaN, NaN] };
  const { mean, cov } = sampleCovariance(rows.flat(), n, dim);
  const { values, vectors } = symmetricEigen({ rows: dim, cols: dim, data: cov });
  const total = values.reduce((s, v) => s + v, 0);
  const axes = Math.min(2, dim);
  const points = rows.map((r) => {
    const p = [0, 0];
    for (let a = 0; a < axes; a++) {
      let s = 0;
      for (let j = 0; j < dim; j++) s += (r[j]! - mean[j]!) * vectors.data[j * dim + a]!;
      p[a] = s;
    }
    return p;
  });
  const explained = [0, 1].map((a) => (a < axes && total > 0 ? values[a]! / total : 0));
  return { points, explained };
}
