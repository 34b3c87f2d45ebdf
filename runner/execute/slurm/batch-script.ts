/**
 * Renders the batch script of one SLURM job array. Each array task runs `midpath run
 * --slurm-task` on its share of the jobs; the runner inside the task gives every job the same
 * worker isolation, retries, locks and atomic results as a local run.
 */
import type { JobKind } from '../../plan/job-spec.ts';

export interface BatchScriptOptions {
  experiment: string;
  kind: JobKind;
  /** Number of array tasks. */
  tasks: number;
  /** At most this many tasks at once (`%K`); 0 for no limit. */
  maxParallel: number;
  /** Absolute results directory (shared between the nodes). */
  dir: string;
  /** Submission record, absolute. */
  manifest: string;
  /** Index of this array in the record. */
  arrayIndex: number;
  partition: string | undefined;
  /** HH:MM:SS */
  time: string;
  cpusPerTask: number;
  /** Extra `#SBATCH` arguments given with --sbatch-arg, verbatim. */
  extra: string[];
  /** Command that starts Midpath on a node, e.g. `node /opt/midpath/bin/midpath.mjs`. */
  midpath: string;
}

/** Shell-quotes one word (single quotes; common practice). */
export function quoteShell(word: string): string {
  return /^[A-Za-z0-9_./:=@%+-]+$/.test(word) ? word : `'${word.replace(/'/g, `'\\''`)}'`;
}

/** The script text. */
export function renderBatchScript(o: BatchScriptOptions): string {
  const limit = o.maxParallel > 0 ? `%${o.maxParallel}` : '';
  const lines = [
    '#!/bin/bash',
    `# Midpath: ${o.kind} jobs of experiment '${o.experiment}', ${o.tasks} array task(s).`,
    '# Each task runs its jobs from the submission record; results land in the shared',
    '# results directory. Written by `midpath run --engine slurm`.',
    `#SBATCH --job-name=${quoteShell(`midpath-${o.experiment}-${o.kind}`)}`,
    `#SBATCH --array=0-${o.tasks - 1}${limit}`,
    `#SBATCH --cpus-per-task=${o.cpusPerTask}`,
    `#SBATCH --time=${o.time}`,
    `#SBATCH --output=${quoteShell(`${o.dir}/slurm/logs/%A_%a.out`)}`,
    ...(o.partition === undefined ? [] : [`#SBATCH --partition=${quoteShell(o.partition)}`]),
    ...o.extra.map((arg) => `#SBATCH ${arg}`),
    '',
    'set -eu',
    `exec ${o.midpath} run --slurm-task ${quoteShell(`${o.manifest}#${o.arrayIndex}`)}`,
    '',
  ];
  return lines.join('\n');
}

/** Minutes as SLURM's HH:MM:SS. */
export function formatSlurmTime(minutes: number): string {
  const total = Math.max(1, Math.ceil(minutes));
  const hh = Math.floor(total / 60);
  return `${String(hh).padStart(2, '0')}:${String(total % 60).padStart(2, '0')}:00`;
}

/** Splits job ids into at most `maxTasks` array tasks of nearly equal size, keeping order. */
export function chunkJobs(ids: readonly string[], maxTasks: number): string[][] {
  const per = Math.max(1, Math.ceil(ids.length / Math.max(1, maxTasks)));
  const chunks: string[][] = [];
  for (let i = 0; i < ids.length; i += per) chunks.push(ids.slice(i, i + per));
  return chunks;
}
