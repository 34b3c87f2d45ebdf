/**
 * The error type of the evaluation stage. Each carries a stable `code` (listed in
 * docs/metrics.md), says what was expected and what came, where, and how to fix it.
 */

export type EvaluationErrorCode =
  | 'no-test-episodes' // the dataset split left no test episodes
  | 'encode-shape' // a representation's encode returned the wrong number of values
  | 'encode-non-finite'; // a representation's encode returned NaN or ±Infinity

export class EvaluationError extends Error {
  readonly code: EvaluationErrorCode;
  readonly hint: string;

  constructor(code: EvaluationErrorCode, message: string, hint: string) {
    super(`${message} (${hint})`);
    this.name = 'EvaluationError';
    this.code = code;
    this.hint = hint;
  }
}
