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
  preferredUnit,
  settingLabel,
  unitSuffix,
  type FigureGroup,
} from './figure-helpers.ts';

/** The setting column that holds the representation dimension, if it takes ≥ 2 values. */
export function dimensionColumn(
  columns: readonly string[],
  summaries: readonly MetricSummary[],
): string | null {
  const column = columns.find((c) => c === 'dim' || c.endsWith('.dim'));
  if (column === undefined) return null;
  // Methods without a dimension (the raw observation) have no value here; they are left out.
  const values = new Set(
    summaries.map((s) => Number(s.setting[column] || Number.NaN)).filter((v) => v > 0),
  );
  return values.size >= 2 ? column : null;
}

function dimensionPanel(
  rows: readonly MetricSummary[],
  metric: string,
  level: number | string,
  dim: string,
  others: readonly string[],
): string {
  const series = new Map<string, ChartSeries>();
  for (const r of rows) {
    if (r.level !== level) continue;
    const name =
      others.length === 0 ? r.method : `${r.method} (${settingLabel(r.setting, others)})`;
    const s = series.get(name) ?? { name, points: [] };
    s.points.push(pointOf(Number(r.setting[dim]), r));
    series.set(name, s);
  }
  const unit = unitSuffix(rows[0]?.unit ?? '');
  const what = metric === 'forecast_nmse' ? `horizon ${level}${unit}` : `T = ${level}${unit}`;
  const source = rows[0]?.source ?? '';
  return renderLineChart({
    title: `${metric}, ${what}${source ? `, ${source}` : ''}`,
    xLabel: dim,
    yLabel: metric,
    xScale: 'log2',
    series: [...series.values()],
  });
}

/** Error against representation dimension: one panel per metric and level, series per method. */
export function figureByDimension(run: LoadedRun): FigureGroup {
  const title = 'Error against representation dimension';
  const dim = dimensionColumn(run.settingColumns, run.summaries);
  if (dim === null) {
    const note = 'Omitted: the representation dimension does not vary in this run.';
    return { title, caption: '', panels: [], note };
  }
  const others = run.settingColumns.filter((c) => c !== dim);
  const panels: string[] = [];
  for (const metric of ['forecast_nmse', 'bridge_nmse']) {
    const all = run.summaries.filter((s) => s.metric === metric && Number(s.setting[dim]) > 0);
    const source = preferredSource(all);
    const unit = preferredUnit(all.filter((r) => r.source === source));
    const rows = all.filter((r) => r.source === source && r.unit === unit);
    for (const level of [...new Set(rows.map((r) => r.level))]) {
      panels.push(dimensionPanel(rows, metric, level, dim, others));
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

/** The oracle as one dashed series: per horizon, the summary resting on the most seeds. */
function oracleSeries(rows: readonly MetricSummary[]): ChartSeries | null {
  const best = new Map<number, MetricSummary>();
  for (const r of rows) {
    const level = Number(r.level);
    const held = best.get(level);
    if (held === undefined || r.n > held.n) best.set(level, r);
  }
  if (best.size === 0) return null;
  const points = [...best.entries()].map(([level, r]) => pointOf(level, r));
  return { name: 'oracle (true model)', points, dashed: true };
}

function horizonPanel(
  run: LoadedRun,
  rows: readonly MetricSummary[],
  key: string,
  unit: string,
): string | null {
  const mine = rows.filter((r) => JSON.stringify(r.setting) === key);
  const series = new Map<string, ChartSeries>();
  for (const r of mine) {
    if (r.metric !== 'forecast_nmse') continue;
    const s = series.get(r.method) ?? { name: r.method, points: [] };
    s.points.push(pointOf(Number(r.level), r));
    series.set(r.method, s);
  }
  if (series.size === 0) return null;
  const oracle = oracleSeries(mine.filter((r) => r.metric === 'forecast_nmse_oracle'));
  return renderLineChart({
    title: settingLabel(JSON.parse(key) as Record<string, string>, run.settingColumns),
    xLabel: `horizon (${unit === 'jump' ? 'jumps' : 'steps'})`,
    yLabel: `forecast_nmse${mine[0]?.source ? ` (${mine[0].source})` : ''}`,
    xScale: 'points',
    series: oracle === null ? [...series.values()] : [...series.values(), oracle],
  });
}

/** Forecast error against horizon: one panel per setting, series per method, oracle dashed. */
export function figureByHorizon(run: LoadedRun): FigureGroup {
  const title = 'Forecast error against horizon';
  const numeric = run.summaries.filter((s) => typeof s.level === 'number');
  const forecasts = numeric.filter((s) => s.metric === 'forecast_nmse');
  const source = preferredSource(forecasts);
  const unit = preferredUnit(forecasts.filter((r) => r.source === source));
  const rows = numeric.filter(
    (s) =>
      s.unit === unit &&
      ((s.metric === 'forecast_nmse' && s.source === source) ||
        s.metric === 'forecast_nmse_oracle'),
  );
  const panels: string[] = [];
  for (const key of [...new Set(rows.map((r) => JSON.stringify(r.setting)))]) {
    const panel = horizonPanel(run, rows, key, unit);
    if (panel !== null) panels.push(panel);
  }
  const limited = limit(panels, 'settings');
  return {
    title,
    caption:
      'Mean over seeds with its 95 % t-interval; dashed: the true model (oracle), where known.',
    panels: limited.panels,
    note:
      panels.length === 0 ? 'Omitted: no forecast_nmse rows with numeric horizons.' : limited.note,
  };
}
