/** `midpath compare` over two results directories. */
import { earlierResultsNote, loadRun } from '../load-run.ts';
import { ReportError } from '../report-error.ts';
import {
  compareSummaries,
  DEFAULT_COMPARE,
  type CompareOptions,
  type Comparison,
} from './compare-runs.ts';

export { formatComparison } from './compare-markdown.ts';
export {
  compareSummaries,
  DEFAULT_COMPARE,
  type Comparison,
  type ComparisonRow,
  type CompareOptions,
} from './compare-runs.ts';

/** Loads both runs and compares them; throws `nothing-shared` when no group matches. */
export async function compareRuns(
  baseDir: string,
  candidateDir: string,
  options: CompareOptions = DEFAULT_COMPARE,
  onNote: (note: string) => void = () => undefined,
): Promise<Comparison> {
  const [base, candidate] = await Promise.all([loadRun(baseDir), loadRun(candidateDir)]);
  for (const run of [base, candidate]) {
    const note = earlierResultsNote(run);
    if (note !== null) onNote(note);
  }
  const comparison = compareSummaries(base.summaries, candidate.summaries, options);
  if (comparison.rows.length === 0) {
    throw new ReportError({
      code: 'nothing-shared',
      path: candidateDir,
      message: `expected groups (setting, method, metric, source, level) shared with ${baseDir}, got none`,
      hint: 'compare runs of the same experiment file: setting columns and method labels must match',
    });
  }
  return comparison;
}

/**
 * Parses `--tolerance`: a fraction ("0.05") or a percentage ("5%"); throws `bad-tolerance`.
 */
export function parseTolerance(text: string): number {
  const percent = text.trim().endsWith('%');
  const value = Number(percent ? text.trim().slice(0, -1) : text);
  if (text.trim() === '' || !Number.isFinite(value) || value < 0) {
    throw new ReportError({
      code: 'bad-tolerance',
      message: `expected --tolerance as a non-negative fraction (0.05) or percentage (5%), got '${text}'`,
      hint: 'for example --tolerance 0.05',
    });
  }
  return percent ? value / 100 : value;
}
