/**
 * CONTRACT — what a fitted method (contrastive encoder or baseline) hands to evaluation.
 * Owned by the training stage. Every method, whatever its kind, goes through this.
 */
import type { Mat } from '../numeric/matrix.ts';

export interface Representation {
  /** Method name and row label. */
  method: string;
  /** Representation dimension d. */
  dim: number;
  /** Encodes `count` observations [count, obsDim] → [count, dim]. Pure and deterministic. */
  encode(obs: Float32Array, count: number): Float32Array;
  /**
   * Critic parameters when the method has a distance critic (contrastive only):
   * A is [dim, dim] (identity for 'distance-identity'); c is the regulariser's target variance.
   * Absent for baselines and for the inner-product critic: no critic-derived transition then.
   */
  critic?: { A: Mat; c: number };
}

/** One point of a training curve (every `train.logEvery` steps). */
export interface CurvePoint {
  step: number;
  trainLoss: number;
  valLoss: number;
  /** Top-1 retrieval accuracy of the positive among the batch. */
  trainAccuracy: number;
  valAccuracy: number;
}
