/**
 * Writes a job's result.json atomically. The result file is the truth of the results
 * directory: the SQLite index is rebuilt from these files, and a job counts as complete
 * only once its result.json exists.
 */
import { mkdirSync } from 'node:fs';
import type { JobResult, PlanFile } from './result.ts';
import { jobDirOf, planPathOf, resultPathOf } from './job-paths.ts';
import { StoreError } from './store-error.ts';
import { writeFileAtomic } from './write-atomic.ts';

/** Turns a file-system error into `store-unwritable` naming the path and the fix. */
export function toUnwritable(path: string, error: unknown): StoreError {
  const reason = error instanceof Error ? error.message : String(error);
  return new StoreError(
    'store-unwritable',
    path,
    `cannot write the results directory (${reason}); check free space and permissions, or choose another directory with --out`,
  );
}

/**
 * Writes `<dir>/jobs/<result.id>/result.json` atomically (temp file, fsync, rename) and
 * returns its path. Throws `store-unwritable` when the directory cannot be written.
 */
export function writeResultSync(dir: string, result: JobResult): string {
  const path = resultPathOf(dir, result.id);
  try {
    mkdirSync(jobDirOf(dir, result.id), { recursive: true });
    writeFileAtomic(path, `${JSON.stringify(result, null, 2)}\n`);
  } catch (error) {
    if (error instanceof StoreError) throw error;
    throw toUnwritable(path, error);
  }
  return path;
}

/** The promise form of `writeResultSync`: resolves to the path, rejects with a StoreError. */
export function writeResultAtomic(dir: string, result: JobResult): Promise<string> {
  return new Promise((settle) => settle(writeResultSync(dir, result)));
}

/** Writes `<dir>/plan.json` atomically, creating `dir`; throws `store-unwritable` on failure. */
export function writePlanFile(dir: string, plan: PlanFile): string {
  const path = planPathOf(dir);
  try {
    mkdirSync(dir, { recursive: true });
    writeFileAtomic(path, `${JSON.stringify(plan, null, 2)}\n`);
  } catch (error) {
    throw toUnwritable(path, error);
  }
  return path;
}
