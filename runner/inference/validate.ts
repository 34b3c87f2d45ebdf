/** Argument checks shared by the inference entry points: clear errors with codes and shapes. */
import type { TransitionModel } from './api.ts';
import { NumericError, checkFinite, checkInteger, checkLength } from '../numeric/linalg/errors.ts';

export { checkFinite, checkInteger, checkLength };

/** Throws `shape-mismatch` unless F, Q and mean agree with `model.dim`. */
export function checkModel(model: TransitionModel, where: string): void {
  const d = model.dim;
  checkInteger(`${where}: model.dim`, d, 1);
  const bad = (what: string, got: string): never => {
    throw new NumericError(
      'shape-mismatch',
      `${where}: expected model.${what} to be ${d}×${d} for dim ${d}, got ${got}`,
    );
  };
  if (model.F.rows !== d || model.F.cols !== d) bad('F', `${model.F.rows}×${model.F.cols}`);
  if (model.Q.rows !== d || model.Q.cols !== d) bad('Q', `${model.Q.rows}×${model.Q.cols}`);
  if (model.mean.length !== d) {
    throw new NumericError(
      'shape-mismatch',
      `${where}: expected model.mean of length ${d}, got ${model.mean.length}`,
    );
  }
}

/** Throws `invalid-argument` unless `value` is a finite number satisfying `ok`. */
export function checkNumber(
  what: string,
  value: number,
  ok: (v: number) => boolean,
  want: string,
): void {
  if (!Number.isFinite(value) || !ok(value)) {
    throw new NumericError('invalid-argument', `${what}: expected ${want}, got ${String(value)}`);
  }
}

/** Copies `values` ([count, dim]) to a Float64Array minus `mean` ([dim]). */
export function centreRows(
  values: ArrayLike<number>,
  count: number,
  dim: number,
  mean: Float64Array,
): Float64Array {
  const out = new Float64Array(count * dim);
  for (let i = 0; i < count; i++) {
    const o = i * dim;
    for (let j = 0; j < dim; j++) out[o + j] = values[o + j]! - mean[j]!;
  }
  return out;
}
