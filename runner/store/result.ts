/**
 * CONTRACT — what a results directory holds; written by execute/store, read by report/.
 *
 *   results/<experiment>/
 *     plan.json              { experiment, createdAt, config (resolved), jobs: JobSpec[] }
 *     jobs/<id>/result.json  JobResult (written atomically: temp file, fsync, rename)
 *     jobs/<id>/artifacts/   files written by the job (encoder weights, curves, projections)
 *     jobs/<id>/log.txt      the job's log
 *     index.sqlite           rebuildable index of runs, jobs and tidy metrics
 *     report.html            the report
 */
import type { MetricRow } from '../evaluation/metric.ts';
import type { JobSpec } from '../plan/job-spec.ts';

export type JobStatus = 'done' | 'failed' | 'diverged';

export interface Provenance {
  midpathVersion: string;
  gitCommit: string | null;
  nodeVersion: string;
  /** Compute backend / engine and kernel, e.g. "tfjs-wasm (1 thread)" or "native avx512". */
  backend: string;
  seed: number;
  startedAt: string;
  wallSeconds: number;
  peakRssBytes: number;
  hostname: string;
  /**
   * The worker process that ran the job, and the job's place among the jobs that process
   * ran (1: a fresh process). Absent for jobs that never ran in a worker.
   */
  worker?: { pid: number; job: number };
}

export interface JobResult {
  id: string;
  kind: JobSpec['kind'];
  status: JobStatus;
  spec: JobSpec;
  metrics: MetricRow[];
  /** Free-form job information (training curves summary, notes, engine details). */
  info: Record<string, unknown>;
  /** Paths relative to the job directory. */
  artifacts: string[];
  provenance: Provenance;
  /** For failed/diverged: the reason, and the tail of the log. */
  error?: { reason: string; logTail: string; attempts: number };
}

export interface PlanFile {
  experiment: string;
  createdAt: string;
  config: unknown;
  jobs: JobSpec[];
}
