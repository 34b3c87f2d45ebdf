/**
 * The one error type of the dense linear-algebra kernels and the inference stage built on
 * them. Every error carries a stable `code` and names the shapes involved (STYLE.md §5).
 */

/** Stable error codes; listed in docs/inference.md. */
export type NumericErrorCode =
  'shape-mismatch' | 'not-positive-definite' | 'non-finite-input' | 'invalid-argument';

/** A numerical error with a stable code and a message of the form "expected …, got …". */
export class NumericError extends Error {
  readonly code: NumericErrorCode;

  constructor(code: NumericErrorCode, message: string) {
    super(message);
    this.name = 'NumericError';
    this.code = code;
  }
}

/** Throws `shape-mismatch` unless `length === expected`; `what` names the argument and its shape. */
export function checkLength(what: string, length: number, expected: number, shape: string): void {
  if (length !== expected) {
    throw new NumericError(
      'shape-mismatch',
      `${what}: expected ${shape} = ${expected} values, got ${length}; pass a row-major array of that shape`,
    );
  }
}

/** Throws `non-finite-input` at the first NaN/±Infinity, naming the flat index and row. */
export function checkFinite(what: string, values: ArrayLike<number>, cols: number): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      const row = Math.floor(i / Math.max(cols, 1));
      throw new NumericError(
        'non-finite-input',
        `${what}: expected finite numbers, got ${String(values[i])} at row ${row}, column ${i - row * cols}; remove or repair that row`,
      );
    }
  }
}

/** Throws `invalid-argument` unless `value` is an integer ≥ `min`. */
export function checkInteger(what: string, value: number, min: number): void {
  if (!Number.isInteger(value) || value < min) {
    throw new NumericError(
      'invalid-argument',
      `${what}: expected an integer ≥ ${min}, got ${String(value)}`,
    );
  }
}
