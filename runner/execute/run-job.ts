/**
 * Runs one job to a kept result: attempts in pooled workers (worker-pool.ts), retries of
 * crashes (never of a divergence, a time-out or running out of memory, which would only
 * repeat; a full disk stops the sweep), and the result record with its provenance.
 */
import type { JobSpec } from '../plan/job-spec.ts';
import type { BuildFacts } from './build-facts.ts';
import type { JobOutcome } from './job-handler.ts';
import type { FinishedJob, FinishedStatus, JobLedger } from './job-ledger.ts';
import type { AttemptResult, CrashCause, WorkerPool } from './worker-pool.ts';
import type { SweepControl } from './sweep-control.ts';
import { SweepStop } from './sweep-stop.ts';
import type { SweepEvent } from './sweep-events.ts';

/** Settings shared by every job of a sweep. */
export interface JobRunSettings {
  ledger: JobLedger;
  pool: WorkerPool;
  control: SweepControl;
  facts: BuildFacts;
  threads: number;
  heapLimitMb: number;
  killGraceMs: number;
  /** Time limit of a job of this kind, in milliseconds. */
  timeLimitMs: (kind: JobSpec['kind']) => number;
  /** Retries after a crash (so at most retries + 1 attempts). */
  retries: number;
  env: NodeJS.ProcessEnv;
  emit: (event: SweepEvent) => void;
}

const RETRIED: ReadonlySet<CrashCause> = new Set(['threw', 'exited', 'killed']);

function provenanceOf(
  spec: JobSpec,
  settings: JobRunSettings,
  startedAt: Date,
  wallSeconds: number,
  peak: number,
  backend: string,
  worker?: { pid: number; job: number },
): FinishedJob['provenance'] {
  const { facts } = settings;
  return {
    midpathVersion: facts.midpathVersion,
    gitCommit: facts.gitCommit,
    nodeVersion: facts.nodeVersion,
    backend,
    seed: spec.seed,
    startedAt: startedAt.toISOString(),
    wallSeconds,
    peakRssBytes: peak,
    hostname: facts.hostname,
    ...(worker === undefined ? {} : { worker }),
  };
}

function backendOf(outcome: JobOutcome | undefined, threads: number): string {
  const named = outcome?.info.backend;
  // Handlers name their compute backend in info.backend; a job that names none ran plain JS.
  return typeof named === 'string' ? named : `js (${threads} thread${threads === 1 ? '' : 's'})`;
}

async function keep(
  settings: JobRunSettings,
  job: FinishedJob,
  reason?: string,
): Promise<FinishedStatus> {
  await settings.ledger.record(job);
  settings.emit({
    type: 'finished',
    spec: job.spec,
    status: job.status,
    wallSeconds: job.provenance.wallSeconds,
    ...(reason === undefined ? {} : { reason }),
    elsewhere: false,
  });
  return job.status;
}

async function attemptOnce(
  spec: JobSpec,
  settings: JobRunSettings,
  attempt: number,
): Promise<AttemptResult> {
  const paths = settings.ledger.prepare(spec.id);
  const dependencies: Record<string, string> =
    spec.kind === 'evaluate'
      ? { [spec.trainId]: settings.ledger.artifactsDirOf(spec.trainId) }
      : {};
  settings.emit({ type: 'started', spec, attempt });
  const handle = settings.pool.start({
    request: { spec, artifactsDir: paths.artifactsDir, dependencies, threads: settings.threads },
    logPath: paths.logPath,
    timeLimitMs: settings.timeLimitMs(spec.kind),
    killGraceMs: settings.killGraceMs,
    heapLimitMb: settings.heapLimitMb,
    env: settings.env,
  });
  const untrack = settings.control.track(() => handle.cancel());
  try {
    return await handle.result;
  } finally {
    untrack();
  }
}

/**
 * Runs `spec` (its lock already held) until it has a kept result; resolves to its status,
 * or 'interrupted' when the sweep was killed mid-attempt (nothing is recorded then).
 */
export async function runJob(
  spec: JobSpec,
  settings: JobRunSettings,
): Promise<FinishedStatus | 'interrupted'> {
  for (let attempt = 1; ; attempt += 1) {
    const startedAt = new Date();
    const result = await attemptOnce(spec, settings, attempt);
    switch (result.kind) {
      case 'cancelled':
        return 'interrupted';
      case 'outcome': {
        const { outcome } = result;
        const provenance = provenanceOf(
          spec,
          settings,
          startedAt,
          result.wallSeconds,
          result.peakRssBytes,
          backendOf(outcome, settings.threads),
          { pid: result.workerPid, job: result.jobsBefore + 1 },
        );
        const base = { spec, metrics: outcome.metrics, info: outcome.info, provenance };
        if (outcome.status === 'done') return keep(settings, { ...base, status: 'done' });
        const error = { reason: `diverged: ${outcome.reason}`, logTail: '', attempts: attempt };
        return keep(settings, { ...base, status: 'diverged', error }, error.reason);
      }
      case 'crash': {
        if (result.cause === 'disk-full') {
          // Every later job would fail the same way: start no other (drain now, before the
          // queue hands this slot to the next job), record nothing, and stop the sweep.
          settings.control.drain();
          throw new SweepStop(
            'disk-full',
            `job ${spec.id} ran out of disk space writing to ${settings.ledger.artifactsDirOf(spec.id)} (${result.reason.replace(/^the job threw: /, '')}). Free space or choose another directory with --out; results already written are kept, and running again resumes`,
          );
        }
        // Killed while the sweep stops (a cluster's cancel signals every process): unfinished, not failed.
        if (result.cause === 'killed' && settings.control.draining) return 'interrupted';
        const retry =
          RETRIED.has(result.cause) && attempt <= settings.retries && !settings.control.draining;
        if (retry) {
          settings.emit({ type: 'retrying', spec, attempt: attempt + 1, reason: result.reason });
          continue;
        }
        const provenance = provenanceOf(
          spec,
          settings,
          startedAt,
          result.wallSeconds,
          0,
          backendOf(undefined, settings.threads),
        );
        const error = { reason: result.reason, logTail: result.logTail, attempts: attempt };
        return keep(
          settings,
          { spec, status: 'failed', metrics: [], info: {}, provenance, error },
          result.reason,
        );
      }
    }
  }
}

/** Records an evaluation whose train job did not finish as failed, without running it. */
export function recordBlocked(
  spec: JobSpec,
  trainId: string,
  trainStatus: FinishedStatus | 'missing',
  settings: JobRunSettings,
): Promise<FinishedStatus> {
  const what = trainStatus === 'missing' ? 'has no result' : trainStatus;
  const reason = `not run: its train job ${trainId} ${what} (see that job's reason)`;
  const provenance = provenanceOf(
    spec,
    settings,
    new Date(),
    0,
    0,
    backendOf(undefined, settings.threads),
  );
  const error = { reason, logTail: '', attempts: 0 };
  return keep(
    settings,
    { spec, status: 'failed', metrics: [], info: {}, provenance, error },
    reason,
  );
}
