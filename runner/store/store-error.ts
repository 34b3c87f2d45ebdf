/**
 * Errors and problems of the results store. Every one carries a stable `code` (listed in
 * docs/runner.md) so callers and tests match on the code, not the wording.
 */
export type StoreErrorCode =
  | 'store-unwritable' // the output directory cannot be created or written
  | 'store-missing-plan' // no plan.json in the directory
  | 'store-corrupt-file' // a plan.json or result.json that is not valid JSON or lacks fields
  | 'store-mismatched-id' // a result.json whose id differs from its directory name
  | 'store-bad-job-id' // a job id that would escape the jobs/ directory
  | 'store-not-a-run'; // the directory does not exist or holds no jobs/ and no plan.json

/** A thrown store error: what went wrong, on which file, and how to fix it. */
export class StoreError extends Error {
  readonly code: StoreErrorCode;
  readonly file: string;

  constructor(code: StoreErrorCode, file: string, message: string) {
    super(`${file}: ${message}`);
    this.name = 'StoreError';
    this.code = code;
    this.file = file;
  }
}

/** A problem found while reading a results directory; reading goes on past it. */
export interface StoreProblem {
  code: StoreErrorCode;
  file: string;
  message: string;
}
