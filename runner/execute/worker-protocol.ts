/**
 * Messages between the runner and a worker process (Node IPC, JSON serialisation).
 * A worker runs one job attempt at a time. It may run several attempts one after another
 * (run.jobsPerWorker), but any attempt that does not end cleanly retires its process, so a
 * crash, a hang or a heap blow-up takes down that attempt only; the peak memory reported
 * for an attempt is measured from its own start (see worker-main.ts).
 */
import type { JobOutcome } from './job-handler.ts';
import type { JobSpec } from '../plan/job-spec.ts';

/** Runner → worker: the job to run. */
export interface RunRequest {
  type: 'run';
  spec: JobSpec;
  artifactsDir: string;
  /** Artifact directories of the jobs this one depends on, by id. */
  dependencies: Record<string, string>;
  threads: number;
  /**
   * Printed by the worker on stdout and on stderr once the job's outcome is sent: the
   * runner's cut between this job's log and whatever the process prints afterwards.
   */
  endMarker: string;
}

/** Runner → worker: stop now (time limit or second Ctrl-C); the handler's signal aborts. */
export interface AbortRequest {
  type: 'abort';
  reason: string;
}

export type ToWorker = RunRequest | AbortRequest;

/** Worker → runner. */
export type FromWorker =
  | { type: 'log'; line: string }
  | {
      type: 'outcome';
      outcome: JobOutcome;
      peakRssBytes: number;
      /** False when the process should not run another job (its heap stayed large). */
      reusable: boolean;
    }
  | {
      type: 'threw';
      message: string;
      stack: string;
      peakRssBytes: number;
      /** The error's errno name (ENOSPC, EACCES …) when it has one. */
      code?: string;
    };

/**
 * Environment variable naming a module whose `handlerFor(kind)` replaces the built-in
 * handlers inside workers. TEST-ONLY: used by the fault-injection tests to run handlers that
 * throw, exit, hang or allocate without training anything (documented in docs/runner.md).
 */
export const HANDLERS_MODULE_ENV = 'MIDPATH_HANDLERS_MODULE';

/** Environment variable telling a worker (and any native code it loads) its thread budget. */
export const THREADS_ENV = 'MIDPATH_THREADS';
