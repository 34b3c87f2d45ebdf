/**
 * The one aggregation every output shares (HTML tables and plots, `midpath table`, `midpath
 * compare`): metric rows of finished jobs grouped by (setting, method, suite, metric, source,
 * level, unit) and summarised over seeds with a 95 % t-interval. Keeping it in one place is what
 * lets the browser test check HTML cells against `midpath table --format json`.
 */
import { summarise } from '../numeric/stats/index.ts';
import type { JobResult } from '../store/result.ts';

/** One group of values over seeds, summarised. */
export interface MetricSummary {
  /** Setting column → display value (every column of the run, '' when a job lacks it). */
  setting: Record<string, string>;
  method: string;
  suite: string;
  metric: string;
  source: string;
  level: number | string;
  /** What a level counts when the suite says ('step' | 'jump'), else ''. */
  unit: string;
  /** Seeds behind the values, parallel to `values` (one value per job that reported it). */
  seeds: number[];
  values: number[];
  /** Tasks behind each value (MetricRow.n), parallel to `values`; 0 when not given. */
  tasks: number[];
  n: number;
  mean: number;
  /** NaN when n < 2. */
  std: number;
  /** 95 % t-interval over seeds; NaN when n < 2. */
  ciLow: number;
  ciHigh: number;
}

/** The confidence level of every interval in reports and tables. */
export const CI_LEVEL = 0.95;

/** Display form of a setting value: strings as they are, everything else as JSON. */
export function formatSettingValue(value: unknown): string {
  if (value === undefined || value === null) return '';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  return JSON.stringify(value);
}

/** The setting columns of a run: every key any job's setting has, in first-seen order. */
export function settingColumnsOf(results: readonly JobResult[]): string[] {
  const seen = new Set<string>();
  for (const result of results) for (const key of Object.keys(result.spec.setting)) seen.add(key);
  return [...seen];
}

/** Method labels in first-seen order (plan order when `readRun` had a plan). */
export function methodOrderOf(results: readonly JobResult[]): string[] {
  return [...new Set(results.map((r) => r.spec.method.label))];
}

/** Compares two levels: numbers numerically and before strings, strings alphabetically. */
export function compareLevels(a: number | string, b: number | string): number {
  if (typeof a === 'number' && typeof b === 'number') return a - b;
  if (typeof a === 'number') return -1;
  if (typeof b === 'number') return 1;
  // Bins such as '2-4' and '10-16' sort by their leading number, then as text.
  const x = Number.parseFloat(a);
  const y = Number.parseFloat(b);
  if (Number.isFinite(x) && Number.isFinite(y) && x !== y) return x - y;
  return compareText(a, b);
}

/** Units in reading order: none, environment steps, then geometric jumps, then others. */
export function compareUnits(a: string, b: string): number {
  const rank = (u: string): number => ['', 'step', 'jump'].indexOf(u) + 1 || 4;
  return rank(a) - rank(b) || compareText(a, b);
}

/** Code-point order: unlike localeCompare it is the same on every machine. */
export function compareText(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Compares setting display values: numerically when both parse as numbers. */
export function compareSettingValues(a: string, b: string): number {
  const x = Number(a);
  const y = Number(b);
  if (a !== '' && b !== '' && Number.isFinite(x) && Number.isFinite(y)) return x - y;
  return compareText(a, b);
}

/** Compares two settings column by column (numerically where both values are numbers). */
export function compareSettings(
  a: Record<string, string>,
  b: Record<string, string>,
  columns: readonly string[],
): number {
  for (const column of columns) {
    const c = compareSettingValues(a[column] ?? '', b[column] ?? '');
    if (c !== 0) return c;
  }
  return 0;
}

/** The identity of a group, as one string (also used to match runs in `compare`). */
export function summaryKey(s: Omit<MetricSummary, 'seeds' | 'values' | 'tasks'>): string {
  return JSON.stringify([s.setting, s.method, s.suite, s.metric, s.source, s.level, s.unit]);
}

interface Group {
  head: Pick<
    MetricSummary,
    'setting' | 'method' | 'suite' | 'metric' | 'source' | 'level' | 'unit'
  >;
  seeds: number[];
  values: number[];
  tasks: number[];
}

function collectGroups(results: readonly JobResult[], columns: string[]): Map<string, Group> {
  const groups = new Map<string, Group>();
  for (const result of results) {
    // Failed jobs report nothing; diverged ones may carry partial metrics that would bias a mean.
    if (result.status !== 'done') continue;
    const setting: Record<string, string> = {};
    for (const column of columns) setting[column] = formatSettingValue(result.spec.setting[column]);
    for (const row of result.metrics) {
      if (!Number.isFinite(row.value)) continue;
      const head = {
        setting,
        method: result.spec.method.label,
        suite: row.suite,
        metric: row.metric,
        source: row.source,
        level: row.level,
        unit: row.unit ?? '',
      };
      const key = summaryKey({ ...head, n: 0, mean: 0, std: 0, ciLow: 0, ciHigh: 0 });
      let group = groups.get(key);
      if (!group) {
        group = { head, seeds: [], values: [], tasks: [] };
        groups.set(key, group);
      }
      group.seeds.push(result.spec.seed);
      group.values.push(row.value);
      group.tasks.push(row.n ?? 0);
    }
  }
  return groups;
}

/**
 * Groups the metric rows of finished (`done`) jobs and summarises each group over seeds.
 * Rows come out sorted by setting, method (in `methodOrder`, else first-seen), suite,
 * metric, source and level, so every output built from them is deterministic.
 */
export function aggregateMetrics(
  results: readonly JobResult[],
  methodOrder: readonly string[] = methodOrderOf(results),
): MetricSummary[] {
  const columns = settingColumnsOf(results);
  const summaries: MetricSummary[] = [];
  for (const group of collectGroups(results, columns).values()) {
    const s = summarise(group.values, CI_LEVEL);
    const many = s.n >= 2;
    summaries.push({
      ...group.head,
      seeds: group.seeds,
      values: group.values,
      tasks: group.tasks,
      n: s.n,
      mean: s.mean,
      std: many ? s.std : Number.NaN,
      ciLow: many ? s.ciLow : Number.NaN,
      ciHigh: many ? s.ciHigh : Number.NaN,
    });
  }
  const rank = (m: string): number => {
    const i = methodOrder.indexOf(m);
    return i < 0 ? methodOrder.length : i;
  };
  return summaries.sort((a, b) => {
    return (
      compareSettings(a.setting, b.setting, columns) ||
      rank(a.method) - rank(b.method) ||
      compareText(a.method, b.method) ||
      compareText(a.suite, b.suite) ||
      compareText(a.metric, b.metric) ||
      compareText(a.source, b.source) ||
      compareUnits(a.unit, b.unit) ||
      compareLevels(a.level, b.level)
    );
  });
}
