/**
 * When may the dataset's true latent model be used in representation space? Only when the
 * representation is an invertible affine function of the true state, ψ = M s + b (for
 * example, a representation that returns the state itself). Then the true chain
 * s₊ = F s + w, w ~ N(0, Q) reads ψ₊ - b = M F M⁻¹ (ψ - b) + M w: F_ψ = M F M⁻¹,
 * Q_ψ = M Q Mᵀ (a linear change of variables of a Gaussian, Bishop PRML eq. 2.115).
 */
import { Matrix, inverse } from 'ml-matrix';
import type { KnownLinearModel } from '../data/episode.ts';
import { trueTransition, type TransitionModel } from '../inference/index.ts';
import { solveSpd } from '../numeric/linalg/index.ts';
import type { EncodedEpisode } from './context.ts';

/** Largest relative residual of the affine fit that still counts as "ψ is the state". */
export const ALIGNMENT_TOLERANCE = 1e-8;

/**
 * The true model expressed in representation coordinates, or a reason why it does not apply.
 * Fits ψ ≈ M s + b by least squares over every test step and accepts when the residual sum
 * of squares is below ALIGNMENT_TOLERANCE of the total.
 */
export function alignTrueModel(
  model: KnownLinearModel,
  episodes: readonly EncodedEpisode[],
  dim: number,
): { model: TransitionModel } | { reason: string } {
  const s = model.stateDim;
  if (dim !== s) return { reason: `representation dim ${dim} ≠ state dim ${s}` };
  if (episodes.some((e) => e.state === undefined)) return { reason: 'test states unknown' };
  // Normal equations of [s, 1] B = ψ: (XᵀX) B = Xᵀ Ψ with X = [s, 1], B [(s+1), dim].
  const p = s + 1;
  const xtx = new Float64Array(p * p);
  const xty = new Float64Array(p * dim);
  let count = 0;
  const row = new Float64Array(p);
  for (const e of episodes) {
    for (let t = 0; t < e.steps; t++, count++) {
      for (let j = 0; j < s; j++) row[j] = e.state![t * s + j]!;
      row[s] = 1;
      for (let a = 0; a < p; a++) {
        for (let b = 0; b < p; b++) xtx[a * p + b] = xtx[a * p + b]! + row[a]! * row[b]!;
        for (let b = 0; b < dim; b++)
          xty[a * dim + b] = xty[a * dim + b]! + row[a]! * e.codes[t * dim + b]!;
      }
    }
  }
  let B;
  try {
    B = solveSpd(
      { rows: p, cols: p, data: xtx },
      { rows: p, cols: dim, data: xty },
      'state Gram matrix',
    );
  } catch {
    return { reason: 'test states are degenerate' };
  }
  const { residual, total } = residualShare(episodes, B.data, s, dim, count);
  if (!(residual <= ALIGNMENT_TOLERANCE * total)) {
    return {
      reason: `representation is not an affine function of the state (residual share ${(residual / total).toExponential(2)})`,
    };
  }
  // Row form ψ = s B_s + b, so M = B_sᵀ [dim, s] and b = last row of B.
  const M = new Matrix(s, s);
  for (let i = 0; i < s; i++) for (let j = 0; j < s; j++) M.set(i, j, B.data[j * dim + i]!);
  const F = Matrix.from1DArray(s, s, Array.from(model.F));
  const Q = Matrix.from1DArray(s, s, Array.from(model.Q));
  const Fpsi = M.mmul(F).mmul(inverse(M));
  const Qpsi = M.mmul(Q).mmul(M.transpose());
  const aligned = trueTransition(
    { rows: s, cols: s, data: Float64Array.from(Fpsi.to1DArray()) },
    { rows: s, cols: s, data: Float64Array.from(Qpsi.to1DArray()) },
  );
  return {
    model: { ...aligned, mean: Float64Array.from(B.data.subarray(s * dim, (s + 1) * dim)) },
  };
}

function residualShare(
  episodes: readonly EncodedEpisode[],
  B: Float64Array,
  s: number,
  dim: number,
  count: number,
): { residual: number; total: number } {
  const mean = new Float64Array(dim);
  for (const e of episodes)
    for (let i = 0; i < e.steps * dim; i++) mean[i % dim] = mean[i % dim]! + e.codes[i]!;
  for (let j = 0; j < dim; j++) mean[j] = mean[j]! / count;
  let residual = 0;
  let total = 0;
  for (const e of episodes) {
    for (let t = 0; t < e.steps; t++) {
      for (let j = 0; j < dim; j++) {
        let fit = B[s * dim + j]!;
        for (let a = 0; a < s; a++) fit += e.state![t * s + a]! * B[a * dim + j]!;
        const y = e.codes[t * dim + j]!;
        residual += (y - fit) ** 2;
        total += (y - mean[j]!) ** 2;
      }
    }
  }
  return { residual, total };
}
