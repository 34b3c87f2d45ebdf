/**
 * The report's figures, drawn at report time by our own SVG code: error against
 * representation dimension, against horizon, against waypoint index; training curves; 2-D
 * projections. Points and intervals of the first two come straight from the shared
 * aggregation (the tables' numbers); the others summarise artifacts over seeds with the same
 * t-interval. A figure whose inputs are missing is left out with a note saying why.
 */
import { summarise } from '../../numeric/stats/index.ts';
import type { JobResult } from '../../store/result.ts';
import { CI_LEVEL, compareSettings, formatSettingValue, type MetricSummary } from '../aggregate.ts';
import { readBridgeProfiles, readCurves, readProjection } from '../artifacts.ts';
import type { LoadedRun } from '../load-run.ts';
import { renderLineChart, type ChartPoint, type ChartSeries } from '../svg/line-chart.ts';
import { renderScatter } from '../svg/scatter-chart.ts';

export interface FigureGroup {
  title: string;
  caption: string;
  /** Rendered <svg> strings (our own output; user strings inside are escaped). */
  panels: string[];
  /** Why the group is empty or shortened; '' when nothing to say. */
  note: string;
}

/** Most panels per figure group, so a large sweep still gives a readable page. */
export const MAX_PANELS = 12;
const SOURCE_PREFERENCE = ['fitted', 'critic', ''];

function settingLabel(setting: Record<string, string>, columns: readonly string[]): string {
  return columns.map((c) => `${c} = ${setting[c] ?? ''}`).join(', ') || 'all jobs';
}

function preferredSource(rows: readonly MetricSummary[]): string | null {
  const sources = new Set(rows.map((r) => r.source));
  return SOURCE_PREFERENCE.find((s) => sources.has(s)) ?? [...sources].sort()[0] ?? null;
}

function pointOf(x: number, s: { mean: number; ciLow: number; ciHigh: number }): ChartPoint {
  return { x, y: s.mean, lo: s.ciLow, hi: s.ciHigh };
}

function limit(panels: string[], what: string): { panels: string[]; note: string } {
  if (panels.length <= MAX_PANELS) return { panels, note: '' };
  return {
    panels: panels.slice(0, MAX_PANELS),
    note: `The first ${MAX_PANELS} of ${panels.length} ${what} are shown.`,
  };
}

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

function summarisedPoint(x: number, values: number[]): ChartPoint {
  const s = summarise(values, CI_LEVEL);
  return { x, y: s.mean, lo: s.ciLow, hi: s.ciHigh };
}

function groupBySetting(
  results: readonly JobResult[],
  columns: readonly string[],
): Map<string, JobResult[]> {
  const groups = new Map<string, JobResult[]>();
  for (const r of results) {
    const setting: Record<string, string> = {};
    for (const c of columns) setting[c] = formatSettingValue(r.spec.setting[c]);
    const key = JSON.stringify(setting);
    groups.set(key, [...(groups.get(key) ?? []), r]);
  }
  const parse = (key: string): Record<string, string> => JSON.parse(key) as Record<string, string>;
  return new Map(
    [...groups.entries()].sort(([a], [b]) => compareSettings(parse(a), parse(b), columns)),
  );
}

/** Bridge error against waypoint index, largest waypoint count, from bridge.json profiles. */
export async function figureByWaypoint(run: LoadedRun): Promise<FigureGroup> {
  const title = 'Bridge error against waypoint index';
  const done = run.results.filter((r) => r.kind === 'evaluate' && r.status === 'done');
  const panels: string[] = [];
  let missing = 0;
  for (const [key, jobs] of groupBySetting(done, run.settingColumns)) {
    const byMethod = new Map<string, number[][]>();
    let T = 0;
    const profilesOf = await Promise.all(jobs.map((j) => readBridgeProfiles(run.dir, j)));
    profilesOf.forEach((profiles, i) => {
      if (profiles === null) return void missing++;
      const source =
        SOURCE_PREFERENCE.find((s) => profiles.some((p) => p.source === s)) ?? profiles[0]?.source;
      const mine = profiles.filter((p) => p.source === source && p.unit !== 'jump');
      const longest = mine.reduce(
        (a, p) => (p.T > a.T ? p : a),
        mine[0] ?? { T: 0, nmse: [] as number[] },
      );
      T = Math.max(T, longest.T);
      const method = jobs[i]?.spec.method.label ?? '';
      byMethod.set(method, [...(byMethod.get(method) ?? []), longest.nmse]);
    });
    const series: ChartSeries[] = [];
    for (const method of run.methods) {
      const lists = (byMethod.get(method) ?? []).filter((l) => l.length === T);
      if (lists.length === 0 || T === 0) continue;
      series.push({
        name: method,
        points: Array.from({ length: T }, (_, k) =>
          summarisedPoint(
            k + 1,
            lists.map((l) => l[k] ?? Number.NaN),
          ),
        ),
      });
    }
    if (series.length > 0)
      panels.push(
        renderLineChart({
          title: `${settingLabel(JSON.parse(key) as Record<string, string>, run.settingColumns)}, T = ${T}`,
          xLabel: 'waypoint index',
          yLabel: 'bridge NMSE',
          xScale: 'points',
          series,
        }),
      );
  }
  const limited = limit(panels, 'settings');
  const note =
    panels.length === 0
      ? 'Omitted: no evaluate job left a bridge.json with per-waypoint errors.'
      : missing > 0
        ? `${missing} evaluate job(s) had no per-waypoint errors and are left out. ${limited.note}`
        : limited.note;
  return {
    title,
    caption: 'Largest waypoint count of each setting; mean over seeds with its 95 % t-interval.',
    panels: limited.panels,
    note: note.trim(),
  };
}

/** Validation loss against training step, from the train jobs' curves.json. */
export async function figureTrainingCurves(run: LoadedRun): Promise<FigureGroup> {
  const title = 'Training curves';
  const done = run.results.filter((r) => r.kind === 'train' && r.status === 'done');
  const panels: string[] = [];
  for (const [key, jobs] of groupBySetting(done, run.settingColumns)) {
    const curves = await Promise.all(jobs.map((j) => readCurves(run.dir, j)));
    const series: ChartSeries[] = [];
    for (const method of run.methods) {
      const byStep = new Map<number, number[]>();
      curves.forEach((curve, i) => {
        if (curve === null || jobs[i]?.spec.method.label !== method) return;
        for (const row of curve) {
          const v = row.values.valLoss;
          if (v !== undefined) byStep.set(row.step, [...(byStep.get(row.step) ?? []), v]);
        }
      });
      const points = [...byStep.entries()]
        .sort(([a], [b]) => a - b)
        .map(([step, values]) => summarisedPoint(step, values));
      if (points.length > 0) series.push({ name: method, points });
    }
    if (series.length > 0)
      panels.push(
        renderLineChart({
          title: settingLabel(JSON.parse(key) as Record<string, string>, run.settingColumns),
          xLabel: 'training step',
          yLabel: 'validation loss',
          xScale: 'linear',
          band: true,
          series,
        }),
      );
  }
  const limited = limit(panels, 'settings');
  return {
    title,
    caption: 'Validation InfoNCE loss, mean over seeds; the band is the 95 % t-interval.',
    panels: limited.panels,
    note:
      panels.length === 0
        ? 'Omitted: no train job left a curves.json (closed-form baselines have none).'
        : limited.note,
  };
}

/** 2-D projections: for each setting and method, the lowest seed's projections.json. */
export async function figureProjections(run: LoadedRun): Promise<FigureGroup> {
  const title = '2-D projections of test representations';
  const done = run.results
    .filter((r) => r.kind === 'evaluate' && r.status === 'done')
    .sort((a, b) => a.spec.seed - b.spec.seed);
  const seen = new Set<string>();
  const panels: string[] = [];
  let colourBy = '';
  for (const [key, jobs] of groupBySetting(done, run.settingColumns)) {
    for (const method of run.methods) {
      const job = jobs.find((j) => j.spec.method.label === method && !seen.has(`${key}|${method}`));
      if (job === undefined) continue;
      const projection = await readProjection(run.dir, job);
      if (projection === null) continue;
      seen.add(`${key}|${method}`);
      colourBy = projection.colourBy;
      const label = settingLabel(JSON.parse(key) as Record<string, string>, run.settingColumns);
      panels.push(
        renderScatter({
          title: `${method}, ${label}, seed ${job.spec.seed}`,
          points: projection.points,
          ...(projection.colour ? { colour: projection.colour } : {}),
        }),
      );
    }
  }
  const limited = limit(panels, 'projections');
  return {
    title,
    caption: panels.length > 0 ? `Shading from light to dark follows the ${colourBy}.` : '',
    panels: limited.panels,
    note: panels.length === 0 ? 'Omitted: no evaluate job left a projections.json.' : limited.note,
  };
}

/** Every figure group, in page order. */
export async function buildFigures(run: LoadedRun): Promise<FigureGroup[]> {
  return [
    figureByDimension(run),
    figureByHorizon(run),
    await figureByWaypoint(run),
    await figureTrainingCurves(run),
    await figureProjections(run),
  ];
}
