/**
 * Precomputed representations: a user's own embeddings (.npy or CSV, `method.path` relative
 * to the experiment file) for encoders trained elsewhere, so every evaluation applies to them.
 *
 * Alignment: one row per observation, episodes in the order the dataset presents them —
 * training episodes, then validation, then test — and steps in order within each episode.
 * A .npy may also be 3-D [episodes, steps, d] in the same episode order. CSV: every numeric
 * column is a dimension, except columns named `episode` and `step`, which are ignored.
 * Embeddings are scaled to variance c per dimension with training statistics, like every
 * baseline; `encode` looks observations up exactly, so it encodes the dataset's own
 * observations only.
 */
import * as path from 'node:path';
import { parseNumericCsv } from '../../data/formats/csv.ts';
import { parseNpy } from '../../data/formats/npy.ts';
import type { Dataset, Episode } from '../../data/episode.ts';
import type { MethodContext, MethodFit } from '../method.ts';
import { restoreRepresentation, type SerialisedRepresentation } from '../serialised.ts';
import { TrainingError } from '../training-error.ts';

/** Parses the file into [rows, dim]. */
function parseEmbeddings(
  bytes: Uint8Array,
  file: string,
): { rows: number; dim: number; data: Float64Array | Float32Array } {
  if (file.toLowerCase().endsWith('.npy')) {
    const a = parseNpy(bytes, file);
    const dim = a.shape[a.shape.length - 1] ?? 0;
    if (a.shape.length < 2 || a.shape.length > 3 || dim === 0) {
      throw new TrainingError(
        'embeddings-shape',
        `expected a 2-D [observations, d] or 3-D [episodes, steps, d] array, got shape [${a.shape.join(', ')}]`,
        file,
      );
    }
    return { rows: a.data.length / dim, dim, data: a.data };
  }
  const table = parseNumericCsv(new TextDecoder().decode(bytes), file, {
    ignoreColumns: ['episode', 'step'],
  });
  return { rows: table.rows, dim: table.columns.length, data: table.data };
}

/** Scales columns to variance c with statistics of the first `trainRows` rows. */
function scaleToTarget(
  data: ArrayLike<number>,
  rows: number,
  dim: number,
  trainRows: number,
  c: number,
): Float32Array {
  const out = new Float32Array(rows * dim);
  for (let j = 0; j < dim; j++) {
    let s = 0;
    for (let i = 0; i < trainRows; i++) s += data[i * dim + j]!;
    const mean = s / trainRows;
    let ss = 0;
    for (let i = 0; i < trainRows; i++) ss += (data[i * dim + j]! - mean) ** 2;
    const factor = ss > 1e-12 ? Math.sqrt((c * trainRows) / ss) : 1;
    for (let i = 0; i < rows; i++) out[i * dim + j] = (data[i * dim + j]! - mean) * factor;
  }
  return out;
}

function allEpisodes(dataset: Dataset): Episode[] {
  return [...dataset.train, ...dataset.val, ...dataset.test];
}

/** Reads the embeddings file through the caller's readFile hook. */
async function readEmbeddings(
  context: MethodContext,
): Promise<{ bytes: Uint8Array; file: string }> {
  const { method, spec, hooks } = context;
  if (method.path === undefined || method.path === '') {
    throw new TrainingError(
      'embeddings-missing',
      "expected method.path naming a .npy or .csv file of embeddings, got none; write { name: precomputed, path: './embeddings.npy' }",
      `methods[${method.label}]`,
    );
  }
  if (hooks.readFile === undefined) {
    throw new TrainingError(
      'embeddings-missing',
      'expected the caller to provide hooks.readFile for precomputed embeddings, got none',
      method.path,
    );
  }
  const file = path.resolve(spec.baseDir, method.path);
  try {
    return { bytes: await hooks.readFile(file), file };
  } catch (error) {
    throw new TrainingError(
      'embeddings-missing',
      `expected a readable file, got: ${(error as Error).message}; paths are relative to the experiment file`,
      file,
    );
  }
}

/** Every observation of the dataset in embedding order: [rows, obsDim]. */
function observationKeys(dataset: Dataset): Float32Array {
  const episodes = allEpisodes(dataset);
  const keys = new Float32Array(episodes.reduce((a, e) => a + e.obs.length, 0));
  let at = 0;
  for (const e of episodes) {
    keys.set(e.obs, at);
    at += e.obs.length;
  }
  return keys;
}

/** The 'precomputed' method. */
export const fitPrecomputed: MethodFit = async (context) => {
  const { method, dataset, spec } = context;
  const { bytes, file } = await readEmbeddings(context);
  const { rows, dim, data } = parseEmbeddings(bytes, file);
  const expected = allEpisodes(dataset).reduce((a, e) => a + e.steps, 0);
  if (rows !== expected) {
    throw new TrainingError(
      'embeddings-shape',
      `expected ${expected} rows (one per observation: ${dataset.train.length} training, ${dataset.val.length} validation, ${dataset.test.length} test episodes in that order), got ${rows}`,
      file,
    );
  }
  const trainRows = dataset.train.reduce((a, e) => a + e.steps, 0);
  const values = scaleToTarget(data, rows, dim, trainRows, spec.train.scale);
  const serialised: SerialisedRepresentation = {
    method: method.name,
    label: method.label,
    dim,
    obsDim: dataset.obsDim,
    model: { kind: 'lookup' },
    arrays: {
      keys: { shape: [expected, dataset.obsDim], data: observationKeys(dataset) },
      values: { shape: [expected, dim], data: values },
    },
    meta: { source: method.path },
  };
  return {
    status: 'done',
    representation: await restoreRepresentation(serialised),
    curves: [],
    info: { engine: 'precomputed', dim, rows },
    serialised,
  };
};
