/**
 * The report stage's entry points: `writeReport` (the HTML report, also called at the end of
 * `midpath run`), `renderTable` (`midpath table`) and `compareRuns` (`midpath compare`).
 */
import { mkdir, rename, writeFile } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { buildReportModel } from './html/report-model.ts';
import { renderHtml } from './html/render-html.ts';
import { earlierResultsNote, loadRun } from './load-run.ts';

export { renderTable, type TableOptions } from './write-table.ts';
export { aggregateMetrics, type MetricSummary } from './aggregate.ts';

/**
 * Renders the HTML report of the run in `dir` to a string (no file written); `onNote`
 * hears when results of an earlier plan were left out.
 */
export async function renderReport(
  dir: string,
  onNote: (note: string) => void = () => undefined,
): Promise<string> {
  const run = await loadRun(resolve(dir));
  const note = earlierResultsNote(run);
  if (note !== null) onNote(note);
  return renderHtml(await buildReportModel(run));
}

/**
 * Writes the self-contained HTML report of the results directory `dir` and returns its path
 * (default `<dir>/report.html`). The file is written to a temporary name and renamed, so a
 * reader never sees half a report. Throws ReportError (`no-results`) when nothing finished.
 */
export async function writeReport(
  dir: string,
  options: { htmlPath?: string; onNote?: (note: string) => void } = {},
): Promise<string> {
  const path = resolve(options.htmlPath ?? join(dir, 'report.html'));
  const html = await renderReport(dir, options.onNote);
  await mkdir(dirname(path), { recursive: true });
  const temporary = `${path}.${process.pid}.tmp`;
  await writeFile(temporary, html);
  await rename(temporary, path);
  return path;
}
