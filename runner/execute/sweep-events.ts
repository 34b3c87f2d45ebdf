/**
 * Events the runner emits while a sweep runs; progress printers, logs and tests listen.
 * Tagged by `type` so a listener's switch is checked for exhaustiveness.
 */
import type { JobSpec } from '../plan/job-spec.ts';
import type { FinishedStatus } from './job-ledger.ts';

export type SweepEvent =
  /** After the resume scan: `stored` jobs already have a kept result. */
  | { type: 'planned'; total: number; stored: number; workers: number; threads: number }
  | { type: 'started'; spec: JobSpec; attempt: number }
  | {
      type: 'finished';
      spec: JobSpec;
      status: FinishedStatus;
      wallSeconds: number;
      reason?: string;
      /** True when another runner on the same directory produced this result. */
      elsewhere: boolean;
    }
  | { type: 'retrying'; spec: JobSpec; attempt: number; reason: string }
  /** Another live runner holds this job's lock; this one waits for its result. */
  | { type: 'waiting'; spec: JobSpec }
  | { type: 'draining'; running: number }
  | { type: 'killing'; running: number };

/** How a sweep ended. */
export interface SweepSummary {
  total: number;
  /** Jobs whose kept result was found by the resume scan. */
  stored: number;
  done: number;
  failed: number;
  diverged: number;
  /** Jobs not finished because the sweep was interrupted. */
  unfinished: number;
  interrupted: boolean;
}
