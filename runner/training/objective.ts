/**
 * The temporal contrastive objective of MATH.md §1 as TF.js ops (called inside a tidy or a
 * gradient scope). Rows of ψx are anchors x_i, rows of ψy their positives y_i; every other
 * row of the batch serves as a negative.
 */
import * as tf from '@tensorflow/tfjs';
import type { CriticKind, LossDirection, RegulariserKind } from '../config/types.ts';
import { matMul, matMulTransB } from '../encoders/fast-matmul.ts';
import { logDet } from './log-det.ts';

/** Logits L [B, B] with L_ij = f(x_i, y_j), and the positives f(x_i, y_i) [B]. */
export interface Logits {
  logits: tf.Tensor2D;
  positives: tf.Tensor1D;
}

/**
 * Critic logits. distance: f = −½‖A ψx − ψy‖² (u = ψx Aᵀ); distance-identity: A = I;
 * inner: f = ψxᵀ A ψy (u = ψx A). `a` is null for distance-identity.
 */
export function criticLogits(
  zx: tf.Tensor2D, // [B, d]
  zy: tf.Tensor2D, // [B, d]
  a: tf.Tensor2D | null, // [d, d]
  critic: CriticKind,
): Logits {
  if (critic === 'inner') {
    const u = a === null ? zx : matMul(zx, a);
    return { logits: matMulTransB(u, zy), positives: tf.sum(tf.mul(u, zy), 1) };
  }
  const u = a === null || critic === 'distance-identity' ? zx : matMulTransB(zx, a);
  const uu = tf.sum(tf.square(u), 1, true); // [B, 1]
  const vv = tf.reshape(tf.sum(tf.square(zy), 1), [1, -1]); // [1, B]
  // −½‖u_i − v_j‖² = u_i·v_j − ½‖u_i‖² − ½‖v_j‖², expanded so the cross term is one product.
  const logits = tf.sub<tf.Tensor2D>(matMulTransB(u, zy), tf.mul(tf.add(uu, vv), 0.5));
  const positives = tf.mul<tf.Tensor1D>(tf.sum(tf.square(tf.sub(u, zy)), 1), -0.5);
  return { logits, positives };
}

/**
 * InfoNCE (van den Oord, Li & Vinyals, 2018, eq. 4): forward −mean_i[L_ii − logsumexp_j L_ij],
 * backward over columns, symmetric the average. tf.logSumExp subtracts the maximum first.
 */
export function infoNce({ logits, positives }: Logits, direction: LossDirection): tf.Scalar {
  const meanPositive = tf.mean(positives);
  const forward = (): tf.Scalar => tf.sub(tf.mean(tf.logSumExp(logits, 1)), meanPositive);
  const backward = (): tf.Scalar => tf.sub(tf.mean(tf.logSumExp(logits, 0)), meanPositive);
  switch (direction) {
    case 'forward':
      return forward();
    case 'backward':
      return backward();
    case 'symmetric':
      return tf.mul(tf.add(forward(), backward()), 0.5);
  }
}

/** Top-1 retrieval accuracy of the positive among the batch, for the loss direction(s). */
export function retrievalAccuracy(logits: tf.Tensor2D, direction: LossDirection): tf.Scalar {
  const target = tf.range(0, logits.shape[0], 1, 'int32');
  const hits = (axis: number): tf.Scalar =>
    tf.mean(tf.cast(tf.equal(tf.argMax(logits, axis), target), 'float32'));
  switch (direction) {
    case 'forward':
      return hits(1);
    case 'backward':
      return hits(0);
    case 'symmetric':
      return tf.mul(tf.add(hits(1), hits(0)), 0.5);
  }
}

/**
 * Gaussian-marginal regulariser towards N(0, cI) on encodings z [n, d] (MATH.md §1):
 * penalty λ(mean‖ψ‖²/d − c)², or λ times the Gaussian KL of the batch moments
 * KL(N(μ̂, Σ̂) ‖ N(0, cI)) = ½[tr Σ̂/c + ‖μ̂‖²/c − d − log det Σ̂ + d log c]
 * (Kullback, 1959; the closed form for two Gaussians, Σ̂ the biased batch covariance).
 */
export function regulariser(
  z: tf.Tensor2D,
  kind: RegulariserKind,
  weight: number,
  scale: number,
): tf.Scalar {
  const [n, d] = z.shape;
  switch (kind) {
    case 'none':
      return tf.scalar(0);
    case 'penalty': {
      const meanSq = tf.div(tf.mean(tf.sum(tf.square(z), 1)), d);
      return tf.mul(tf.square(tf.sub(meanSq, scale)), weight);
    }
    case 'kl': {
      const mu = tf.mean(z, 0, true); // [1, d]
      const centred = tf.sub<tf.Tensor2D>(z, mu);
      const cov = tf.div<tf.Tensor2D>(matMul(tf.transpose(centred), centred), n); // [d, d]
      const trace = tf.sum(tf.mul(cov, tf.eye(d)));
      const inner = tf.add(
        tf.div(tf.add(trace, tf.sum(tf.square(mu))), scale),
        d * Math.log(scale) - d,
      );
      return tf.mul(tf.sub(inner, logDet(cov)), 0.5 * weight);
    }
  }
}
