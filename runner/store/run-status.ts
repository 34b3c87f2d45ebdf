/**
 * Where a results directory stands: counts by state, every failure's reason, and an
 * estimate of the time to finish from the measured cost of finished jobs of each kind.
 * Read-only; safe while a runner writes.
 */
import type { JobKind } from '../plan/job-spec.ts';
import { readLiveOwner } from './job-lock.ts';
import { lockPathOf } from './job-paths.ts';
import { readRun } from './read-run.ts';
import type { JobResult, JobStatus } from './result.ts';
import type { StoreProblem } from './store-error.ts';

export type JobState = JobStatus | 'running' | 'pending';

export interface FailureLine {
  id: string;
  kind: JobKind;
  status: 'failed' | 'diverged';
  reason: string;
}

export interface KindCost {
  /** Mean wall time of finished (done or diverged) jobs of this kind; null before any. */
  meanSeconds: number | null;
  /** Jobs of this kind still to do (running or pending). */
  remaining: number;
}

export interface RunStatus {
  experiment: string | null;
  total: number;
  counts: Record<JobState, number>;
  failures: FailureLine[];
  costs: Partial<Record<JobKind, KindCost>>;
  /** Seconds to finish: remaining work ÷ jobs running now (1 when none); null when unmeasured. */
  etaSeconds: number | null;
  problems: StoreProblem[];
  /** Results of jobs plan.json does not list (an earlier version of the experiment); not counted. */
  earlierResults: number;
}

/** What a scheduler says about a job without a kept result (see execute/slurm/scheduler-view.ts). */
export interface ExternalView {
  phase: 'queued' | 'running' | 'ended';
  /** The scheduler's word for how it ended, e.g. "SLURM task 12_3 ended TIMEOUT". */
  reason: string;
}

function stateOf(
  dir: string,
  id: string,
  result: JobResult | undefined,
  external: ExternalView | undefined,
): JobState {
  if (result && result.status !== 'failed') return result.status;
  // A failed job is rerun by the next `run`; while a runner holds its lock it is running.
  if (readLiveOwner(lockPathOf(dir, id)) || external?.phase === 'running') return 'running';
  if (external?.phase === 'queued') return 'pending'; // resubmitted: a task will run it again
  if (result) return 'failed';
  return external?.phase === 'ended' ? 'failed' : 'pending';
}

function estimate(costs: Partial<Record<JobKind, KindCost>>, running: number): number | null {
  let work = 0;
  for (const cost of Object.values(costs)) {
    if (cost.remaining === 0) continue;
    if (cost.meanSeconds === null) return null;
    work += cost.remaining * cost.meanSeconds;
  }
  return work / Math.max(1, running);
}

/**
 * Summarises the results directory `dir` (plan jobs; all results when there is no plan).
 * `external` adds a scheduler's view of jobs that have no kept result.
 */
export async function readRunStatus(
  dir: string,
  external: ReadonlyMap<string, ExternalView> = new Map(),
): Promise<RunStatus> {
  const { plan, results, problems } = await readRun(dir);
  const byId = new Map(results.map((r) => [r.id, r]));
  const planned = new Set(plan?.jobs.map((j) => j.id) ?? []);
  const jobs = plan
    ? plan.jobs.map((j) => ({ id: j.id, kind: j.kind }))
    : results.map((r) => ({ id: r.id, kind: r.kind }));
  const counts: Record<JobState, number> = {
    done: 0,
    running: 0,
    failed: 0,
    diverged: 0,
    pending: 0,
  };
  const failures: FailureLine[] = [];
  const spent = new Map<JobKind, { seconds: number; count: number; remaining: number }>();
  for (const job of jobs) {
    const result = byId.get(job.id);
    const seen = external.get(job.id);
    const state = stateOf(dir, job.id, result, seen);
    counts[state] += 1;
    const cost = spent.get(job.kind) ?? { seconds: 0, count: 0, remaining: 0 };
    if (state === 'running' || state === 'pending') cost.remaining += 1;
    if (result && (state === 'done' || state === 'diverged')) {
      cost.seconds += result.provenance.wallSeconds;
      cost.count += 1;
    }
    spent.set(job.kind, cost);
    if (state === 'failed' || state === 'diverged') {
      // The result file is the proof; without one, the scheduler's final state is the reason.
      failures.push({
        id: job.id,
        kind: job.kind,
        status: state,
        reason: result
          ? (result.error?.reason ?? '(no reason recorded)')
          : (seen?.reason ?? '(no result)'),
      });
    }
  }
  const costs: Partial<Record<JobKind, KindCost>> = {};
  for (const [kind, c] of spent)
    costs[kind] = { meanSeconds: c.count > 0 ? c.seconds / c.count : null, remaining: c.remaining };
  return {
    experiment: plan?.experiment ?? null,
    total: jobs.length,
    counts,
    failures,
    costs,
    etaSeconds: estimate(costs, counts.running),
    problems,
    earlierResults: plan ? results.filter((r) => !planned.has(r.id)).length : 0,
  };
}
