/**
 * Small convolutional encoder for image datasets (Dataset.imageShape): for each entry of
 * `channels`, a 3×3 convolution with stride 2 and zero padding 1, then ReLU; then an affine
 * map to d. Input rows are images [height·width] (one grey channel), row-major.
 *
 * Convolutions are written as im2col products (Chellapilla, Puri & Simard, 2006): patches are
 * gathered by a fixed 0/1 matrix and multiplied by the filter bank. Two reasons: every
 * product stays on the wasm backend's fast untransposed kernel, and tfjs-backend-wasm 4.22
 * has no Conv2DBackpropFilter kernel, so tf.conv2d could not be trained there at all.
 */
import * as tf from '@tensorflow/tfjs';
import type { Rng } from '../numeric/random.ts';
import { TrainingError } from '../training/training-error.ts';
import { initParam, type ParamSpec } from './dense-layout.ts';
import type { EncoderContext, EncoderDefinition, TfEncoder } from './encoder.ts';
import { matMul } from './fast-matmul.ts';
import { dense, toVariables } from './layers.ts';

interface ConvStage {
  height: number;
  width: number;
  inChannels: number;
  outChannels: number;
  outHeight: number;
  outWidth: number;
}

/** The 0/1 patch-gathering matrix [H·W, P·9] of a 3×3, stride-2, pad-1 convolution. */
export function patchMatrix(height: number, width: number): Float32Array {
  const outH = Math.ceil(height / 2);
  const outW = Math.ceil(width / 2);
  const cols = outH * outW * 9;
  const s = new Float32Array(height * width * cols);
  for (let oy = 0; oy < outH; oy++) {
    for (let ox = 0; ox < outW; ox++) {
      for (let tap = 0; tap < 9; tap++) {
        const iy = 2 * oy + Math.floor(tap / 3) - 1;
        const ix = 2 * ox + (tap % 3) - 1;
        if (iy < 0 || ix < 0 || iy >= height || ix >= width) continue;
        s[(iy * width + ix) * cols + (oy * outW + ox) * 9 + tap] = 1;
      }
    }
  }
  return s;
}

function planStages(image: [number, number], channels: number[]): ConvStage[] {
  const stages: ConvStage[] = [];
  let [height, width] = image;
  let inChannels = 1;
  for (const outChannels of channels) {
    const stage = {
      height,
      width,
      inChannels,
      outChannels,
      outHeight: Math.ceil(height / 2),
      outWidth: Math.ceil(width / 2),
    };
    stages.push(stage);
    [height, width, inChannels] = [stage.outHeight, stage.outWidth, outChannels];
  }
  return stages;
}

/** One convolution stage: x [n, H·W·C] (HWC) → [n, H'·W'·C'] (HWC). */
function convolve(
  x: tf.Tensor2D,
  stage: ConvStage,
  patches: tf.Tensor2D,
  filters: tf.Variable,
  bias: tf.Variable,
): tf.Tensor2D {
  const n = x.shape[0];
  const { height, width, inChannels: c, outHeight, outWidth } = stage;
  const positions = outHeight * outWidth;
  const channelRows = tf.reshape(tf.transpose(tf.reshape(x, [n, height * width, c]), [0, 2, 1]), [
    n * c,
    height * width,
  ]); // [n·C, H·W]
  const gathered = tf.reshape(matMul(channelRows as tf.Tensor2D, patches), [n, c, positions, 9]);
  const columns = tf.reshape(tf.transpose(gathered, [0, 2, 3, 1]), [n * positions, 9 * c]);
  const out = tf.relu(dense(columns as tf.Tensor2D, filters, bias)); // [n·P, C']
  return tf.reshape(out, [n, positions * stage.outChannels]);
}

async function buildConv(context: EncoderContext, rng: Rng): Promise<TfEncoder> {
  const image = context.imageShape;
  if (image === undefined || image[0] * image[1] !== context.obsDim) {
    throw new TrainingError(
      'encoder-needs-images',
      `expected a dataset of images (Dataset.imageShape with height·width = obsDim ${context.obsDim}), got ${image === undefined ? 'no image shape' : image.join('×')}; use encoder.kind 'mlp' for vector observations`,
      'encoder.kind',
    );
  }
  const stages = planStages(image, context.config.channels);
  const specs: ParamSpec[] = stages.flatMap((s, i) => [
    { name: `K${i + 1}`, shape: [9 * s.inChannels, s.outChannels], init: 'glorot' as const },
    { name: `k${i + 1}`, shape: [s.outChannels], init: 'zeros' as const },
  ]);
  const last = stages[stages.length - 1];
  const flat =
    last === undefined ? context.obsDim : last.outHeight * last.outWidth * last.outChannels;
  specs.push({ name: 'W', shape: [flat, context.dim], init: 'glorot' });
  specs.push({ name: 'b', shape: [context.dim], init: 'zeros' });
  const variables = toVariables(
    specs.map((s) => initParam(s, rng)),
    specs.map((s) => s.shape),
  );
  const patches = stages.map((s) =>
    tf.tensor2d(patchMatrix(s.height, s.width), [s.height * s.width, s.outHeight * s.outWidth * 9]),
  );
  const apply = (x: tf.Tensor2D): tf.Tensor2D => {
    let h = x;
    stages.forEach((s, i) => {
      h = convolve(h, s, patches[i]!, variables[2 * i]!, variables[2 * i + 1]!);
    });
    return dense(h, variables[2 * stages.length]!, variables[2 * stages.length + 1]!);
  };
  return Promise.resolve({
    kind: 'conv',
    variables,
    apply,
    dispose: () => [...variables, ...patches].forEach((t) => t.dispose()),
  });
}

/** The 'conv' entry of the encoder map. */
export const convEncoder: EncoderDefinition = { build: buildConv };
