/**
 * Fitted transition (MATH.md §2, "fitted alternative"): least squares on encoded pairs,
 * F̂ = C₁₀ (C₀₀ + εI)⁻¹ and Q̂ the residual covariance — the multivariate regression
 * estimate (Bishop, PRML §3.1.5, multiple outputs; ridge as in §3.1.4).
 */
import type { TransitionSource } from '../config/types.ts';
import type { TransitionModel } from './api.ts';
import type { Mat } from '../numeric/matrix.ts';
import { choleskyInPlace } from '../numeric/linalg/cholesky.ts';
import { NumericError } from '../numeric/linalg/errors.ts';
import { multiplyTransA, multiplyTransB, transpose } from '../numeric/linalg/multiply.ts';
import { solveWithCholesky } from '../numeric/linalg/spd.ts';
import { DEFAULT_MAX_CONDITION, regulariseCovariance } from './regularise.ts';
import { centreRows, checkFinite, checkInteger, checkLength, checkNumber } from './validate.ts';

/** Options of `fitTransition`. */
export interface FitTransitionOptions {
  /** ε ≥ 0 added to C₀₀ before solving. */
  ridge: number;
  /** Subtract the pooled mean of `from` and `to` first (stored as `model.mean`). */
  centre: boolean;
  /** Source label of the result (default 'fitted'). */
  source?: TransitionSource;
  /** Largest condition number Q̂ may keep before clipping (default 1e6). */
  maxCondition?: number;
}

/**
 * Fits ψ₊ = F ψ + noise(0, Q) on `count` pairs from[i] → to[i] (each [count, dim]).
 * Never returns NaN: a singular C₀₀ gets a tiny ridge, a singular or badly conditioned Q̂
 * is clipped, and each repair is recorded in `notes`.
 */
export function fitTransition(
  from: ArrayLike<number>,
  to: ArrayLike<number>,
  count: number,
  dim: number,
  options: FitTransitionOptions,
): TransitionModel {
  checkInteger('fitTransition: dim', dim, 1);
  checkInteger('fitTransition: count', count, 2);
  checkLength('fitTransition: from', from.length, count * dim, `[${count}, ${dim}]`);
  checkLength('fitTransition: to', to.length, count * dim, `[${count}, ${dim}]`);
  checkFinite('fitTransition: from', from, dim);
  checkFinite('fitTransition: to', to, dim);
  checkNumber('fitTransition: ridge', options.ridge, (v) => v >= 0, 'a ridge ε ≥ 0');
  const maxCondition = options.maxCondition ?? DEFAULT_MAX_CONDITION;
  checkNumber('fitTransition: maxCondition', maxCondition, (v) => v > 1, 'a number > 1');

  const mean = new Float64Array(dim);
  if (options.centre) pooledMean(from, to, count, dim, mean);
  const x: Mat = { rows: count, cols: dim, data: centreRows(from, count, dim, mean) }; // [count, dim]
  const y: Mat = { rows: count, cols: dim, data: centreRows(to, count, dim, mean) }; // [count, dim]
  const notes: string[] = [];

  const c00 = scale(multiplyTransA(x, x), 1 / count); // [dim, dim]
  const c01 = scale(multiplyTransA(x, y), 1 / count); // [dim, dim] = C₁₀ᵀ
  const trace = traceOf(c00);
  const factor = factorRidged(c00, options.ridge, trace / dim, notes);
  // F̂ᵀ = (C₀₀ + εI)⁻¹ C₀₁, since C₀₀ is symmetric.
  const fT = solveWithCholesky(factor, c01);
  const F = transpose(fT);

  // Residual covariance; degrees of freedom as in unbiased regression (common practice).
  const resid = y.data.slice();
  const pred = multiplyTransB(x, F); // [count, dim] = X F̂ᵀ
  for (let i = 0; i < resid.length; i++) resid[i] = resid[i]! - pred.data[i]!;
  const r: Mat = { rows: count, cols: dim, data: resid };
  const dof = count - dim - (options.centre ? 1 : 0);
  const qRaw = scale(multiplyTransA(r, r), 1 / (dof > 0 ? dof : count));
  const { cov: Q, note } = regulariseCovariance(qRaw, 'Q', maxCondition, trace / dim || 1);
  if (note !== null) notes.push(note);
  if (dof <= 0)
    notes.push(
      `Q estimated from ${count} pairs for dim ${dim}: too few pairs for an unbiased estimate`,
    );

  return { source: options.source ?? 'fitted', dim, F, Q, mean, notes };
}

/** Cholesky factor of C₀₀ + εI, adding a tiny extra ridge (noted) when it is singular. */
function factorRidged(c00: Mat, ridge: number, scaleHint: number, notes: string[]): Mat {
  const d = c00.rows;
  let extra = 0;
  for (let attempt = 0; attempt < 12; attempt++) {
    const a = Float64Array.from(c00.data);
    for (let i = 0; i < d; i++) a[i * d + i] = a[i * d + i]! + ridge + extra;
    if (choleskyInPlace(a, d) < 0) {
      if (extra > 0) notes.push(`C₀₀ singular: extra ridge ${extra.toExponential(1)} added`);
      return { rows: d, cols: d, data: a };
    }
    extra = extra === 0 ? 1e-10 * (scaleHint || 1) : extra * 10;
  }
  // Unreachable for finite input: a ridge of 10 × the mean variance is positive definite.
  throw new NumericError(
    'not-positive-definite',
    `fitTransition: expected C₀₀ + εI (${d}×${d}) to be positive definite after regularising, got a failed factorisation; check the encodings`,
  );
}

function pooledMean(
  from: ArrayLike<number>,
  to: ArrayLike<number>,
  count: number,
  dim: number,
  out: Float64Array,
): void {
  for (let i = 0; i < count; i++) {
    for (let j = 0; j < dim; j++) out[j] = out[j]! + from[i * dim + j]! + to[i * dim + j]!;
  }
  for (let j = 0; j < dim; j++) out[j] = out[j]! / (2 * count);
}

function scale(m: Mat, s: number): Mat {
  for (let i = 0; i < m.data.length; i++) m.data[i] = m.data[i]! * s;
  return m;
}

function traceOf(m: Mat): number {
  let t = 0;
  for (let i = 0; i < m.rows; i++) t += m.data[i * m.cols + i]!;
  return t;
}
