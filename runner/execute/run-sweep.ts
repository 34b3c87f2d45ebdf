/**
 * The local engine: runs a plan's jobs in worker processes under a p-queue of `workers`
 * slots. Train jobs go first; an evaluation is queued (ahead of waiting train jobs) as soon
 * as its train job has a result. A job with a kept result is skipped (resume); a job whose
 * lock another live runner holds is waited for, not run twice.
 */
import { availableParallelism, totalmem } from 'node:os';
import PQueue from 'p-queue';
import type { JobSpec } from '../plan/job-spec.ts';
import { readBuildFacts } from './build-facts.ts';
import type { FinishedStatus, JobLedger, StoredMark } from './job-ledger.ts';
import type { JobRunSettings } from './run-job.ts';
import { recordBlocked, runJob } from './run-job.ts';
import { SweepControl } from './sweep-control.ts';
import { WorkerPool } from './worker-pool.ts';
import type { SweepEvent, SweepSummary } from './sweep-events.ts';

export interface SweepOptions {
  ledger: JobLedger;
  /** Worker processes at once. (default: the number of cores) */
  workers?: number;
  /** Cores shared among workers for their thread budgets. (default: availableParallelism()) */
  cores?: number;
  /** Rerun every job, ignoring kept results. */
  fresh: boolean;
  /** Retries of a crashed job. */
  retries: number;
  /** Time limit per job kind, in milliseconds. */
  timeLimitMs: (kind: JobSpec['kind']) => number;
  /** Jobs one worker process runs before it is replaced; 1: a fresh process per attempt. (default 20) */
  jobsPerWorker?: number;
  /** Heap limit per worker. (default: 70% of memory shared among workers, at least 256 MB) */
  heapLimitMb?: number;
  /** Between asking a timed-out worker to stop and killing it. (default 5000) */
  killGraceMs?: number;
  /** How often to look again at a job another runner holds. (default 1000) */
  pollMs?: number;
  /** How often held locks are refreshed. (default 30000) */
  heartbeatMs?: number;
  /** Extra environment for workers. */
  env?: NodeJS.ProcessEnv;
  control?: SweepControl;
  onEvent?: (event: SweepEvent) => void;
}

type Final = FinishedStatus | 'interrupted';

function defaultHeapMb(workers: number): number {
  return Math.max(256, Math.floor((0.7 * totalmem()) / 2 ** 20 / workers));
}

function sleep(ms: number, control: SweepControl): Promise<void> {
  return new Promise((wake) => {
    const timer = setTimeout(done, ms);
    const stop = control.onDrain(done);
    function done(): void {
      clearTimeout(timer);
      stop();
      wake();
    }
  });
}

/**
 * Runs `jobs` to kept results (or until drained/killed) and resolves to a summary.
 * Longer than the usual 60 lines: the nested helpers share the sweep's queue, snapshot and
 * memo of job promises, which reads more plainly as closures than as a class.
 */
export async function runSweep(jobs: JobSpec[], options: SweepOptions): Promise<SweepSummary> {
  const cores = options.cores ?? availableParallelism();
  const workers = Math.max(1, options.workers ?? cores);
  const threads = Math.max(1, Math.floor(cores / workers));
  const control = options.control ?? new SweepControl();
  const emit = options.onEvent ?? (() => undefined);
  const { ledger, fresh } = options;
  const pool = new WorkerPool({ jobsPerWorker: Math.max(1, options.jobsPerWorker ?? 20) });
  const settings: JobRunSettings = {
    ledger,
    pool,
    control,
    facts: readBuildFacts(),
    threads,
    heapLimitMb: options.heapLimitMb ?? defaultHeapMb(workers),
    killGraceMs: options.killGraceMs ?? 5000,
    timeLimitMs: options.timeLimitMs,
    retries: options.retries,
    env: options.env ?? {},
    emit,
  };
  const initial = new Map<string, StoredMark | null>(
    jobs.map((job) => [job.id, ledger.stored(job.id)]),
  );
  const kept = (mark: StoredMark | null | undefined): mark is StoredMark =>
    mark != null && !fresh && mark.status !== 'failed';
  const stored = jobs.filter((job) => kept(initial.get(job.id))).length;
  emit({ type: 'planned', total: jobs.length, stored, workers, threads });

  const planned = new Set(jobs.map((job) => job.id));
  const queue = new PQueue({ concurrency: workers });
  const finals = new Map<string, Promise<Final>>();
  let fatal: Error | undefined;

  async function claimAndRun(spec: JobSpec, work: () => Promise<Final>): Promise<Final> {
    for (let announced = false; ; announced = true) {
      if (control.draining) return 'interrupted';
      const outcome = await queue.add(
        async (): Promise<Final | 'busy'> => {
          if (control.draining) return 'interrupted';
          if (!ledger.claim(spec.id)) return 'busy';
          try {
            const now = ledger.stored(spec.id);
            if (now && now.stamp !== initial.get(spec.id)?.stamp) {
              // Another runner finished it while this one waited: take its result, run nothing.
              emit({ type: 'finished', spec, status: now.status, wallSeconds: 0, elsewhere: true });
              return now.status;
            }
            return await work();
          } finally {
            ledger.release(spec.id);
          }
        },
        { priority: spec.kind === 'evaluate' ? 1 : 0 },
      );
      if (outcome !== 'busy') return outcome;
      if (!announced) emit({ type: 'waiting', spec });
      await sleep(options.pollMs ?? 1000, control);
    }
  }

  async function settleJob(spec: JobSpec): Promise<Final> {
    const mark = initial.get(spec.id);
    if (kept(mark)) return mark.status;
    if (spec.kind === 'evaluate') {
      // A train job outside this sweep (a cluster task running evaluations only) is never
      // run here: its kept result decides.
      const train = planned.has(spec.trainId)
        ? await settle(spec.train)
        : (ledger.stored(spec.trainId)?.status ?? 'missing');
      if (train === 'interrupted') return 'interrupted';
      if (train !== 'done')
        return claimAndRun(spec, () => recordBlocked(spec, spec.trainId, train, settings));
    }
    return claimAndRun(spec, () => runJob(spec, settings));
  }

  function settle(spec: JobSpec): Promise<Final> {
    let final = finals.get(spec.id);
    if (!final) {
      if (!initial.has(spec.id)) initial.set(spec.id, ledger.stored(spec.id));
      final = settleJob(spec).catch((error: unknown) => {
        // A store error (unwritable, disk full) or a SweepStop (a job found the disk full)
        // stops the sweep; it is rethrown at the end.
        fatal ??= error instanceof Error ? error : new Error(String(error));
        control.drain();
        return 'interrupted' as const;
      });
      finals.set(spec.id, final);
    }
    return final;
  }

  const heartbeat = setInterval(() => ledger.heartbeat(), options.heartbeatMs ?? 30_000);
  heartbeat.unref();
  const ordered = [
    ...jobs.filter((j) => j.kind === 'train'),
    ...jobs.filter((j) => j.kind !== 'train'),
  ];
  let results: Final[];
  try {
    results = await Promise.all(ordered.map((job) => settle(job)));
  } finally {
    clearInterval(heartbeat);
    pool.close();
  }
  if (fatal !== undefined) throw fatal;
  return summarise(ordered, results, initial, kept, stored, control);
}

function summarise(
  jobs: JobSpec[],
  results: Final[],
  initial: Map<string, StoredMark | null>,
  kept: (mark: StoredMark | null | undefined) => boolean,
  stored: number,
  control: SweepControl,
): SweepSummary {
  const summary: SweepSummary = {
    total: jobs.length,
    stored,
    done: 0,
    failed: 0,
    diverged: 0,
    unfinished: 0,
    interrupted: control.draining,
  };
  results.forEach((final, i) => {
    const job = jobs[i];
    if (job && kept(initial.get(job.id))) return;
    if (final === 'interrupted') summary.unfinished += 1;
    else summary[final] += 1;
  });
  return summary;
}
