/**
 * Reads a results directory once for every output: the store's reader, then the shared
 * aggregation. Fails only when there is nothing at all to show.
 */
import { readRun, type RunContents } from '../store/read-run.ts';
import type { JobResult, PlanFile } from '../store/result.ts';
import {
  aggregateMetrics,
  methodOrderOf,
  settingColumnsOf,
  type MetricSummary,
} from './aggregate.ts';
import { ReportError } from './report-error.ts';

/** A run as the report stage sees it. */
export interface LoadedRun extends RunContents {
  dir: string;
  settingColumns: string[];
  /** Method labels in plan order. */
  methods: string[];
  summaries: MetricSummary[];
}

/** Method labels in the order the plan lists its jobs (then any others, first seen). */
export function planMethodOrder(plan: PlanFile | null, results: readonly JobResult[]): string[] {
  const fromPlan = (plan?.jobs ?? []).map((job) => job.method.label);
  return [...new Set([...fromPlan, ...methodOrderOf(results)])];
}

/** Reads and aggregates `dir`; throws `no-results` when it holds no job result at all. */
export async function loadRun(dir: string): Promise<LoadedRun> {
  const contents = await readRun(dir);
  if (contents.results.length === 0) {
    const problem = contents.problems[0];
    throw new ReportError({
      code: 'no-results',
      path: dir,
      message: `expected a results directory with jobs/<id>/result.json files, got none${problem ? ` (${problem.message})` : ''}`,
      hint: 'give the --out directory of `midpath run`, and let at least one job finish',
    });
  }
  const methods = planMethodOrder(contents.plan, contents.results);
  return {
    ...contents,
    dir,
    settingColumns: settingColumnsOf(contents.results),
    methods,
    summaries: aggregateMetrics(contents.results, methods),
  };
}
