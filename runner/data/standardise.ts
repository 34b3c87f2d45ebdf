/**
 * Standardisation fitted on the training episodes only, then applied to every split, so no
 * statistic of validation or test data leaks into training (common practice).
 */
import type { Episode } from './episode.ts';
import type { StandardiseMode } from './source.ts';

/** stored = (raw − mean) / scale, per column. [obsDim] each. */
export interface Standardisation {
  mode: StandardiseMode;
  mean: Float64Array;
  scale: Float64Array;
}

/** Fits means and scales on `episodes`; a constant column gets scale 1 (left centred). */
export function fitStandardisation(
  episodes: Episode[],
  obsDim: number,
  mode: StandardiseMode,
): Standardisation {
  const sum = new Float64Array(obsDim);
  const sumSq = new Float64Array(obsDim);
  let rows = 0;
  for (const ep of episodes) {
    for (let t = 0; t < ep.steps; t++) {
      for (let j = 0; j < obsDim; j++) {
        const x = ep.obs[t * obsDim + j]!;
        sum[j]! += x;
        sumSq[j]! += x * x;
      }
    }
    rows += ep.steps;
  }
  const mean = new Float64Array(obsDim);
  const scale = new Float64Array(obsDim);
  if (mode === 'global') {
    const total = rows * obsDim;
    const m = sum.reduce((a, b) => a + b, 0) / total;
    const v = sumSq.reduce((a, b) => a + b, 0) / total - m * m;
    mean.fill(m);
    scale.fill(v > 1e-12 ? Math.sqrt(v) : 1);
  } else {
    for (let j = 0; j < obsDim; j++) {
      const m = sum[j]! / rows;
      const v = sumSq[j]! / rows - m * m;
      mean[j] = m;
      scale[j] = v > 1e-12 * Math.max(1, m * m) ? Math.sqrt(v) : 1;
    }
  }
  return { mode, mean, scale };
}

/** Applies a fitted standardisation to one observation vector or a [steps, obsDim] block. */
export function applyStandardisation(values: ArrayLike<number>, s: Standardisation): Float32Array {
  const d = s.mean.length;
  const out = new Float32Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = (values[i]! - s.mean[i % d]!) / s.scale[i % d]!;
  return out;
}
