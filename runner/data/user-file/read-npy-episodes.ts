/**
 * NumPy user files: one float32/float64 array [episodes, steps, features] (all episodes the
 * same length). Values must be finite; errors give the [episode, step, feature] index.
 */
import { DataError } from '../data-error.ts';
import type { Episode } from '../episode.ts';
import { parseNpy } from '../formats/npy.ts';
import type { FileEpisodes } from './read-csv-episodes.ts';

/** Reads .npy bytes into episodes. */
export function readNpyEpisodes(bytes: Uint8Array, file: string): FileEpisodes {
  const { shape, data } = parseNpy(bytes, file);
  if (shape.length !== 3) {
    throw new DataError({
      code: 'bad-shape',
      file,
      index: 'shape',
      message: `expected a 3-D array [episodes, steps, features], got shape (${shape.join(', ')})`,
      hint:
        shape.length === 2
          ? 'for a single long series, cut it into episodes: a.reshape(episodes, steps, features)'
          : 'save an array of shape [episodes, steps, features]',
    });
  }
  const [count, steps, obsDim] = shape as [number, number, number];
  if (count * steps * obsDim === 0) {
    throw new DataError({
      code: 'empty-file',
      file,
      index: 'shape',
      message: `expected a non-empty array, got shape (${shape.join(', ')})`,
      hint: 'save at least one episode with at least one step and one feature',
    });
  }
  for (let i = 0; i < data.length; i++) {
    if (!Number.isFinite(data[i]!)) {
      const f = i % obsDim;
      const t = Math.floor(i / obsDim) % steps;
      const e = Math.floor(i / (obsDim * steps));
      throw new DataError({
        code: 'non-finite',
        file,
        index: `[${e}, ${t}, ${f}]`,
        message: `expected finite values, got ${data[i]} at [episode ${e}, step ${t}, feature ${f}]`,
        hint: 'drop or fill missing values (e.g. numpy.nan_to_num or interpolation) before saving',
      });
    }
  }
  const episodes: Episode[] = [];
  for (let e = 0; e < count; e++) {
    episodes.push({
      obs: Float32Array.from(data.subarray(e * steps * obsDim, (e + 1) * steps * obsDim)),
      steps,
      obsDim,
    });
  }
  return {
    episodes,
    keys: episodes.map((_, e) => String(e)),
    firstRows: [],
    obsDim,
    stateDim: 0,
    featureNames: Array.from({ length: obsDim }, (_, f) => `feature ${f}`),
  };
}
