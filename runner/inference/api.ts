/**
 * CONTRACT — the closed-form inference API the evaluation suites call. Owned by the
 * inference stage, which implements these signatures (other files in runner/inference/)
 * and may extend them; evaluation codes against this file.
 * Formulas: ../shared/MATH.md §2–3. Vectors and batches are row-major.
 */
import type { TransitionSource } from '../config/types.ts';
import type { Mat } from '../numeric/matrix.ts';

/** A linear-Gaussian transition over representations: ψ₊ | ψ ~ N(F ψ, Q) (in centred coordinates). */
export interface TransitionModel {
  source: TransitionSource;
  dim: number;
  /** [dim, dim] */
  F: Mat;
  /** [dim, dim], symmetric positive definite (regularised when the fit was not). */
  Q: Mat;
  /** [dim] mean subtracted before applying F (zero for critic-derived models). */
  mean: Float64Array;
  /** Human-readable notes, e.g. "Q regularised: condition number 3e9 → 1e6". */
  notes: string[];
}

/** Gaussian over `dim` dimensions. */
export interface Gaussian {
  mean: Float64Array; // [dim]
  cov: Mat; // [dim, dim]
}

/** Posterior of a batch of bridge queries sharing one model and one T. */
export interface BridgePosterior {
  /** [queries, T, dim] waypoint means. */
  means: Float64Array;
  /** T marginal covariances [dim, dim] — shared by every query (Λ does not depend on ψ₀, ψ_g). */
  covariances: Mat[];
}

export interface InferenceApi {
  /** Critic-derived model: F = mA, Q = mI, m = c/(c+1) (MATH.md §2). */
  criticTransition(A: Mat, c: number): TransitionModel;
  /**
   * Least-squares fit F̂ = C₁₀ (C₀₀ + εI)⁻¹ on `count` pairs (from[i] → to[i]), each [count, dim];
   * Q̂ the residual covariance, regularised and noted when singular or badly conditioned.
   */
  fitTransition(
    from: ArrayLike<number>,
    to: ArrayLike<number>,
    count: number,
    dim: number,
    options: { ridge: number; centre: boolean; source?: TransitionSource },
  ): TransitionModel;
  /** Distribution after n applications of the model, from a point. */
  forecast(model: TransitionModel, start: ArrayLike<number>, n: number): Gaussian;
  /** Bridge posterior for `queries` start/goal pairs ([queries, dim] each) with T waypoints. */
  solveBridge(
    model: TransitionModel,
    starts: ArrayLike<number>,
    goals: ArrayLike<number>,
    queries: number,
    T: number,
  ): BridgePosterior;
}
