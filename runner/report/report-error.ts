/**
 * Errors raised while reading a results directory for a report, a table or a comparison.
 * Each carries a stable `code`, the file or directory it concerns and a hint on the fix.
 * Nothing in a results directory is changed by a command that raised one.
 */

/** Stable codes, listed in docs/report.md. */
export type ReportErrorCode =
  | 'no-results' // the directory holds no job results at all
  | 'unknown-metric' // `--metric NAME` names a metric no job reported
  | 'unknown-format' // `--format` is not one of the table formats
  | 'bad-tolerance' // `--tolerance` is not a non-negative number
  | 'nothing-shared' // compare: the two runs share no (setting, method, metric, source, level)
  | 'template-missing'; // a handlebars template under templates/ is missing

/** Where and what: the fields a caller prints. */
export interface ReportErrorInit {
  code: ReportErrorCode;
  message: string;
  hint: string;
  /** The file or directory concerned. */
  path?: string;
}

/** A report, table or compare problem with its location and a fix. */
export class ReportError extends Error {
  readonly code: ReportErrorCode;
  readonly hint: string;
  readonly path?: string;

  constructor(init: ReportErrorInit) {
    super(`${init.path === undefined ? '' : `${init.path}: `}${init.message} (${init.code})`);
    this.name = 'ReportError';
    this.code = init.code;
    this.hint = init.hint;
    if (init.path !== undefined) this.path = init.path;
  }
}

/** Formats an error for the terminal: the message, then the hint on its own line. */
export function formatReportError(error: ReportError): string {
  return `error: ${error.message}\n  hint: ${error.hint}`;
}

/** Closest names to `wanted` among `known` (edit distance ≤ 3), for "did you mean" hints. */
export function suggestNames(wanted: string, known: readonly string[]): string[] {
  return known
    .map((name) => ({ name, d: editDistance(wanted, name) }))
    .filter((c) => c.d <= 3)
    .sort((a, b) => a.d - b.d || a.name.localeCompare(b.name))
    .slice(0, 3)
    .map((c) => c.name);
}

function editDistance(a: string, b: string): number {
  // One row of the Levenshtein table at a time: [b.length + 1]
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current[j] = Math.min(
        (previous[j] ?? 0) + 1,
        (current[j - 1] ?? 0) + 1,
        (previous[j - 1] ?? 0) + cost,
      );
    }
    previous = current;
  }
  return previous[b.length] ?? 0;
}

/**
 * Terminal text for an error a report command should turn into exit status 2 (anything with
 * a string `code`: ours, the store's), or null for a bug that should propagate.
 */
export function describeFailure(error: unknown): string | null {
  if (error instanceof ReportError) return formatReportError(error);
  const code: unknown = error instanceof Error ? (error as { code?: unknown }).code : undefined;
  if (error instanceof Error && typeof code === 'string') {
    return `error: ${error.message}${error.message.includes(code) ? '' : ` (${code})`}`;
  }
  return null;
}
