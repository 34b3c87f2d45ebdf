/**
 * Messages between the runner and a worker process (Node IPC, structured-clone JSON).
 * One worker process runs exactly one job attempt, so a crash, a leak or a heap blow-up
 * takes down that attempt only, and its peak memory is its own.
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
  | { type: 'outcome'; outcome: JobOutcome; peakRssBytes: number }
  | { type: 'threw'; message: string; stack: string; peakRssBytes: number };

/**
 * Environment variable naming a module whose `handlerFor(kind)` replaces the built-in
 * handlers inside workers. TEST-ONLY: used by the fault-injection tests to run handlers that
 * throw, exit, hang or allocate without training anything (documented in docs/runner.md).
 */
export const HANDLERS_MODULE_ENV = 'MIDPATH_HANDLERS_MODULE';

/** Environment variable telling a worker (and any native code it loads) its thread budget. */
export const THREADS_ENV = 'MIDPATH_THREADS';
