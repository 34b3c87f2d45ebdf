/**
 * Errors raised while reading or generating a dataset. Each carries a stable `code`, the
 * file and the row (1-based line of a text file) or index (e.g. `[3, 17, 2]` of an array)
 * where the problem is, and a hint on how to fix it. Nothing trains on data that raised one.
 */

/** Stable codes, listed in docs/datasets.md. */
export type DataErrorCode =
  | 'file-not-found' // the data file does not exist or cannot be read
  | 'empty-file' // no header, no rows, or a zero-length array
  | 'unknown-format' // extension not .csv / .jsonl / .npy and no `format` given
  | 'missing-column' // a configured column is not in the header / record
  | 'non-numeric' // a cell that should be a number is not
  | 'non-finite' // NaN or ±Infinity
  | 'ragged-row' // a CSV row with more or fewer cells than the header
  | 'bad-json' // a JSON Lines line that does not parse to an object
  | 'unordered-steps' // steps of an episode out of order or repeated
  | 'missing-steps' // a gap in an episode's step numbers
  | 'ragged-features' // records of one file with different feature counts
  | 'episode-too-short' // fewer steps than the longest horizon the evaluation needs
  | 'too-few-episodes' // not enough episodes for a train / val / test split
  | 'bad-npy' // malformed NumPy header or truncated payload
  | 'unsupported-dtype' // a NumPy dtype other than little-endian float32 / float64
  | 'bad-shape' // array rank or dimensions other than the ones required
  | 'bad-config'; // a data option out of range for the chosen source

/** Where and what: the fields a caller prints. */
export interface DataErrorInit {
  code: DataErrorCode;
  message: string;
  hint: string;
  file?: string;
  row?: number;
  index?: string;
}

/** A dataset problem with its location and a fix. `message` already names file and row. */
export class DataError extends Error {
  readonly code: DataErrorCode;
  readonly file?: string;
  readonly row?: number;
  readonly index?: string;
  readonly hint: string;

  constructor(init: DataErrorInit) {
    super(formatMessage(init));
    this.name = 'DataError';
    this.code = init.code;
    this.hint = init.hint;
    if (init.file !== undefined) this.file = init.file;
    if (init.row !== undefined) this.row = init.row;
    if (init.index !== undefined) this.index = init.index;
  }
}

function formatMessage(init: DataErrorInit): string {
  let where = init.file ?? '';
  if (init.row !== undefined) where += `${where ? ':' : 'row '}${init.row}`;
  if (init.index !== undefined) where += `${where ? ' ' : ''}at index ${init.index}`;
  return `${where ? `${where}: ` : ''}${init.message} (${init.code})`;
}

/** Formats an error for the terminal: the message, then the hint on its own line. */
export function formatDataError(error: DataError): string {
  return `error: ${error.message}\n  hint: ${error.hint}`;
}
