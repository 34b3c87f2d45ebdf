/**
 * A fitted method as plain data (JSON header + float32 arrays), and its inverse
 * `restoreRepresentation`. runner/execute/jobs/representation-files.ts writes and reads it;
 * a representation built here after training and one restored from disk run the same code,
 * so they encode identically.
 *
 * Linear and MLP encoders are evaluated by a plain Float32Array forward pass
 * (encoders/dense-forward.ts); only conv and plugin encoders load TF.js, through a dynamic
 * import of tf-restore.ts, so jobs that need no TF.js never pay for loading it.
 */
import type { CriticKind, EncoderConfig } from '../config/types.ts';
import { createDenseForward } from '../encoders/dense-forward.ts';
import { identity, type Mat } from '../numeric/matrix.ts';
import type { Representation } from './representation.ts';
import { TrainingError } from './training-error.ts';

/** One array, row-major. */
export interface SerialisedArray {
  shape: number[];
  data: Float32Array;
}

/** How the encoding is computed. */
export type SerialisedModel =
  /** z = (x − mean) W; arrays `mean` [obsDim], `W` [obsDim, dim] (scaling folded in). */
  | { kind: 'affine' }
  /** A TF.js encoder; arrays `p0…` in its variable order; optional `outMean`, `outScale` [dim]. */
  | {
      kind: 'encoder';
      encoder: EncoderConfig;
      imageShape?: [number, number];
      baseDir?: string;
      seed: number;
    }
  /** Exact-match table of observations; arrays `keys` [n, obsDim], `values` [n, dim]. */
  | { kind: 'lookup' };

export interface SerialisedRepresentation {
  method: string;
  label: string;
  dim: number;
  obsDim: number;
  model: SerialisedModel;
  arrays: Record<string, SerialisedArray>;
  /** Distance critics only: A is `arrays.A` when learned, the identity otherwise. */
  critic?: { kind: CriticKind; c: number };
  meta: Record<string, unknown>;
}

function need(s: SerialisedRepresentation, name: string): SerialisedArray {
  const a = s.arrays[name];
  if (a === undefined) {
    throw new TrainingError('representation-file', `expected array '${name}', got none`, s.label);
  }
  return a;
}

function encodeAffine(s: SerialisedRepresentation): Representation['encode'] {
  const mean = need(s, 'mean').data;
  const w = need(s, 'W').data;
  const { obsDim, dim } = s;
  return (obs, count) => {
    const out = new Float32Array(count * dim);
    const row = new Float64Array(dim);
    for (let i = 0; i < count; i++) {
      row.fill(0);
      for (let k = 0; k < obsDim; k++) {
        const v = obs[i * obsDim + k]! - mean[k]!;
        for (let j = 0; j < dim; j++) row[j] = row[j]! + v * w[k * dim + j]!;
      }
      out.set(row, i * dim);
    }
    return out;
  };
}

function encodeLookup(s: SerialisedRepresentation): Representation['encode'] {
  const keys = need(s, 'keys').data;
  const values = need(s, 'values').data;
  const { obsDim, dim } = s;
  const index = new Map<string, number>();
  const n = keys.length / obsDim;
  for (let i = n - 1; i >= 0; i--)
    index.set(keys.subarray(i * obsDim, (i + 1) * obsDim).join(','), i);
  return (obs, count) => {
    const out = new Float32Array(count * dim);
    for (let i = 0; i < count; i++) {
      const at = index.get(obs.subarray(i * obsDim, (i + 1) * obsDim).join(','));
      if (at === undefined) {
        throw new TrainingError(
          'embeddings-shape',
          `expected an observation of the dataset, got one with no precomputed embedding (row ${i})`,
          s.label,
        );
      }
      out.set(values.subarray(at * dim, (at + 1) * dim), i * dim);
    }
    return out;
  };
}

/** The encoder's variables p0, p1, … in order (as many as were saved). */
function encoderArrays(s: SerialisedRepresentation): Float32Array[] {
  const out: Float32Array[] = [];
  for (let i = 0; s.arrays[`p${i}`] !== undefined; i++) out.push(s.arrays[`p${i}`]!.data);
  return out;
}

/** ψ of a linear/MLP encoder without TF.js; a layout mismatch is a representation-file error. */
function denseEncode(
  s: SerialisedRepresentation,
  encoder: EncoderConfig,
): (obs: Float32Array, count: number) => Float32Array {
  try {
    return createDenseForward(encoder, s.obsDim, s.dim, encoderArrays(s));
  } catch (error) {
    throw new TrainingError('representation-file', (error as Error).message, s.label);
  }
}

/** ψ of a conv or plugin encoder, rebuilt in TF.js (imported only here). */
async function tfEncode(
  s: SerialisedRepresentation,
  model: Extract<SerialisedModel, { kind: 'encoder' }>,
): Promise<(obs: Float32Array, count: number) => Float32Array> {
  const { restoreTfEncoder } = await import('./tf-restore.ts');
  return restoreTfEncoder({
    encoder: model.encoder,
    obsDim: s.obsDim,
    dim: s.dim,
    seed: model.seed,
    variables: encoderArrays(s),
    label: s.label,
    ...(model.imageShape === undefined ? {} : { imageShape: model.imageShape }),
    ...(model.baseDir === undefined ? {} : { baseDir: model.baseDir }),
  });
}

async function encodeWithEncoder(
  s: SerialisedRepresentation,
  model: Extract<SerialisedModel, { kind: 'encoder' }>,
): Promise<Representation['encode']> {
  const kind = model.encoder.kind;
  const psi =
    kind === 'linear' || kind === 'mlp' ? denseEncode(s, model.encoder) : await tfEncode(s, model);
  const outMean = s.arrays.outMean?.data;
  const outScale = s.arrays.outScale?.data;
  return (obs, count) => {
    const out = psi(obs, count);
    if (outMean !== undefined && outScale !== undefined) {
      for (let i = 0; i < out.length; i++)
        out[i] = (out[i]! - outMean[i % s.dim]!) * outScale[i % s.dim]!;
    }
    return out;
  };
}

/** The critic matrix A as a Mat (identity for distance-identity). */
function criticOf(s: SerialisedRepresentation): Representation['critic'] {
  if (s.critic === undefined || s.critic.kind === 'inner') return undefined;
  let a: Mat = identity(s.dim);
  if (s.critic.kind === 'distance')
    a = { rows: s.dim, cols: s.dim, data: Float64Array.from(need(s, 'A').data) };
  return { A: a, c: s.critic.c };
}

/** The Representation of an affine model, synchronously (baselines build it right after fitting). */
export function restoreAffine(s: SerialisedRepresentation): Representation {
  return { method: s.label, dim: s.dim, encode: encodeAffine(s) };
}

/** Rebuilds the Representation a serialised method describes. */
export async function restoreRepresentation(s: SerialisedRepresentation): Promise<Representation> {
  let encode: Representation['encode'];
  switch (s.model.kind) {
    case 'affine':
      encode = encodeAffine(s);
      break;
    case 'lookup':
      encode = encodeLookup(s);
      break;
    case 'encoder':
      encode = await encodeWithEncoder(s, s.model);
      break;
  }
  const critic = criticOf(s);
  return { method: s.label, dim: s.dim, encode, ...(critic === undefined ? {} : { critic }) };
}
