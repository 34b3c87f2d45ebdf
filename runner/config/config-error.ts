import { readFileSync } from 'node:fs';

/**
 * Every stable error code of the experiment-file language, with a one-line meaning. The
 * record is the single list: `docs/errors.md` is generated from it and the union type below
 * is derived from its keys.
 */
export const CONFIG_ERROR_CODES = {
  'file-not-found': 'The experiment file (or a `--set` target file) does not exist.',
  'file-unreadable': 'The path exists but cannot be read as a file (a folder, or no permission).',
  'binary-file': 'The file is not UTF-8 text (it holds NUL bytes or invalid byte sequences).',
  'empty-file': 'The file holds no YAML content (only blanks or comments).',
  'yaml-syntax': 'The YAML itself does not parse (indentation, quotes, brackets, tabs).',
  'duplicate-key': 'A mapping names the same key twice.',
  'not-a-mapping': 'The top level of the file is a list or a plain value, not a mapping of keys.',
  'extends-missing': 'The base file named by `extends` does not exist.',
  'extends-cycle': 'A chain of `extends` leads back to a file already in the chain.',
  'unknown-key': 'A key the schema does not define (often a typo; a hint names the closest key).',
  'missing-key': 'A key that must be present is absent.',
  'wrong-type': 'A value has the wrong type (for example text where a number is expected).',
  'out-of-range': 'A number or a list length lies outside the allowed range.',
  'unknown-value': 'A value is not one of the allowed choices.',
  'bad-format': 'A text value does not have the required form (for example the experiment name).',
  'duplicate-value': 'A list that must hold distinct values repeats one.',
  'empty-list': 'A list that needs at least one entry is empty.',
  'bad-split': 'The episode split fractions do not sum to 1.',
  'needs-key':
    'A choice requires a companion key that is missing (e.g. source `file` needs `data.file`).',
  'duplicate-method': 'Two compared methods share the same table label.',
  'unknown-axis': 'A sweep axis names a config path that does not exist.',
  'axis-not-sweepable':
    'A sweep axis names a path that cannot vary between jobs (sweep, run, name, methods).',
  'bad-axis-value': 'A value listed on a sweep axis is not accepted by the path it sweeps.',
  'empty-axis': 'A sweep axis lists no values.',
  'duplicate-axis':
    'A path is swept twice (in `axes` and `together`, twice in a group, or nested in another swept path).',
  'together-length': 'The paths of a `together` group list different numbers of values.',
  'too-many-jobs': 'The sweep expands to more jobs than `run.maxJobs` allows.',
  'episodes-too-short':
    'The episodes of a built-in source (`data.steps` long) are shorter than the longest forecast horizon or bridge the evaluation asks for.',
  'bad-override': 'A `--set path=value` override is malformed.',
} as const;

/** A stable error code; tests and scripts match on it, never on the message text. */
export type ConfigErrorCode = keyof typeof CONFIG_ERROR_CODES;

/** One problem in an experiment file, located at a 1-based line and column. */
export interface ConfigError {
  code: ConfigErrorCode;
  /** The file as the user named it (relative to the working directory when inside it). */
  file: string;
  /** 1-based line; 1 when the problem concerns the whole file. */
  line: number;
  /** 1-based column. */
  col: number;
  /** What is wrong, in the form "expected …, got …" where that fits. */
  message: string;
  /** How to fix it, including "did you mean" suggestions. */
  hint?: string;
}

/** Reads a file's text for the source excerpt; returns undefined when unavailable. */
export type ReadSource = (file: string) => string | undefined;

/** Reads the source line excerpts from disk, relative to the process working directory. */
export function readSourceFromDisk(file: string): string | undefined {
  try {
    return readFileSync(file, 'utf8');
  } catch {
    return undefined;
  }
}

/** Orders errors by file, then position, so output reads top to bottom. */
export function sortConfigErrors(errors: readonly ConfigError[]): ConfigError[] {
  return [...errors].sort(
    (a, b) => a.file.localeCompare(b.file) || a.line - b.line || a.col - b.col,
  );
}

/**
 * Formats errors as `path:line:col  code  message`, then the offending source line and a
 * caret under the column, then the hint. Every error is printed, not only the first.
 */
export function formatConfigErrors(
  errors: readonly ConfigError[],
  readSource: ReadSource = readSourceFromDisk,
): string {
  const cache = new Map<string, string[] | undefined>();
  const linesOf = (file: string): string[] | undefined => {
    if (!cache.has(file)) cache.set(file, readSource(file)?.split(/\r?\n/));
    return cache.get(file);
  };
  const blocks = errors.map((error) => {
    const out = [`${error.file}:${error.line}:${error.col}  ${error.code}  ${error.message}`];
    const source = linesOf(error.file)?.[error.line - 1];
    if (source !== undefined && source.trim() !== '') {
      const shown = source.replace(/\t/g, ' ');
      out.push(`  ${error.line} | ${shown}`);
      const gutter = ' '.repeat(String(error.line).length);
      out.push(`  ${gutter} | ${' '.repeat(Math.max(0, error.col - 1))}^`);
    }
    if (error.hint !== undefined) out.push(`  hint: ${error.hint}`);
    return out.join('\n');
  });
  return blocks.join('\n\n');
}
