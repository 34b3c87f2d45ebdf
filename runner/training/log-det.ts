/**
 * log det of a symmetric positive-definite matrix as a TF.js op with its gradient
 * ∂ log det S / ∂S = S⁻¹ (Petersen & Pedersen, The Matrix Cookbook, 2012, eq. 57).
 * TF.js 4.22 has no Cholesky, and the matrix is small (d × d), so both are computed in
 * float64 on the host.
 */
import * as tf from '@tensorflow/tfjs';

/** Lower Cholesky factor of an n×n SPD matrix (row-major), or undefined if not SPD. */
export function choleskyLower(s: ArrayLike<number>, n: number): Float64Array | undefined {
  const l = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = s[i * n + j]!;
      for (let k = 0; k < j; k++) sum -= l[i * n + k]! * l[j * n + k]!;
      if (i === j) {
        if (!(sum > 0)) return undefined;
        l[i * n + i] = Math.sqrt(sum);
      } else {
        l[i * n + j] = sum / l[j * n + j]!;
      }
    }
  }
  return l;
}

/** S⁻¹ from its Cholesky factor L (S = L Lᵀ), by solving column by column. */
function inverseFromCholesky(l: Float64Array, n: number): Float32Array {
  const inv = new Float32Array(n * n);
  const col = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    col.fill(0);
    col[c] = 1;
    for (let i = 0; i < n; i++) {
      let sum = col[i]!;
      for (let k = 0; k < i; k++) sum -= l[i * n + k]! * col[k]!;
      col[i] = sum / l[i * n + i]!;
    }
    for (let i = n - 1; i >= 0; i--) {
      let sum = col[i]!;
      for (let k = i + 1; k < n; k++) sum -= l[k * n + i]! * col[k]!;
      col[i] = sum / l[i * n + i]!;
    }
    for (let i = 0; i < n; i++) inv[i * n + c] = col[i]!;
  }
  return inv;
}

/** log det S for S [n, n] SPD; NaN (not a throw) when S is not positive definite. */
export const logDet = tf.customGrad((...args: unknown[]) => {
  const [s, save] = args as [tf.Tensor2D, tf.GradSaveFunc];
  const n = s.shape[0];
  const l = choleskyLower(s.dataSync(), n);
  let value = Number.NaN;
  if (l !== undefined) {
    value = 0;
    for (let i = 0; i < n; i++) value += 2 * Math.log(l[i * n + i]!);
  }
  const inverse =
    l === undefined ? tf.fill([n, n], Number.NaN) : tf.tensor2d(inverseFromCholesky(l, n), [n, n]);
  save([inverse]);
  return {
    value: tf.scalar(value),
    gradFunc: (dy: tf.Tensor | tf.Tensor[], saved: tf.Tensor[]) => [
      tf.mul(dy as tf.Tensor, saved[0]!),
    ],
  };
}) as unknown as (s: tf.Tensor2D) => tf.Scalar;
