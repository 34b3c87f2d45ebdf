/**
 * The SLURM engine's records in a results directory: one submission file per `midpath run
 * --engine slurm`, listing each array it submitted and, per array task, the job ids that
 * task runs. Tasks read it to find their jobs; `midpath status` reads it to match
 * scheduler states to jobs.
 *
 *   results/<name>/slurm/submission-<n>.json   SlurmSubmission
 *   results/<name>/slurm/submission-<n>-<kind>.sh  the batch script of one array
 *   results/<name>/slurm/logs/<array>_<task>.out   each array task's output
 */
import { existsSync, mkdirSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { JobKind } from '../../plan/job-spec.ts';

export interface SlurmArray {
  kind: JobKind;
  /** SLURM's job id of the array; null for a dry run (not submitted). */
  arrayJobId: string | null;
  /** Batch script, relative to the results directory. */
  script: string;
  /** Job ids per array task: task i runs tasks[i] one after another. */
  tasks: string[][];
}

export interface SlurmSubmission {
  number: number;
  submittedAt: string;
  experiment: string;
  arrays: SlurmArray[];
}

/** `<dir>/slurm` */
export function slurmDirOf(dir: string): string {
  return join(dir, 'slurm');
}

/** Path of submission `n`'s record. */
export function submissionPathOf(dir: string, n: number): string {
  return join(slurmDirOf(dir), `submission-${n}.json`);
}

/** Every submission record in `dir`, oldest first (unreadable ones are skipped). */
export function readSubmissions(dir: string): SlurmSubmission[] {
  const slurmDir = slurmDirOf(dir);
  if (!existsSync(slurmDir)) return [];
  return readdirSync(slurmDir)
    .filter((name) => /^submission-\d+\.json$/.test(name))
    .flatMap((name) => {
      try {
        return [JSON.parse(readFileSync(join(slurmDir, name), 'utf8')) as SlurmSubmission];
      } catch {
        return [];
      }
    })
    .sort((a, b) => a.number - b.number);
}

/** Creates `<dir>/slurm/logs` and returns the next submission number. */
export function prepareSlurmDir(dir: string): number {
  mkdirSync(join(slurmDirOf(dir), 'logs'), { recursive: true });
  const last = readSubmissions(dir).at(-1);
  return (last?.number ?? 0) + 1;
}
