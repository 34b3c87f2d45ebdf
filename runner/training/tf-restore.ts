/**
 * Restores the encoder of a saved representation through TF.js: conv and plugin encoders,
 * which have no plain-array forward pass. runner/training/serialised.ts imports this module
 * only for those kinds, so linear and MLP representations encode without loading TF.js.
 */
import * as tf from '@tensorflow/tfjs';
import type { EncoderConfig } from '../config/types.ts';
import { selectBackend } from '../encoders/backend.ts';
import { buildEncoder } from '../encoders/index.ts';
import { createRng } from '../numeric/random.ts';
import { TrainingError } from './training-error.ts';

/** What the rebuilt encoder needs: the model fields and its variables in order. */
export interface TfRestoreInput {
  encoder: EncoderConfig;
  obsDim: number;
  dim: number;
  seed: number;
  imageShape?: [number, number];
  baseDir?: string;
  /** The encoder's variables in its own order (`p0…` of the saved representation). */
  variables: Float32Array[];
  /** Where errors point (the representation's label). */
  label: string;
}

/** ψ of a TF.js encoder rebuilt from config + seed with the saved variables loaded. */
export async function restoreTfEncoder(
  input: TfRestoreInput,
): Promise<(obs: Float32Array, count: number) => Float32Array> {
  await selectBackend();
  const encoder = await buildEncoder(
    {
      config: input.encoder,
      obsDim: input.obsDim,
      dim: input.dim,
      seed: input.seed,
      ...(input.imageShape === undefined ? {} : { imageShape: input.imageShape }),
      ...(input.baseDir === undefined ? {} : { baseDir: input.baseDir }),
    },
    createRng(input.seed).fork('init'),
  );
  encoder.variables.forEach((v, i) => {
    const data = input.variables[i];
    if (data === undefined) {
      throw new TrainingError(
        'representation-file',
        `expected array 'p${i}', got none`,
        input.label,
      );
    }
    tf.tidy(() => v.assign(tf.tensor(data, v.shape)));
  });
  const chunk = 4096;
  const { obsDim, dim } = input;
  return (obs, count) => {
    const out = new Float32Array(count * dim);
    for (let start = 0; start < count; start += chunk) {
      const n = Math.min(chunk, count - start);
      const rows = obs.subarray(start * obsDim, (start + n) * obsDim);
      const z = tf.tidy(() => encoder.apply(tf.tensor2d(rows, [n, obsDim])).dataSync());
      out.set(z, start * dim);
    }
    return out;
  };
}
