/**
 * Planning success by distance bin. A success rate is a proportion of tasks, so the interval
 * here is Wilson's score interval (Wilson, 1927) on the tasks pooled over seeds: successes =
 * Σ rate·tasks, trials = Σ tasks. Pooling treats every task as one trial; the seeds' own
 * spread is in the tidy tables (t-interval) for whoever wants it.
 */
import { wilsonInterval } from '../../numeric/stats/index.ts';
import type { MetricSummary } from '../aggregate.ts';
import { formatValue } from '../format-number.ts';
import { levelColumnsOf, levelKeyOf } from '../level-columns.ts';

export interface PlanningCell {
  text: string;
  /** Pooled tasks behind the cell. */
  trials: number;
  rate: number;
  low: number;
  high: number;
}

export interface PlanningTable {
  metric: string;
  settingColumns: string[];
  columns: string[];
  rows: {
    settingValues: string[];
    method: string;
    source: string;
    cells: (PlanningCell | null)[];
  }[];
}

/** Pools a success-rate summary over seeds into a Wilson interval; null without task counts. */
export function poolSuccess(row: MetricSummary): PlanningCell | null {
  const trials = row.tasks.reduce((a, n) => a + n, 0);
  if (trials <= 0 || row.tasks.some((n) => n <= 0)) return null;
  // Each rate is successes / tasks of one seed; rounding undoes float error in rate·tasks.
  const successes = row.values.reduce((a, v, i) => a + Math.round(v * (row.tasks[i] ?? 0)), 0);
  const { low, high } = wilsonInterval(successes, trials);
  const rate = successes / trials;
  return {
    text: `${formatValue(rate)} [${formatValue(low)}, ${formatValue(high)}]`,
    trials,
    rate,
    low,
    high,
  };
}

/** One table per planning success metric (`planning_success`, `planning_success_<arm>`). */
export function buildPlanningTables(
  summaries: readonly MetricSummary[],
  settingColumns: string[],
): PlanningTable[] {
  const rows = summaries.filter(
    (s) => s.suite === 'planning' && /^planning_success/.test(s.metric),
  );
  const metrics = [...new Set(rows.map((r) => r.metric))].sort();
  return metrics.map((metric) => {
    const mine = rows.filter((r) => r.metric === metric);
    const columns = levelColumnsOf(mine);
    const lines = new Map<
      string,
      {
        setting: Record<string, string>;
        method: string;
        source: string;
        cells: Map<string, MetricSummary>;
      }
    >();
    for (const r of mine) {
      const key = JSON.stringify([r.setting, r.source, r.method]);
      const line = lines.get(key) ?? {
        setting: r.setting,
        method: r.method,
        source: r.source,
        cells: new Map(),
      };
      line.cells.set(levelKeyOf(r), r);
      lines.set(key, line);
    }
    return {
      metric,
      settingColumns,
      columns: columns.map((c) => c.label),
      rows: [...lines.values()].map((l) => ({
        settingValues: settingColumns.map((c) => l.setting[c] ?? ''),
        method: l.method,
        source: l.source,
        cells: columns.map((c) => {
          const s = l.cells.get(c.key);
          return s === undefined ? null : poolSuccess(s);
        }),
      })),
    };
  });
}
