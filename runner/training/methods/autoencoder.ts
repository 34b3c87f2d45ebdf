/**
 * Autoencoder baseline: the same encoder shape ψ as the contrastive method, a mirrored MLP
 * decoder (d → reversed hidden widths → obsDim), mean squared reconstruction error, and the
 * same budget (train.steps, train.batch, Adam at train.lr, gradient clipping). Codes are then
 * scaled to variance c per dimension like every baseline (Hinton & Salakhutdinov, 2006).
 */
import * as tf from '@tensorflow/tfjs';
import type { EncoderConfig } from '../../config/types.ts';
import { selectBackend } from '../../encoders/backend.ts';
import type { TfEncoder } from '../../encoders/encoder.ts';
import { buildEncoder } from '../../encoders/index.ts';
import { buildDenseEncoder } from '../../encoders/mlp.ts';
import type { Episode } from '../../data/episode.ts';
import { createRng, type Rng } from '../../numeric/random.ts';
import type { MethodFit } from '../method.ts';
import { restoreRepresentation, type SerialisedRepresentation } from '../serialised.ts';
import { TrainingError } from '../training-error.ts';
import { engineOptions } from './contrastive.ts';

function stack(episodes: Episode[]): Float32Array {
  const parts = episodes.map((e) => e.obs);
  const out = new Float32Array(parts.reduce((a, p) => a + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

function sampleRows(all: Float32Array, obsDim: number, size: number, rng: Rng): Float32Array {
  const n = all.length / obsDim;
  const out = new Float32Array(size * obsDim);
  for (let i = 0; i < size; i++) {
    const r = rng.int(n);
    out.set(all.subarray(r * obsDim, (r + 1) * obsDim), i * obsDim);
  }
  return out;
}

/** One Adam step on the reconstruction loss; returns [loss, gradNorm] before the update. */
function stepReconstruction(
  encoder: TfEncoder,
  decoder: TfEncoder,
  optimizer: tf.Optimizer,
  batch: tf.Tensor2D,
  clip: number,
): [number, number] {
  return tf.tidy(() => {
    const vars = [...encoder.variables, ...decoder.variables];
    const { value, grads } = tf.variableGrads(
      () => tf.mean(tf.square(tf.sub(decoder.apply(encoder.apply(batch)), batch))),
      vars,
    );
    const names = Object.keys(grads);
    const norm = tf.sqrt(tf.addN(names.map((n) => tf.sum(tf.square(grads[n]!)))));
    const [loss, gradNorm] = tf.stack([value, norm]).dataSync() as unknown as [number, number];
    if (Number.isFinite(loss) && Number.isFinite(gradNorm)) {
      const factor = clip > 0 && gradNorm > clip ? clip / gradNorm : 1;
      const scaled: tf.NamedTensorMap = {};
      for (const n of names) scaled[n] = tf.mul(grads[n]!, factor);
      optimizer.applyGradients(scaled);
    }
    return [loss, gradNorm];
  });
}

/** Per-dimension mean and 1/σ·√c of the codes of the training observations. */
function codeScaling(
  encoder: TfEncoder,
  all: Float32Array,
  obsDim: number,
  dim: number,
  c: number,
): { mean: Float32Array; scale: Float32Array } {
  const n = all.length / obsDim;
  const z = tf.tidy(() => encoder.apply(tf.tensor2d(all, [n, obsDim])).dataSync());
  const mean = new Float32Array(dim);
  const scale = new Float32Array(dim);
  for (let j = 0; j < dim; j++) {
    let s = 0;
    let ss = 0;
    for (let i = 0; i < n; i++) s += z[i * dim + j]!;
    const m = s / n;
    for (let i = 0; i < n; i++) ss += (z[i * dim + j]! - m) ** 2;
    mean[j] = m;
    scale[j] = ss > 1e-12 ? Math.sqrt((c * n) / ss) : 1;
  }
  return { mean, scale };
}

/** The 'autoencoder' method. */
export const fitAutoencoder: MethodFit = async (context) => {
  const { dataset, spec, hooks, method } = context;
  const backend = await selectBackend();
  const options = engineOptions(context);
  const rng = createRng(spec.seed);
  const encoder = await buildEncoder(
    {
      config: spec.encoder,
      obsDim: dataset.obsDim,
      dim: spec.dim,
      seed: spec.seed,
      baseDir: spec.baseDir,
      ...(dataset.imageShape === undefined ? {} : { imageShape: dataset.imageShape }),
    },
    rng.fork('init'),
  );
  const decoderConfig: EncoderConfig = {
    ...spec.encoder,
    kind: 'mlp',
    layerNorm: false,
    widths: spec.encoder.kind === 'mlp' ? [...spec.encoder.widths].reverse() : [],
  };
  const decoder = buildDenseEncoder(
    { config: decoderConfig, obsDim: spec.dim, dim: dataset.obsDim, seed: spec.seed },
    rng.fork('decoder'),
    false,
  );
  const optimizer = tf.train.adam(spec.train.lr, 0.9, 0.999, 1e-7);
  const all = stack(dataset.train);
  const batchRng = rng.fork('batches');
  let last = Number.NaN;
  let status: 'done' | 'diverged' = 'done';
  let reason: string | undefined;
  try {
    for (let step = 1; step <= spec.train.steps; step++) {
      if (hooks.signal.aborted)
        throw new TrainingError('training-aborted', `stopped at step ${step}`);
      const batch = tf.tensor2d(sampleRows(all, dataset.obsDim, spec.train.batch, batchRng), [
        spec.train.batch,
        dataset.obsDim,
      ]);
      const [loss, norm] = stepReconstruction(encoder, decoder, optimizer, batch, spec.train.clip);
      batch.dispose();
      if (!Number.isFinite(loss) || !Number.isFinite(norm)) {
        status = 'diverged';
        reason = `step ${step}: the reconstruction ${Number.isFinite(loss) ? 'gradient norm' : 'loss'} is ${Number.isFinite(loss) ? norm : loss}; last finite loss ${last}`;
        break;
      }
      last = loss;
      if (step % spec.train.logEvery === 0) {
        hooks.log(`step ${step}/${spec.train.steps} reconstruction ${loss.toFixed(4)}`);
        await new Promise((resolve) => setImmediate(resolve));
      }
    }
    const { mean, scale } = codeScaling(encoder, all, dataset.obsDim, spec.dim, spec.train.scale);
    const arrays: SerialisedRepresentation['arrays'] = {
      outMean: { shape: [spec.dim], data: mean },
      outScale: { shape: [spec.dim], data: scale },
    };
    encoder.variables.forEach(
      (v, i) => (arrays[`p${i}`] = { shape: [...v.shape], data: Float32Array.from(v.dataSync()) }),
    );
    const serialised: SerialisedRepresentation = {
      method: method.name,
      label: method.label,
      dim: spec.dim,
      obsDim: dataset.obsDim,
      model: {
        kind: 'encoder',
        encoder: spec.encoder,
        seed: spec.seed,
        baseDir: spec.baseDir,
        ...(options.imageShape === undefined ? {} : { imageShape: options.imageShape }),
      },
      arrays,
      meta: { train: spec.train },
    };
    return {
      status,
      ...(reason === undefined ? {} : { reason }),
      representation: await restoreRepresentation(serialised),
      curves: [],
      info: {
        tfBackend: backend.name,
        engine: 'tfjs',
        kernel: backend.name,
        threads: backend.threads,
        finalReconstruction: last,
      },
      serialised,
    };
  } finally {
    optimizer.dispose();
    encoder.dispose();
    decoder.dispose();
  }
};
