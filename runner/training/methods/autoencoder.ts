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
import type { MethodContext, MethodFit } from '../method.ts';
import { restoreRepresentation, type SerialisedRepresentation } from '../serialised.ts';
import { TrainingError } from '../training-error.ts';

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

interface Networks {
  encoder: TfEncoder;
  decoder: TfEncoder;
}

async function buildNetworks(context: MethodContext, rng: Rng): Promise<Networks> {
  const { dataset, spec } = context;
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
    false, // the decoder's input is the code: its gradient must reach the encoder
  );
  return { encoder, decoder };
}

/** The reconstruction training loop; stops as diverged on a NaN/∞ loss or gradient. */
async function trainReconstruction(
  context: MethodContext,
  nets: Networks,
  all: Float32Array,
  rng: Rng,
): Promise<{ last: number; reason?: string }> {
  const { dataset, spec, hooks } = context;
  const optimizer = tf.train.adam(spec.train.lr, 0.9, 0.999, 1e-7);
  let last = Number.NaN;
  try {
    for (let step = 1; step <= spec.train.steps; step++) {
      if (hooks.signal.aborted) {
        throw new TrainingError('training-aborted', `stopped at step ${step}`);
      }
      const rows = sampleRows(all, dataset.obsDim, spec.train.batch, rng);
      const batch = tf.tensor2d(rows, [spec.train.batch, dataset.obsDim]);
      const [loss, norm] = stepReconstruction(
        nets.encoder,
        nets.decoder,
        optimizer,
        batch,
        spec.train.clip,
      );
      batch.dispose();
      if (!Number.isFinite(loss) || !Number.isFinite(norm)) {
        const term = Number.isFinite(loss) ? `gradient norm is ${norm}` : `loss is ${loss}`;
        return {
          last,
          reason: `step ${step}: the reconstruction ${term}; last finite loss ${last}`,
        };
      }
      last = loss;
      if (step % spec.train.logEvery === 0) {
        hooks.log(`step ${step}/${spec.train.steps} reconstruction ${loss.toFixed(4)}`);
        await new Promise((resolve) => setImmediate(resolve));
      }
    }
    return { last };
  } finally {
    optimizer.dispose();
  }
}

function serialiseAutoencoder(
  context: MethodContext,
  encoder: TfEncoder,
  all: Float32Array,
): SerialisedRepresentation {
  const { dataset, spec, method } = context;
  const { mean, scale } = codeScaling(encoder, all, dataset.obsDim, spec.dim, spec.train.scale);
  const arrays: SerialisedRepresentation['arrays'] = {
    outMean: { shape: [spec.dim], data: mean },
    outScale: { shape: [spec.dim], data: scale },
  };
  encoder.variables.forEach((v, i) => {
    arrays[`p${i}`] = { shape: [...v.shape], data: Float32Array.from(v.dataSync()) };
  });
  return {
    method: method.name,
    label: method.label,
    dim: spec.dim,
    obsDim: dataset.obsDim,
    model: {
      kind: 'encoder',
      encoder: spec.encoder,
      seed: spec.seed,
      baseDir: spec.baseDir,
      ...(dataset.imageShape === undefined ? {} : { imageShape: dataset.imageShape }),
    },
    arrays,
    meta: { train: spec.train },
  };
}

/** The 'autoencoder' method. */
export const fitAutoencoder: MethodFit = async (context) => {
  const backend = await selectBackend();
  const rng = createRng(context.spec.seed);
  const nets = await buildNetworks(context, rng);
  const all = stack(context.dataset.train);
  try {
    const { last, reason } = await trainReconstruction(context, nets, all, rng.fork('batches'));
    const serialised = serialiseAutoencoder(context, nets.encoder, all);
    return {
      status: reason === undefined ? 'done' : 'diverged',
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
    nets.encoder.dispose();
    nets.decoder.dispose();
  }
};
