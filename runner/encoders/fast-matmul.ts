/**
 * Matrix products that stay on the wasm backend's fast kernel.
 *
 * tfjs-backend-wasm 4.22 sends only non-transposed 2-D products to its packed SIMD kernel;
 * a product with transposeA/transposeB runs a scalar loop about 8× slower
 * (bench/training.ts measures both). The default gradient of `tf.matMul(a, b)` is
 * `matMul(dy, b, false, true)` and `matMul(a, dy, true, false)`: both transposed. The
 * custom gradient below transposes explicitly (a cheap copy) and multiplies untransposed,
 * which made the reference step about 4× faster. `setFastMatMul(false)` restores the
 * default gradient so the bench can compare both inside the real loop.
 */
import * as tf from '@tensorflow/tfjs';

/** A 2-D product a @ b: [n, k] × [k, m] → [n, m]. */
export type MatMulFn = (a: tf.Tensor2D, b: tf.Tensor2D) => tf.Tensor2D;

const customMatMul = tf.customGrad((...args: unknown[]) => {
  const [a, b, save] = args as [tf.Tensor2D, tf.Tensor2D, tf.GradSaveFunc];
  save([a, b]);
  return {
    value: tf.matMul(a, b),
    gradFunc: (dy: tf.Tensor | tf.Tensor[], saved: tf.Tensor[]) => {
      const g = dy as tf.Tensor2D;
      const [sa, sb] = saved as [tf.Tensor2D, tf.Tensor2D];
      // dA = dy @ bᵀ [n, k]; dB = aᵀ @ dy [k, m]; explicit transposes keep the fast kernel.
      return [tf.matMul(g, tf.transpose(sb)), tf.matMul(tf.transpose(sa), g)];
    },
  };
}) as unknown as MatMulFn;

const defaultMatMul: MatMulFn = (a, b) => tf.matMul(a, b);

let useCustom = true;

/** Chooses custom (explicit-transpose) gradients (default true) or TF.js's own. */
export function setFastMatMul(enabled: boolean): void {
  useCustom = enabled;
}

/** Whether the custom-gradient product is in use. */
export function isFastMatMul(): boolean {
  return useCustom;
}

/** a @ b with the gradient chosen by setFastMatMul. */
export function matMul(a: tf.Tensor2D, b: tf.Tensor2D): tf.Tensor2D {
  return useCustom ? customMatMul(a, b) : defaultMatMul(a, b);
}

/** a @ bᵀ through an explicit transpose, so forward and backward stay untransposed. */
export function matMulTransB(a: tf.Tensor2D, b: tf.Tensor2D): tf.Tensor2D {
  return useCustom ? customMatMul(a, tf.transpose(b)) : tf.matMul(a, b, false, true);
}
