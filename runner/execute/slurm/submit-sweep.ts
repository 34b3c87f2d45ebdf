/**
 * The SLURM engine: turns the jobs of a plan that still need doing into job arrays (one for
 * train jobs, one for evaluations that waits for it), writes their batch scripts and the
 * submission record into the results directory, and submits them with sbatch — or, for a
 * dry run, only writes them and says how to submit by hand.
 */
import { renameSync, writeFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import type { JobKind, JobSpec } from '../../plan/job-spec.ts';
import { chunkJobs, formatSlurmTime, quoteShell, renderBatchScript } from './batch-script.ts';
import { phaseOf, readTaskStates, submitBatch } from './scheduler-states.ts';
import type { SlurmArray, SlurmSubmission } from './slurm-manifest.ts';
import {
  prepareSlurmDir,
  readSubmissions,
  slurmDirOf,
  submissionPathOf,
} from './slurm-manifest.ts';

export interface SlurmOptions {
  partition: string | undefined;
  /** Per array task, HH:MM:SS; default from run.timeout × jobs per task × attempts, + 5 min. */
  time: string | undefined;
  cpusPerTask: number;
  /** At most this many tasks of an array at once; 0 for no limit. */
  maxParallel: number;
  /** Largest array to submit (clusters cap it, MaxArraySize); bigger sweeps get chunks. (default 1000) */
  arrayLimit: number;
  sbatchArgs: string[];
  dryRun: boolean;
  /** How array tasks start Midpath (absolute paths; nodes share the file system). */
  midpath: string;
  env: NodeJS.ProcessEnv;
}

export interface SweepLimits {
  timeoutMinutes: Record<JobKind, number>;
  retries: number;
}

export interface SubmitOutcome {
  submission: SlurmSubmission | null;
  /** Jobs left alone because an earlier submission's task for them is queued or running. */
  active: number;
  /** Jobs with a kept result. */
  kept: number;
  /** For a dry run: the commands to submit by hand. */
  commands: string[];
}

/** Job ids whose task in an earlier submission is still queued or running, by array id. */
function findActiveJobs(dir: string): Map<string, string> {
  const submitted = readSubmissions(dir).flatMap((s) => s.arrays);
  const states = readTaskStates(submitted.flatMap((a) => (a.arrayJobId ? [a.arrayJobId] : [])));
  const active = new Map<string, string>();
  for (const array of submitted) {
    array.tasks.forEach((ids, task) => {
      const state = array.arrayJobId ? states.get(`${array.arrayJobId}_${task}`) : undefined;
      if (state && phaseOf(state) !== 'ended')
        for (const id of ids) active.set(id, array.arrayJobId ?? '');
    });
  }
  return active;
}

function writeRecord(path: string, submission: SlurmSubmission): void {
  writeFileSync(`${path}.tmp`, `${JSON.stringify(submission, null, 2)}\n`);
  renameSync(`${path}.tmp`, path);
}

function buildArray(
  dir: string,
  n: number,
  kind: JobKind,
  ids: string[],
  index: number,
  experiment: string,
  limits: SweepLimits,
  o: SlurmOptions,
): SlurmArray {
  const tasks = chunkJobs(ids, o.arrayLimit);
  const perTask = tasks[0]?.length ?? 1;
  const script = join(slurmDirOf(dir), `submission-${n}-${kind}.sh`);
  const time =
    o.time ?? formatSlurmTime(perTask * limits.timeoutMinutes[kind] * (limits.retries + 1) + 5);
  const text = renderBatchScript({
    experiment,
    kind,
    tasks: tasks.length,
    maxParallel: o.maxParallel,
    dir,
    manifest: submissionPathOf(dir, n),
    arrayIndex: index,
    partition: o.partition,
    time,
    cpusPerTask: o.cpusPerTask,
    extra: o.sbatchArgs,
    midpath: o.midpath,
  });
  writeFileSync(script, text, { mode: 0o755 });
  return { kind, arrayJobId: null, script: relative(dir, script), tasks };
}

/**
 * Submits the jobs of `jobs` that have no kept result (`isKept`) and no live task. Train jobs
 * form one array; evaluations another that starts after every train array it needs has
 * ended (`afterany`: an evaluation whose encoder failed is recorded as not run).
 */
export function submitSweep(
  dir: string,
  experiment: string,
  jobs: readonly JobSpec[],
  isKept: (id: string) => boolean,
  limits: SweepLimits,
  o: SlurmOptions,
): SubmitOutcome {
  const active = o.dryRun ? new Map<string, string>() : findActiveJobs(dir);
  const kept = jobs.filter((j) => isKept(j.id)).length;
  const todo = jobs.filter((j) => !isKept(j.id) && !active.has(j.id));
  if (todo.length === 0) return { submission: null, active: active.size, kept, commands: [] };
  const n = prepareSlurmDir(dir);
  const record: SlurmSubmission = {
    number: n,
    submittedAt: new Date().toISOString(),
    experiment,
    arrays: [],
  };
  for (const kind of ['train', 'evaluate'] as const) {
    const ids = todo.filter((j) => j.kind === kind).map((j) => j.id);
    if (ids.length > 0)
      record.arrays.push(
        buildArray(dir, n, kind, ids, record.arrays.length, experiment, limits, o),
      );
  }
  const path = submissionPathOf(dir, n);
  writeRecord(path, record);
  const trainArray = record.arrays.find((a) => a.kind === 'train');
  const evalArray = record.arrays.find((a) => a.kind === 'evaluate');
  // Evaluations wait for the new train array and for earlier ones still running their encoders.
  const needs = new Set(
    todo.flatMap((j) =>
      j.kind === 'evaluate' && active.has(j.trainId) ? [active.get(j.trainId) ?? ''] : [],
    ),
  );
  if (o.dryRun) {
    const commands = record.arrays.map(
      (a) =>
        `sbatch ${a.kind === 'evaluate' && trainArray ? '--dependency=afterany:<train array id> ' : ''}${quoteShell(join(dir, a.script))}`,
    );
    return { submission: record, active: 0, kept, commands };
  }
  if (trainArray) trainArray.arrayJobId = submitBatch(join(dir, trainArray.script), [], o.env);
  if (trainArray?.arrayJobId) needs.add(trainArray.arrayJobId);
  if (evalArray) {
    const dependency = needs.size > 0 ? [`--dependency=afterany:${[...needs].join(':')}`] : [];
    evalArray.arrayJobId = submitBatch(join(dir, evalArray.script), dependency, o.env);
  }
  writeRecord(path, record);
  return { submission: record, active: active.size, kept, commands: [] };
}
