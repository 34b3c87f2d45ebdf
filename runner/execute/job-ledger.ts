/**
 * What the runner needs from a results store, as an interface so the execute stage does
 * not import the store stage (stages flow one way; the CLI wires store → execute).
 * `runner/store/run-ledger.ts` implements it on a results directory; tests may use it
 * directly. Every method may throw a store error (`store-unwritable`), which stops the sweep.
 */
import type { MetricRow } from '../evaluation/metric.ts';
import type { JobSpec } from '../plan/job-spec.ts';

/** Final status of a job attempt that the store keeps. */
export type FinishedStatus = 'done' | 'failed' | 'diverged';

/** Where and how a job ran; mirrors `Provenance` in runner/store/result.ts field for field. */
export interface JobProvenance {
  midpathVersion: string;
  gitCommit: string | null;
  nodeVersion: string;
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

/** A job the runner has finished with: what the store turns into result.json. */
export interface FinishedJob {
  spec: JobSpec;
  status: FinishedStatus;
  metrics: MetricRow[];
  info: Record<string, unknown>;
  provenance: JobProvenance;
  error?: { reason: string; logTail: string; attempts: number };
}

/** A stored result as seen at one moment: its status and a stamp that changes on rewrite. */
export interface StoredMark {
  status: FinishedStatus;
  /** Changes whenever the file is rewritten (modification time and size). */
  stamp: string;
}

/** The directories one attempt of a job writes into. */
export interface AttemptPaths {
  /** Emptied before the attempt. */
  artifactsDir: string;
  /** Truncated before the attempt. */
  logPath: string;
}

export interface JobLedger {
  /** The stored result of `id`, or null when there is none (or it cannot be read). */
  stored(id: string): StoredMark | null;
  /** Takes the job's lock; false when another live runner holds it. */
  claim(id: string): boolean;
  /** Gives the job's lock back (no-op when not held). */
  release(id: string): void;
  /** Prepares a fresh attempt of `id` and returns where it writes. */
  prepare(id: string): AttemptPaths;
  /** Artifact directory of a job (the train job an evaluation reuses). */
  artifactsDirOf(id: string): string;
  /** Writes the result (atomically) and indexes it. */
  record(job: FinishedJob): Promise<void>;
  /** Refreshes the locks this runner holds so others see they are alive. */
  heartbeat(): void;
}
