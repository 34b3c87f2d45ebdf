/**
 * The layout of a results directory (see result.ts), in one place so no other file spells
 * out a path. Job ids are content hashes; anything else is refused so an id can never
 * point outside `jobs/`.
 */
import { join } from 'node:path';
import { StoreError } from './store-error.ts';

const SAFE_ID = /^[A-Za-z0-9][A-Za-z0-9_.-]{0,127}$/;

/** True when `id` is a plain file-name-safe token that stays inside `jobs/`. */
export function isSafeJobId(id: string): boolean {
  return SAFE_ID.test(id) && !id.includes('..');
}

/** Throws `store-bad-job-id` unless `id` is a plain file-name-safe token. */
export function checkJobId(id: string): string {
  if (!isSafeJobId(id)) {
    throw new StoreError(
      'store-bad-job-id',
      id,
      `expected a job id of letters, digits, '_', '-' or '.', got ${JSON.stringify(id)}; ids come from plan.json, regenerate it with \`midpath run --fresh\``,
    );
  }
  return id;
}

/** `<dir>/plan.json` */
export function planPathOf(dir: string): string {
  return join(dir, 'plan.json');
}

/** `<dir>/index.sqlite` */
export function indexPathOf(dir: string): string {
  return join(dir, 'index.sqlite');
}

/** `<dir>/jobs` */
export function jobsDirOf(dir: string): string {
  return join(dir, 'jobs');
}

/** `<dir>/jobs/<id>` */
export function jobDirOf(dir: string, id: string): string {
  return join(dir, 'jobs', checkJobId(id));
}

/** `<dir>/jobs/<id>/result.json` */
export function resultPathOf(dir: string, id: string): string {
  return join(jobDirOf(dir, id), 'result.json');
}

/** `<dir>/jobs/<id>/artifacts` */
export function artifactsDirOf(dir: string, id: string): string {
  return join(jobDirOf(dir, id), 'artifacts');
}

/** `<dir>/jobs/<id>/log.txt` */
export function logPathOf(dir: string, id: string): string {
  return join(jobDirOf(dir, id), 'log.txt');
}

/** `<dir>/jobs/<id>/.lock`: held while some runner executes the job. */
export function lockPathOf(dir: string, id: string): string {
  return join(jobDirOf(dir, id), '.lock');
}
