/**
 * The assumption diagnostics: per setting, one table with a row per metric (its threshold
 * in words) and a column per method, each cell the mean ± interval over seeds and its plain
 * reading. Metrics with no level ('all') only; levelled ones go to wide tables.
 */
import type { MetricSummary } from '../aggregate.ts';
import type { BestMark } from '../best-marks.ts';
import { cellOf, type WideCell } from './wide-table-model.ts';
import { readDiagnostic } from './diagnostic-rules.ts';

export interface AssumptionTable {
  setting: string;
  methods: string[];
  rows: { metric: string; source: string; threshold: string; cells: WideCell[] }[];
}

/** Builds one table per setting from the `assumptions` suite's summaries. */
export function buildAssumptionTables(
  summaries: readonly MetricSummary[],
  marks: ReadonlyMap<string, BestMark>,
  methods: readonly string[],
): AssumptionTable[] {
  const rows = summaries.filter((s) => s.suite === 'assumptions');
  const bySetting = new Map<string, MetricSummary[]>();
  for (const row of rows) {
    const key = JSON.stringify(row.setting);
    bySetting.set(key, [...(bySetting.get(key) ?? []), row]);
  }
  return [...bySetting.entries()].map(([key, list]) => {
    const setting = JSON.parse(key) as Record<string, string>;
    const present = methods.filter((m) => list.some((r) => r.method === m));
    const metricKeys = [...new Set(list.map((r) => JSON.stringify([r.metric, r.source, r.level])))];
    return {
      setting:
        Object.entries(setting)
          .map(([k, v]) => `${k} = ${v}`)
          .join(', ') || 'all jobs',
      methods: present,
      rows: metricKeys.map((mk) => {
        const [metric = '', source = '', level = ''] = JSON.parse(mk) as [
          string,
          string,
          string | number,
        ];
        const at = (m: string): MetricSummary | undefined =>
          list.find(
            (r) =>
              r.method === m && r.metric === metric && r.source === source && r.level === level,
          );
        return {
          metric: level === 'all' ? metric : `${metric} @ ${level}`,
          source,
          threshold: readDiagnostic(metric, 0)?.threshold ?? 'no rule: shown for reference',
          cells: present.map((m) => cellOf(at(m), marks, false)),
        };
      }),
    };
  });
}
