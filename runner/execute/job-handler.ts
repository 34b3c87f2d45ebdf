/**
 * CONTRACT — how the runner calls the code that does a job, inside a worker process.
 * One handler per job kind (execute/jobs/train-job.ts, execute/jobs/evaluate-job.ts).
 * A handler that throws marks the job failed (and the runner may retry it); returning
 * `diverged` records a divergence, which is never retried.
 */
import type { MetricRow } from '../evaluation/metric.ts';
import type { JobSpec } from '../plan/job-spec.ts';

export interface JobContext {
  /** This job's own artifact directory (exists, empty on a fresh attempt). */
  artifactsDir: string;
  /** Artifact directory of another (finished) job, e.g. the train job an evaluation reuses. */
  artifactsOf(jobId: string): string;
  /** Compute threads this worker may use (workers × threads ≤ cores). */
  threads: number;
  /** A line for the job's log (its tail is kept on failure). */
  log(line: string): void;
  /** Aborted when the runner is stopping this job (time limit, second Ctrl-C). */
  signal: AbortSignal;
}

export type JobOutcome =
  | { status: 'done'; metrics: MetricRow[]; info: Record<string, unknown> }
  | {
      status: 'diverged';
      metrics: MetricRow[];
      info: Record<string, unknown>;
      /** Step, last finite loss and the term that blew up. */
      reason: string;
    };

export type JobHandler<S extends JobSpec = JobSpec> = (
  spec: S,
  ctx: JobContext,
) => Promise<JobOutcome>;
