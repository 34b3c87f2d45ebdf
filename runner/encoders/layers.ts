/** Building blocks shared by the built-in encoders (TF.js ops, inside the caller's tidy). */
import * as tf from '@tensorflow/tfjs';
import type { EncoderConfig } from '../config/types.ts';
import { matMul } from './fast-matmul.ts';

/** x @ W + b for x [n, in], W [in, out], b [out]. */
export function dense(x: tf.Tensor2D, w: tf.Variable, b: tf.Variable): tf.Tensor2D {
  return tf.add(matMul(x, w as tf.Tensor2D), b);
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
