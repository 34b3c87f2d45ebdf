/**
 * Figures drawn from the shared aggregation itself, so their points and intervals are the
 * tables' numbers: error against representation dimension, and against horizon.
 */
import type { MetricSummary } from '../aggregate.ts';
import type { LoadedRun } from '../load-run.ts';
import { renderLineChart, type ChartSeries } from '../svg/line-chart.ts';
import {
  limit,
  pointOf,
  preferredSource,
  settingLabel,
  type FigureGroup,
} from './figure-helpers.ts';

/** The setting column that holds the representation dimension, if it varies. */
export function dimensionColumn(
  columns: readonly string[],
  summaries: readonly MetricSummary[],
): string | null {
  const column = columns.find((c) => c === 'dim' || c.endsWith('.dim'));
  if (column === undefined) return null;
  const values = new Set(summaries.map((s) => Number(s.setting[column])));
  return values.size >= 2 && [...values].every((v) => Number.isFinite(v) && v > 0) ? column : null;
}

/** Error against representation dimension: one panel per metric and level, series per method. */
export function figureByDimension(run: LoadedRun): FigureGroup {
  const title = 'Error against representation dimension';
  const dim = dimensionColumn(run.settingColumns, run.summaries);
  if (dim === null)
    return {
      title,
      caption: '',
      panels: [],
      note: 'Omitted: the representation dimension does not vary in this run.',
    };
  const others = run.settingColumns.filter((c) => c !== dim);
  const panels: string[] = [];
  for (const metric of ['forecast_nmse', 'bridge_nmse']) {
    const rows = run.summaries.filter((s) => s.metric === metric && s.unit !== 'jump');
    const source = preferredSource(rows);
    const levels = [...new Set(rows.filter((r) => r.source === source).map((r) => r.level))];
    for (const level of levels) {
      const series = new Map<string, ChartSeries>();
      for (const r of rows) {
        if (r.source !== source || r.level !== level) continue;
        const name =
          others.length === 0 ? r.method : `${r.method} (${settingLabel(r.setting, others)})`;
        const s = series.get(name) ?? { name, points: [] };
        s.points.push(pointOf(Number(r.setting[dim]), r));
        series.set(name, s);
      }
      const what =
        metric === 'forecast_nmse'
          ? `horizon ${level}`
          : `${level} waypoint${level === 1 ? '' : 's'}`;
      panels.push(
        renderLineChart({
          title: `${metric}, ${what}${source ? ` (${source})` : ''}`,
          xLabel: dim,
          yLabel: metric,
          xScale: 'log2',
          series: [...series.values()],
        }),
      );
    }
  }
  const limited = limit(panels, 'panels');
  const empty = panels.length === 0 ? 'Omitted: no forecast_nmse or bridge_nmse rows.' : '';
  return {
    title,
    caption: 'Mean over seeds with its 95 % t-interval, as in the tables.',
    panels: limited.panels,
    note: empty || limited.note,
  };
}

/** Forecast error against horizon: one panel per setting, series per method, oracle dashed. */
export function figureByHorizon(run: LoadedRun): FigureGroup {
  const title = 'Forecast error against horizon';
  const rows = run.summaries.filter(
    (s) =>
      (s.metric === 'forecast_nmse' || s.metric === 'forecast_nmse_oracle') &&
      s.unit !== 'jump' &&
      typeof s.level === 'number',
  );
  const source = preferredSource(rows.filter((r) => r.metric === 'forecast_nmse'));
  const settings = [...new Set(rows.map((r) => JSON.stringify(r.setting)))];
  const panels: string[] = [];
  for (const key of settings) {
    const series = new Map<string, ChartSeries>();
    for (const r of rows) {
      if (JSON.stringify(r.setting) !== key) continue;
      const oracle = r.metric === 'forecast_nmse_oracle';
      if (!oracle && r.source !== source) continue;
      const name = oracle ? `oracle (${r.method})` : r.method;
      const s = series.get(name) ?? { name, points: [], dashed: oracle };
      s.points.push(pointOf(Number(r.level), r));
      series.set(name, s);
    }
    // One oracle line is enough when every method's oracle is the same computation.
    const lines = dedupeOracles([...series.values()]);
    if (lines.length > 0)
      panels.push(
        renderLineChart({
          title: settingLabel(JSON.parse(key) as Record<string, string>, run.settingColumns),
          xLabel: 'horizon (steps)',
          yLabel: `forecast_nmse${source ? ` (${source})` : ''}`,
          xScale: 'points',
          series: lines,
        }),
      );
  }
  const limited = limit(panels, 'settings');
  return {
    title,
    caption: 'Mean over seeds with its 95 % t-interval; dashed: the true model (oracle).',
    panels: limited.panels,
    note:
      panels.length === 0 ? 'Omitted: no forecast_nmse rows with numeric horizons.' : limited.note,
  };
}

function dedupeOracles(series: ChartSeries[]): ChartSeries[] {
  const methods = series.filter((s) => !(s.dashed ?? false));
  const oracles = series.filter((s) => s.dashed ?? false);
  const first = oracles[0];
  if (first === undefined) return methods;
  const same = oracles.every((o) => JSON.stringify(o.points) === JSON.stringify(first.points));
  return same ? [...methods, { ...first, name: 'oracle (true model)' }] : [...methods, ...oracles];
}
