/**
 * Job directories of a results directory that its current plan.json does not list: jobs
 * of an earlier version of the experiment (other settings, an edited data file). Reports,
 * tables and status already leave them out; `midpath prune` lists them and, when asked,
 * removes them to free the disk. A directory another runner holds locked is never removed.
 */
import { readdirSync, rmSync, statSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { tryLock } from './job-lock.ts';
import { jobDirOf, lockPathOf } from './job-paths.ts';
import { listJobDirs, readRunSync } from './read-run.ts';
import { rebuildIndex } from './run-index.ts';
import { StoreError } from './store-error.ts';

export interface Leftover {
  id: string;
  /** Bytes on disk under the job directory (files only). */
  bytes: number;
  /** The job's status when it has a readable result.json, else null. */
  status: string | null;
}

function bytesUnder(path: string): number {
  let total = 0;
  for (const entry of readdirSync(path, { withFileTypes: true })) {
    const inner = join(path, entry.name);
    if (entry.isDirectory()) total += bytesUnder(inner);
    else if (entry.isFile()) total += statSync(inner).size;
  }
  return total;
}

/** The job directories plan.json does not list; throws when there is no readable plan. */
export function findLeftovers(dir: string): Leftover[] {
  const { plan, results } = readRunSync(dir);
  if (!plan) {
    throw new StoreError(
      'store-missing-plan',
      join(dir, 'plan.json'),
      'no readable plan.json, so which jobs belong to the experiment is unknown; run the experiment into this directory first',
    );
  }
  const planned = new Set(plan.jobs.map((job) => job.id));
  const statusOf = new Map(results.map((r) => [r.id, r.status]));
  return listJobDirs(dir)
    .filter((id) => !planned.has(id))
    .map((id) => ({ id, bytes: bytesUnder(jobDirOf(dir, id)), status: statusOf.get(id) ?? null }));
}

/**
 * Removes `leftovers` (each only after taking its lock, so no running job loses its
 * directory), then rebuilds the index from what remains. Returns the ids removed and the
 * ids skipped because another runner holds them.
 */
export async function removeLeftovers(
  dir: string,
  leftovers: readonly Leftover[],
): Promise<{ removed: string[]; busy: string[] }> {
  const owner = {
    pid: process.pid,
    hostname: hostname(),
    runId: `prune-${process.pid}`,
    createdAt: new Date().toISOString(),
  };
  const removed: string[] = [];
  const busy: string[] = [];
  for (const { id } of leftovers) {
    if (!tryLock(lockPathOf(dir, id), owner)) {
      busy.push(id);
      continue;
    }
    rmSync(jobDirOf(dir, id), { recursive: true, force: true });
    removed.push(id);
  }
  if (removed.length > 0) await rebuildIndex(dir);
  return { removed, busy };
}
