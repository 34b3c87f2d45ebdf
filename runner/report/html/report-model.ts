/**
 * Everything the handlebars templates show, computed from a loaded run. Templates only lay
 * out; all numbers come from here (and through here from the shared aggregation).
 */
import { tidyJson } from '../formats/json-format.ts';
import type { LoadedRun } from '../load-run.ts';
import { buildTidyTable, markOf } from '../tidy-table.ts';
import { formatMeanInterval, formatValue } from '../format-number.ts';
import { buildAssumptionTables, type AssumptionTable } from './assumptions-model.ts';
import { buildFigures, type FigureGroup } from './figures-model.ts';
import { buildOverview, type OverviewModel } from './overview-model.ts';
import { buildPlanningTables, type PlanningTable } from './planning-model.ts';
import { buildWideTable, tableMetricsOf, type WideTable } from './wide-table-model.ts';
import { DIRECTION_RULES } from '../metric-direction.ts';

export interface TidyRowView {
  cells: string[];
  mark: string;
  search: string;
}

export interface ReportModel {
  overview: OverviewModel;
  forecast: WideTable[];
  bridge: WideTable[];
  calibration: WideTable[];
  assumptions: AssumptionTable[];
  planning: PlanningTable[];
  planningOther: WideTable[];
  /** Suites without a section of their own (training, user plugins). */
  otherSuites: { suite: string; tables: WideTable[] }[];
  figures: FigureGroup[];
  tidyHeader: string[];
  tidyRows: TidyRowView[];
  directionRules: { pattern: string; why: string }[];
  /** Embedded as JSON in a <script type="application/json"> element. */
  data: unknown;
}

const OWN_SECTIONS = new Set([
  'forecast',
  'bridge',
  'calibration',
  'assumptions',
  'planning',
  'projections',
]);

function tidyRows(run: LoadedRun): TidyRowView[] {
  const table = buildTidyTable(run.settingColumns, run.summaries);
  return run.summaries.map((row) => {
    const cells = [
      ...run.settingColumns.map((c) => row.setting[c] ?? ''),
      row.method,
      row.suite,
      row.metric,
      row.source,
      String(row.level),
      row.unit,
      String(row.n),
      formatMeanInterval(row.mean, row.ciLow, row.ciHigh).text,
      formatValue(row.std),
    ];
    return { cells, mark: markOf(table, row), search: cells.join(' ').toLowerCase() };
  });
}

/** Builds the report model of a loaded run (reads plot artifacts). */
export async function buildReportModel(run: LoadedRun): Promise<ReportModel> {
  const table = buildTidyTable(run.settingColumns, run.summaries);
  const wide = (suite: string): WideTable[] =>
    tableMetricsOf(run.summaries, suite).map((m) =>
      buildWideTable(run.summaries, table.marks, run.settingColumns, m),
    );
  const suites = [...new Set(run.summaries.map((s) => s.suite))]
    .filter((s) => !OWN_SECTIONS.has(s))
    .sort();
  return {
    overview: buildOverview(run),
    forecast: wide('forecast'),
    bridge: wide('bridge'),
    calibration: wide('calibration'),
    assumptions: buildAssumptionTables(run.summaries, table.marks, run.methods),
    planning: buildPlanningTables(run.summaries, run.settingColumns),
    planningOther: wide('planning').filter((t) => !t.metric.startsWith('planning_success')),
    otherSuites: suites.map((suite) => ({ suite, tables: wide(suite) })),
    figures: await buildFigures(run),
    tidyHeader: [
      ...run.settingColumns,
      'method',
      'suite',
      'metric',
      'source',
      'level',
      'unit',
      'n',
      'mean ± 95 %',
      'std',
    ],
    tidyRows: tidyRows(run),
    directionRules: DIRECTION_RULES.map((r) => ({ pattern: r.pattern.source, why: r.why })),
    data: { experiment: run.plan?.experiment ?? '', ...tidyJson(table) },
  };
}
