/**
 * The results directory as the runner's ledger (the JobLedger interface of the execute
 * stage): kept results, per-job locks, attempt directories, and atomic result writes that
 * also update the SQLite index. A job counts as complete only once its result.json exists.
 */
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { hostname } from 'node:os';
import { join, relative } from 'node:path';
import type { AttemptPaths, FinishedJob, JobLedger, StoredMark } from '../execute/job-ledger.ts';
import { isJobResult } from './check-result.ts';
import { artifactsDirOf, jobDirOf, lockPathOf, logPathOf, resultPathOf } from './job-paths.ts';
import { touchLock, tryLock, unlock } from './job-lock.ts';
import type { IndexDatabase } from './run-index.ts';
import { indexResult, openIndexDatabase } from './run-index.ts';
import type { JobResult } from './result.ts';
import { TEMP_PREFIX } from './write-atomic.ts';
import { toUnwritable, writeResultAtomic } from './write-result.ts';

export interface LedgerOptions {
  /** Identifies this runner in lock files and the runs table. */
  runId: string;
  /** Told about index trouble that loses nothing (the result files are the truth). */
  onWarning?: (message: string) => void;
}

function listFiles(root: string, base: string): string[] {
  if (!existsSync(root)) return [];
  return readdirSync(root, { withFileTypes: true, recursive: true })
    .filter((entry) => entry.isFile())
    .map((entry) => relative(base, join(entry.parentPath, entry.name)))
    .sort();
}

export class RunLedger implements JobLedger {
  private readonly held = new Set<string>();
  private db: IndexDatabase | undefined;

  constructor(
    readonly dir: string,
    private readonly options: LedgerOptions,
  ) {}

  stored(id: string): StoredMark | null {
    const path = resultPathOf(this.dir, id);
    try {
      const stat = statSync(path);
      const value: unknown = JSON.parse(readFileSync(path, 'utf8'));
      if (!isJobResult(value) || value.id !== id) return null; // corrupt: redo the job
      return { status: value.status, stamp: `${stat.mtimeMs}:${stat.size}` };
    } catch {
      return null;
    }
  }

  claim(id: string): boolean {
    const path = lockPathOf(this.dir, id);
    try {
      mkdirSync(jobDirOf(this.dir, id), { recursive: true });
      const owner = {
        pid: process.pid,
        hostname: hostname(),
        runId: this.options.runId,
        createdAt: new Date().toISOString(),
      };
      if (!tryLock(path, owner)) return false;
    } catch (error) {
      throw toUnwritable(path, error);
    }
    this.held.add(id);
    return true;
  }

  release(id: string): void {
    if (!this.held.delete(id)) return;
    unlock(lockPathOf(this.dir, id), this.options.runId);
  }

  prepare(id: string): AttemptPaths {
    const artifactsDir = artifactsDirOf(this.dir, id);
    const jobDir = jobDirOf(this.dir, id);
    try {
      // Temporary files of a write cut short by a crash: never a result, safe to drop.
      for (const name of readdirSync(jobDir).filter((n) => n.startsWith(TEMP_PREFIX))) {
        rmSync(join(jobDir, name), { force: true });
      }
      rmSync(artifactsDir, { recursive: true, force: true });
      mkdirSync(artifactsDir, { recursive: true });
    } catch (error) {
      throw toUnwritable(artifactsDir, error);
    }
    return { artifactsDir, logPath: logPathOf(this.dir, id) };
  }

  artifactsDirOf(id: string): string {
    return artifactsDirOf(this.dir, id);
  }

  async record(job: FinishedJob): Promise<void> {
    const id = job.spec.id;
    const result: JobResult = {
      id,
      kind: job.spec.kind,
      status: job.status,
      spec: job.spec,
      metrics: job.metrics,
      info: job.info,
      artifacts: listFiles(artifactsDirOf(this.dir, id), jobDirOf(this.dir, id)),
      provenance: job.provenance,
      ...(job.error ? { error: job.error } : {}),
    };
    await writeResultAtomic(this.dir, result);
    this.index(result);
  }

  heartbeat(): void {
    for (const id of this.held) touchLock(lockPathOf(this.dir, id));
  }

  /** The index connection (opened on first use), or undefined when it cannot be opened. */
  database(): IndexDatabase | undefined {
    if (!this.db) {
      try {
        this.db = openIndexDatabase(this.dir);
      } catch (error) {
        this.options.onWarning?.(
          `index.sqlite cannot be opened (${String(error)}); results are kept in result.json files, run \`midpath status\` later to rebuild it`,
        );
      }
    }
    return this.db;
  }

  private index(result: JobResult): void {
    const db = this.database();
    if (!db) return;
    try {
      indexResult(db, result);
    } catch (error) {
      this.options.onWarning?.(
        `index.sqlite not updated for job ${result.id} (${String(error)}); the result file is kept and the index can be rebuilt`,
      );
    }
  }

  /** Releases every held lock and closes the index. */
  close(): void {
    for (const id of [...this.held]) this.release(id);
    this.db?.close();
    this.db = undefined;
  }
}
