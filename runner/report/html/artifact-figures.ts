/**
 * Figures drawn from job artifacts, summarised over seeds with the same t-interval as the
 * tables: bridge error against waypoint index, training curves, 2-D projections.
 */
import type { LoadedRun } from '../load-run.ts';
import {
  readBridgeProfiles,
  readCurves,
  readProjection,
  type BridgeProfile,
} from '../artifacts.ts';
import { renderLineChart, type ChartSeries } from '../svg/line-chart.ts';
import { renderScatter } from '../svg/scatter-chart.ts';
import {
  groupBySetting,
  limit,
  settingLabel,
  SOURCE_PREFERENCE,
  summarisedPoint,
  unitSuffix,
  type FigureGroup,
} from './figure-helpers.ts';

/** The profile a job contributes: preferred source, then steps over jumps, then the largest T. */
function longestProfile(profiles: readonly BridgeProfile[]): BridgeProfile | null {
  const source =
    SOURCE_PREFERENCE.find((s) => profiles.some((p) => p.source === s)) ?? profiles[0]?.source;
  const units = new Set(profiles.filter((p) => p.source === source).map((p) => p.unit));
  const unit = ['step', '', 'jump'].find((u) => units.has(u)) ?? [...units][0];
  const mine = profiles.filter((p) => p.source === source && p.unit === unit);
  return mine.reduce<BridgeProfile | null>((a, p) => (a === null || p.T > a.T ? p : a), null);
}

function waypointSeries(
  methods: readonly string[],
  byMethod: Map<string, number[][]>,
  T: number,
): ChartSeries[] {
  const series: ChartSeries[] = [];
  for (const method of methods) {
    const lists = (byMethod.get(method) ?? []).filter((l) => l.length === T);
    if (lists.length === 0) continue;
    const points = Array.from({ length: T }, (_, k) =>
      summarisedPoint(
        k + 1,
        lists.map((l) => l[k] ?? Number.NaN),
      ),
    );
    series.push({ name: method, points });
  }
  return series;
}

/** Bridge error against waypoint index, largest waypoint count, from bridge.json profiles. */
export async function figureByWaypoint(run: LoadedRun): Promise<FigureGroup> {
  const title = 'Bridge error against waypoint index';
  const done = run.results.filter((r) => r.kind === 'evaluate' && r.status === 'done');
  const panels: string[] = [];
  let missing = 0;
  for (const [key, jobs] of groupBySetting(done, run.settingColumns)) {
    const byMethod = new Map<string, number[][]>();
    let chosen: BridgeProfile | null = null;
    const profilesOf = await Promise.all(jobs.map((j) => readBridgeProfiles(run.dir, j)));
    profilesOf.forEach((profiles, i) => {
      const profile = profiles === null ? null : longestProfile(profiles);
      if (profile === null) return void missing++;
      if (chosen === null || profile.T > chosen.T) chosen = profile;
      const method = jobs[i]?.spec.method.label ?? '';
      byMethod.set(method, [...(byMethod.get(method) ?? []), profile.nmse]);
    });
    const top = chosen as BridgeProfile | null;
    if (top === null) continue;
    const series = waypointSeries(run.methods, byMethod, top.T);
    const label = settingLabel(JSON.parse(key) as Record<string, string>, run.settingColumns);
    if (series.length > 0) {
      panels.push(
        renderLineChart({
          title: `${label}, T = ${top.T}${unitSuffix(top.unit)}`,
          xLabel: 'waypoint index',
          yLabel: `bridge NMSE${top.source ? ` (${top.source})` : ''}`,
          xScale: 'points',
          series,
        }),
      );
    }
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
          title: method,
          subtitle: `${label}, seed ${job.spec.seed}`,
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
