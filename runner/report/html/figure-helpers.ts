/** Shared pieces of the report's figure builders. */
import { summarise } from '../../numeric/stats/index.ts';
import type { JobResult } from '../../store/result.ts';
import { CI_LEVEL, compareSettings, formatSettingValue, type MetricSummary } from '../aggregate.ts';
import type { ChartPoint } from '../svg/line-chart.ts';

export interface FigureGroup {
  title: string;
  caption: string;
  /** Rendered <svg> strings (our own output; user strings inside are escaped). */
  panels: string[];
  /** Why the group is empty or shortened; '' when nothing to say. */
  note: string;
}

/** The unit to plot: environment steps when the rows have them, else whatever they have. */
export function preferredUnit(rows: readonly MetricSummary[]): string {
  const units = new Set(rows.map((r) => r.unit));
  return ['step', '', 'jump'].find((u) => units.has(u)) ?? [...units].sort()[0] ?? '';
}

/** " (jumps)" for levels counted in geometric jumps, else nothing. */
export function unitSuffix(unit: string): string {
  return unit === 'jump' ? ' (jumps)' : '';
}

/** Most panels per figure group, so a large sweep still gives a readable page. */
export const MAX_PANELS = 12;
export const SOURCE_PREFERENCE = ['fitted', 'critic', ''];

/** "dim = 8, data = rover-maze"; columns a job does not set (a method without dim) are left out. */
export function settingLabel(setting: Record<string, string>, columns: readonly string[]): string {
  return (
    columns
      .filter((c) => (setting[c] ?? '') !== '')
      .map((c) => `${c} = ${setting[c] ?? ''}`)
      .join(', ') || 'all jobs'
  );
}

export function preferredSource(rows: readonly MetricSummary[]): string | null {
  const sources = new Set(rows.map((r) => r.source));
  return SOURCE_PREFERENCE.find((s) => sources.has(s)) ?? [...sources].sort()[0] ?? null;
}

export function pointOf(x: number, s: { mean: number; ciLow: number; ciHigh: number }): ChartPoint {
  return { x, y: s.mean, lo: s.ciLow, hi: s.ciHigh };
}

export function limit(panels: string[], what: string): { panels: string[]; note: string } {
  if (panels.length <= MAX_PANELS) return { panels, note: '' };
  return {
    panels: panels.slice(0, MAX_PANELS),
    note: `The first ${MAX_PANELS} of ${panels.length} ${what} are shown.`,
  };
}

export function summarisedPoint(x: number, values: number[]): ChartPoint {
  const s = summarise(values, CI_LEVEL);
  return { x, y: s.mean, lo: s.ciLow, hi: s.ciHigh };
}

export function groupBySetting(
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
