/**
 * The forecast, bridge and planning tables of the HTML report: one table per metric, rows
 * setting × transition source × method, columns the levels (horizons, waypoint counts), cells
 * "mean ± half-width" of the shared aggregation's 95 % t-interval. Rows of the true model (source
 * 'true') and metrics named `<metric>_oracle` are oracle rows: shown, styled apart, never
 * compared with the methods.
 */
import { summaryKey, type MetricSummary } from '../aggregate.ts';
import type { BestMark } from '../best-marks.ts';
import { formatMeanInterval } from '../format-number.ts';
import { levelColumnsOf, levelKeyOf } from '../level-columns.ts';
import { readDiagnostic, type Reading } from './diagnostic-rules.ts';

export interface WideCell {
  text: string;
  mark: BestMark;
  /** Plain reading of a diagnostic metric's mean ('' for other metrics). */
  reading: Reading | '';
  /** Identity of the summary, for the browser test to match against `table --format json`. */
  data: {
    setting: string;
    method: string;
    metric: string;
    source: string;
    level: string;
    unit: string;
    mean: string;
    ciLow: string;
    ciHigh: string;
  } | null;
}

export interface WideRow {
  settingValues: string[];
  method: string;
  source: string;
  oracle: boolean;
  /** True on the first row of a new setting: the template draws a rule above it. */
  newSetting: boolean;
  cells: WideCell[];
}

export interface WideTable {
  metric: string;
  /** The diagnostic threshold in words, when the metric has a reading rule. */
  threshold: string;
  settingColumns: string[];
  columns: string[];
  rows: WideRow[];
}

const SOURCE_RANK: Record<string, number> = { critic: 0, fitted: 1, '': 2, true: 4 };

function isOracle(row: MetricSummary, metric: string): boolean {
  return row.source === 'true' || row.metric === `${metric}_oracle`;
}

export function cellOf(
  row: MetricSummary | undefined,
  marks: ReadonlyMap<string, BestMark>,
  oracle: boolean,
): WideCell {
  if (!row) return { text: '–', mark: '', reading: '', data: null };
  return {
    text: formatMeanInterval(row.mean, row.ciLow, row.ciHigh).text,
    mark: oracle ? '' : (marks.get(summaryKey(row)) ?? ''),
    reading: readDiagnostic(row.metric, row.mean)?.reading ?? '',
    data: {
      setting: JSON.stringify(row.setting),
      method: row.method,
      metric: row.metric,
      source: row.source,
      level: String(row.level),
      unit: row.unit,
      mean: String(row.mean),
      ciLow: String(row.ciLow),
      ciHigh: String(row.ciHigh),
    },
  };
}

interface Line {
  setting: Record<string, string>;
  method: string;
  source: string;
  oracle: boolean;
  /** First-seen order, the last sort key. */
  order: number;
  /** Level column key → summary. */
  cells: Map<string, MetricSummary>;
}

/** Rows of one table in display order: by setting, then source (oracle last), then first seen. */
function collectLines(rows: readonly MetricSummary[], metric: string): Line[] {
  const settingOrder: string[] = [];
  const lines = new Map<string, Line>();
  for (const row of rows) {
    const settingKey = JSON.stringify(row.setting);
    if (!settingOrder.includes(settingKey)) settingOrder.push(settingKey);
    const method = row.metric === `${metric}_oracle` ? 'oracle' : row.method;
    const key = JSON.stringify([settingKey, row.source, method]);
    const line = lines.get(key) ?? {
      setting: row.setting,
      method,
      source: row.source,
      oracle: isOracle(row, metric),
      order: lines.size,
      cells: new Map<string, MetricSummary>(),
    };
    line.cells.set(levelKeyOf(row), row);
    lines.set(key, line);
  }
  const rank = (l: Line): [number, number] => [
    settingOrder.indexOf(JSON.stringify(l.setting)),
    l.oracle ? 9 : (SOURCE_RANK[l.source] ?? 3),
  ];
  return [...lines.values()].sort((a, b) => {
    const [a0, a1] = rank(a);
    const [b0, b1] = rank(b);
    return a0 - b0 || a1 - b1 || a.order - b.order;
  });
}

/** One wide table for `metric` (plus its `_oracle` companion rows). */
export function buildWideTable(
  summaries: readonly MetricSummary[],
  marks: ReadonlyMap<string, BestMark>,
  settingColumns: string[],
  metric: string,
): WideTable {
  const rows = summaries.filter((s) => s.metric === metric || s.metric === `${metric}_oracle`);
  const columns = levelColumnsOf(rows);
  let previous = '';
  return {
    metric,
    threshold: readDiagnostic(metric, 0)?.threshold ?? '',
    settingColumns,
    columns: columns.map((c) => c.label),
    rows: collectLines(rows, metric).map((line) => {
      const settingKey = JSON.stringify(line.setting);
      const newSetting = previous !== '' && settingKey !== previous;
      previous = settingKey;
      return {
        settingValues: settingColumns.map((c) => line.setting[c] ?? ''),
        method: line.method,
        source: line.oracle && line.source === 'true' ? 'true model' : line.source,
        oracle: line.oracle,
        newSetting,
        cells: columns.map((c) => cellOf(line.cells.get(c.key), marks, line.oracle)),
      };
    }),
  };
}

/** The metrics of `suite` that get their own table: `<suite>_nmse` first, `_oracle` ones folded in. */
export function tableMetricsOf(summaries: readonly MetricSummary[], suite: string): string[] {
  const names = [...new Set(summaries.filter((s) => s.suite === suite).map((s) => s.metric))];
  const main = names.filter(
    (m) => !(m.endsWith('_oracle') && names.includes(m.slice(0, -'_oracle'.length))),
  );
  const lead = `${suite}_nmse`;
  return main.sort((a, b) => (a === lead ? -1 : b === lead ? 1 : a < b ? -1 : a > b ? 1 : 0));
}
