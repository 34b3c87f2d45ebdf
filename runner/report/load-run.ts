/**
 * Reads a results directory once for every output: the store's reader, then the shared
 * aggregation over the results of the jobs the current plan lists. Fails only when there
 * is nothing at all to show.
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

/** A run as the report stage sees it: `results` holds the current plan's jobs only. */
export interface LoadedRun extends RunContents {
  dir: string;
  /**
   * Results in the directory of jobs the current plan.json does not list: they ran under an
   * earlier version of the experiment (another `train.steps`, an edited data file …), so
   * they are left out of every table, figure and comparison instead of mixing with the
   * current settings' seeds.
   */
  earlierResults: number;
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
  const all = await readRun(dir);
  const planned = all.plan ? new Set(all.plan.jobs.map((job) => job.id)) : null;
  const results = planned ? all.results.filter((r) => planned.has(r.id)) : all.results;
  const contents = { ...all, results };
  const earlierResults = all.results.length - results.length;
  if (contents.results.length === 0) {
    const problem = contents.problems[0];
    throw new ReportError({
      code: 'no-results',
      path: dir,
      message:
        earlierResults > 0
          ? `expected results of the jobs plan.json lists, got none (${earlierResults} result(s) of jobs from an earlier plan are left out)`
          : `expected a results directory with jobs/<id>/result.json files, got none${problem ? ` (${problem.message})` : ''}`,
      hint: 'give the --out directory of `midpath run`, and let at least one job finish',
    });
  }
  const methods = planMethodOrder(contents.plan, contents.results);
  return {
    ...contents,
    dir,
    earlierResults,
    settingColumns: settingColumnsOf(contents.results),
    methods,
    summaries: aggregateMetrics(contents.results, methods),
  };
}

/** The line saying how many results of an earlier plan were left out, or null when none. */
export function earlierResultsNote(run: LoadedRun): string | null {
  if (run.earlierResults === 0) return null;
  const n = run.earlierResults;
  return `${run.dir}: ${n} result${n === 1 ? '' : 's'} of jobs that plan.json no longer lists (an earlier version of the experiment) ${n === 1 ? 'is' : 'are'} left out; they stay on disk`;
}
