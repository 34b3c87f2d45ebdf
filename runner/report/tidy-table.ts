/**
 * The tidy long table of `midpath table`: one row per (setting columns…, method, suite,
 * metric, source, level, unit) with n, mean, std, ci_low, ci_high. Every table format renders
 * this one shape.
 */
import type { MetricSummary } from './aggregate.ts';
import { markBest, type BestMark } from './best-marks.ts';
import { summaryKey } from './aggregate.ts';

/** What a table format receives. */
export interface TidyTable {
  /** Setting columns (dotted config paths), in first-seen order. */
  settingColumns: string[];
  rows: MetricSummary[];
  /** Best / tie mark of each row, by `summaryKey`. */
  marks: Map<string, BestMark>;
}

/** The fixed columns after the setting columns, in output order. */
export const TIDY_COLUMNS = [
  'method',
  'suite',
  'metric',
  'source',
  'level',
  'unit',
  'n',
  'mean',
  'std',
  'ci_low',
  'ci_high',
] as const;

/** Builds the tidy table from aggregated summaries. */
export function buildTidyTable(settingColumns: string[], rows: MetricSummary[]): TidyTable {
  return { settingColumns, rows, marks: markBest(rows) };
}

/** The mark of one row. */
export function markOf(table: TidyTable, row: MetricSummary): BestMark {
  return table.marks.get(summaryKey(row)) ?? '';
}

/** A number for machine formats: full precision, null for missing (NaN). */
export function machineNumber(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

/** One row as a flat record of the tidy columns (setting columns first). */
export function tidyRecord(
  table: TidyTable,
  row: MetricSummary,
): Record<string, string | number | null> {
  const record: Record<string, string | number | null> = {};
  for (const column of table.settingColumns) record[column] = row.setting[column] ?? '';
  record.method = row.method;
  record.suite = row.suite;
  record.metric = row.metric;
  record.source = row.source;
  record.level = row.level;
  record.unit = row.unit;
  record.n = row.n;
  record.mean = machineNumber(row.mean);
  record.std = machineNumber(row.std);
  record.ci_low = machineNumber(row.ciLow);
  record.ci_high = machineNumber(row.ciHigh);
  return record;
}
