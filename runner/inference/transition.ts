/**
 * Transition models whose parameters are given: critic-derived (MATH.md §2, one jump
 * ψ₊ | ψ₀ ~ N(mAψ₀, mI), m = c/(c+1)) and the generator's true model (oracle rows).
 * The fitted source lives in fit-transition.ts.
 */
import type { TransitionModel } from './api.ts';
import type { Mat } from '../numeric/matrix.ts';
import { identity } from '../numeric/matrix.ts';
import { NumericError } from '../numeric/linalg/errors.ts';
import { DEFAULT_MAX_CONDITION, regulariseCovariance } from './regularise.ts';
import { checkFinite, checkNumber } from './validate.ts';

function checkSquare(what: string, m: Mat): void {
  if (m.rows !== m.cols || m.data.length !== m.rows * m.cols || m.rows < 1) {
    throw new NumericError(
      'shape-mismatch',
      `${what}: expected a non-empty square matrix, got ${m.rows}×${m.cols} with ${m.data.length} values`,
    );
  }
  checkFinite(what, m.data, m.cols);
}

/** Critic-derived model F = mA, Q = mI, m = c/(c+1), mean 0 (MATH.md §2, from assumptions A1–A3). */
export function criticTransition(A: Mat, c: number): TransitionModel {
  checkSquare('criticTransition: A', A);
  checkNumber('criticTransition: c', c, (v) => v > 0, 'a target variance c > 0');
  const m = c / (c + 1);
  const F = { rows: A.rows, cols: A.cols, data: A.data.map((v) => m * v) };
  return {
    source: 'critic',
    dim: A.rows,
    F,
    Q: identity(A.rows, m),
    mean: new Float64Array(A.rows),
    notes: [],
  };
}

/**
 * The generator's known linear-Gaussian model (source 'true'), in the generator's own
 * (already centred) coordinates. A singular Q (e.g. noiseless coordinates) is regularised
 * and noted, so bridges stay finite.
 */
export function trueTransition(F: Mat, Q: Mat): TransitionModel {
  checkSquare('trueTransition: F', F);
  checkSquare('trueTransition: Q', Q);
  if (F.rows !== Q.rows) {
    throw new NumericError(
      'shape-mismatch',
      `trueTransition: expected F and Q of the same size, got ${F.rows}×${F.cols} and ${Q.rows}×${Q.cols}`,
    );
  }
  const d = F.rows;
  let trace = 0;
  for (let i = 0; i < d; i++) trace += Q.data[i * d + i]!;
  const { cov, note } = regulariseCovariance(
    Q,
    'Q',
    DEFAULT_MAX_CONDITION,
    Math.abs(trace) / d || 1,
  );
  return {
    source: 'true',
    dim: d,
    F: { rows: d, cols: d, data: Float64Array.from(F.data) },
    Q: note === null ? { rows: d, cols: d, data: Float64Array.from(Q.data) } : cov,
    mean: new Float64Array(d),
    notes: note === null ? [] : [note],
  };
}
