/** Building blocks shared by the built-in encoders (TF.js ops, inside the caller's tidy). */
import * as tf from '@tensorflow/tfjs';
import type { EncoderConfig } from '../config/types.ts';
import { isFastMatMul, matMul } from './fast-matmul.ts';

/** x @ W + b for x [n, in], W [in, out], b [out]. */
export function dense(x: tf.Tensor2D, w: tf.Variable, b: tf.Variable): tf.Tensor2D {
  return tf.add(matMul(x, w as tf.Tensor2D), b);
}

type FusedKind = 'relu' | 'linear';

/**
 * act(x W + b) as one op with a hand-written gradient: the forward pass is the backend's
 * fused product + bias + activation kernel, and the backward pass multiplies only
 * untransposed matrices (explicit transposes keep the wasm fast kernel, fast-matmul.ts).
 * With `inputGrad` false (a first layer: x is data) the product for dx is skipped.
 */
function fusedDense(activation: FusedKind, inputGrad: boolean) {
  return tf.customGrad((...args: unknown[]) => {
    const [x, w, b, save] = args as [tf.Tensor2D, tf.Tensor2D, tf.Tensor1D, tf.GradSaveFunc];
    const y = tf.fused.matMul({ a: x, b: w, bias: b, activation });
    save([x, w, y]);
    return {
      value: y,
      gradFunc: (dy: tf.Tensor | tf.Tensor[], saved: tf.Tensor[]) => {
        const [sx, sw, sy] = saved as [tf.Tensor2D, tf.Tensor2D, tf.Tensor2D];
        // relu'(z) = 1 where the output is positive (Nair & Hinton, 2010). [n, out]
        const g =
          activation === 'relu' ? tf.mul(dy as tf.Tensor2D, tf.step(sy)) : (dy as tf.Tensor2D);
        const dx = inputGrad ? tf.matMul(g, tf.transpose(sw)) : tf.zerosLike(sx);
        return [dx, tf.matMul(tf.transpose(sx), g), tf.sum(g, 0)];
      },
    };
  }) as unknown as (x: tf.Tensor2D, w: tf.Tensor2D, b: tf.Tensor1D) => tf.Tensor2D;
}

const fused = {
  relu: { input: fusedDense('relu', true), data: fusedDense('relu', false) },
  linear: { input: fusedDense('linear', true), data: fusedDense('linear', false) },
};

/**
 * A dense layer with an optional ReLU or no activation. Uses the fused op when the fast path
 * is on (fast-matmul.ts); otherwise TF.js's own ops and gradients (the bench's baseline).
 * `first` marks a layer whose input is data, so no input gradient is needed.
 */
export function denseLayer(
  x: tf.Tensor2D,
  w: tf.Variable,
  b: tf.Variable,
  activation: FusedKind,
  first: boolean,
): tf.Tensor2D {
  if (!isFastMatMul()) {
    const z = dense(x, w, b);
    return activation === 'relu' ? tf.relu(z) : z;
  }
  return fused[activation][first ? 'data' : 'input'](x, w as tf.Tensor2D, b as tf.Tensor1D);
}

/** Layer normalisation over features (Ba, Kiros & Hinton, 2016, eq. 4), ε = 1e-5. */
export function layerNorm(x: tf.Tensor2D, gain: tf.Variable, shift: tf.Variable): tf.Tensor2D {
  const { mean, variance } = tf.moments(x, 1, true);
  const normed = tf.div(tf.sub(x, mean), tf.sqrt(tf.add(variance, 1e-5)));
  return tf.add(tf.mul(normed, gain), shift);
}

const geluScale = Math.sqrt(2 / Math.PI);

/** The configured activation; gelu is the tanh form (Hendrycks & Gimpel, 2016, §2). */
export function activate(x: tf.Tensor2D, kind: EncoderConfig['activation']): tf.Tensor2D {
  switch (kind) {
    case 'relu':
      return tf.relu(x);
    case 'tanh':
      return tf.tanh(x);
    case 'elu':
      return tf.elu(x);
    case 'gelu': {
      const inner = tf.mul(tf.add(x, tf.mul(tf.pow(x, 3), 0.044715)), geluScale);
      return tf.mul(tf.mul(x, 0.5), tf.add(tf.tanh(inner), 1));
    }
  }
}

/** Variables from plain arrays (shapes from the specs). */
export function toVariables(arrays: Float32Array[], shapes: number[][]): tf.Variable[] {
  // tidy frees the temporary tensor; variables survive it. Unnamed: names are global in TF.js.
  return arrays.map((a, i) => tf.tidy(() => tf.variable(tf.tensor(a, shapes[i]), true)));
}
