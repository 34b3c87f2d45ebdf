/** `midpath table`: the tidy table of a run in one of the registered formats. */
import { tableFormats } from './formats/index.ts';
import { earlierResultsNote, loadRun } from './load-run.ts';
import { ReportError, suggestNames } from './report-error.ts';
import { buildTidyTable } from './tidy-table.ts';

export interface TableOptions {
  format: string;
  /** Keep only these metrics (exact names); empty keeps all. */
  metrics?: readonly string[];
  /** Receives notes for the reader (results of an earlier plan left out). */
  onNote?: (note: string) => void;
}

/** Renders the tidy table of the run in `dir`; throws ReportError on bad options. */
export async function renderTable(dir: string, options: TableOptions): Promise<string> {
  const format = tableFormats.get(options.format);
  if (!format) {
    throw new ReportError({
      code: 'unknown-format',
      message: `expected --format ${[...tableFormats.keys()].join('|')}, got '${options.format}'`,
      hint: 'pick one of the listed formats',
    });
  }
  const run = await loadRun(dir);
  const note = earlierResultsNote(run);
  if (note !== null) options.onNote?.(note);
  const wanted = options.metrics ?? [];
  const known = [...new Set(run.summaries.map((s) => s.metric))].sort();
  for (const metric of wanted) {
    if (!known.includes(metric)) {
      const close = suggestNames(metric, known);
      throw new ReportError({
        code: 'unknown-metric',
        path: dir,
        message: `expected a metric some job reported, got '${metric}'`,
        hint:
          close.length > 0
            ? `did you mean ${close.join(', ')}?`
            : `known metrics: ${known.join(', ')}`,
      });
    }
  }
  const rows =
    wanted.length === 0 ? run.summaries : run.summaries.filter((s) => wanted.includes(s.metric));
  return format.render(buildTidyTable(run.settingColumns, rows));
}
