/**
 * The SQLite index of a results directory (better-sqlite3): runs, jobs and a tidy metrics
 * table (one row per MetricRow) for fast queries over thousands of jobs. The result files
 * stay the truth; `rebuildIndex` recreates the job and metric rows from them at any time.
 * WAL mode lets readers query while a runner writes; writes use BEGIN IMMEDIATE so two
 * runners on one directory queue for the write lock instead of failing mid-transaction.
 */
import Database from 'better-sqlite3';
import { mkdirSync } from 'node:fs';
import { indexPathOf } from './job-paths.ts';
import { readRun } from './read-run.ts';
import type { JobResult } from './result.ts';
import type { StoreProblem } from './store-error.ts';

const SCHEMA = `
CREATE TABLE IF NOT EXISTS runs (
  run_id TEXT PRIMARY KEY, experiment TEXT NOT NULL, started_at TEXT NOT NULL,
  finished_at TEXT, hostname TEXT NOT NULL, pid INTEGER NOT NULL, workers INTEGER NOT NULL,
  outcome TEXT
);
CREATE TABLE IF NOT EXISTS jobs (
  id TEXT PRIMARY KEY, kind TEXT NOT NULL, status TEXT NOT NULL, experiment TEXT NOT NULL,
  method TEXT NOT NULL, seed INTEGER NOT NULL, setting TEXT NOT NULL, train_id TEXT,
  wall_seconds REAL NOT NULL, peak_rss_bytes INTEGER NOT NULL, started_at TEXT NOT NULL,
  reason TEXT, attempts INTEGER
);
CREATE TABLE IF NOT EXISTS metrics (
  job_id TEXT NOT NULL REFERENCES jobs(id) ON DELETE CASCADE, suite TEXT NOT NULL,
  metric TEXT NOT NULL, level TEXT NOT NULL, source TEXT NOT NULL, value REAL, n INTEGER
);
CREATE INDEX IF NOT EXISTS metrics_by_name ON metrics(metric, suite, level);
CREATE INDEX IF NOT EXISTS metrics_by_job ON metrics(job_id);
`;

/** A run as the index records it (one `midpath run` invocation). */
export interface RunRecord {
  runId: string;
  experiment: string;
  startedAt: string;
  hostname: string;
  pid: number;
  workers: number;
}

export type IndexDatabase = Database.Database;

/** Opens (creating if needed) `<dir>/index.sqlite` in WAL mode with the schema in place. */
export function openIndexDatabase(dir: string): IndexDatabase {
  mkdirSync(dir, { recursive: true });
  const db = new Database(indexPathOf(dir), { timeout: 30_000 });
  db.pragma('journal_mode = WAL');
  db.pragma('foreign_keys = ON');
  db.pragma('synchronous = NORMAL'); // WAL + NORMAL is durable up to the last checkpoint (SQLite docs)
  db.exec(SCHEMA);
  return db;
}

interface Statements {
  deleteJob: Database.Statement;
  insertJob: Database.Statement;
  insertMetric: Database.Statement;
}

// Prepared once per connection: preparing costs more than running these small statements.
const statements = new WeakMap<IndexDatabase, Statements>();

function statementsOf(db: IndexDatabase): Statements {
  let found = statements.get(db);
  if (!found) {
    found = {
      deleteJob: db.prepare('DELETE FROM jobs WHERE id = ?'),
      insertJob: db.prepare(
        `INSERT INTO jobs (id, kind, status, experiment, method, seed, setting, train_id, wall_seconds,
       peak_rss_bytes, started_at, reason, attempts)
     VALUES (@id, @kind, @status, @experiment, @method, @seed, @setting, @trainId, @wall, @peak, @startedAt, @reason, @attempts)`,
      ),
      insertMetric: db.prepare(
        'INSERT INTO metrics (job_id, suite, metric, level, source, value, n) VALUES (?, ?, ?, ?, ?, ?, ?)',
      ),
    };
    statements.set(db, found);
  }
  return found;
}

function insertResult(db: IndexDatabase, result: JobResult): number {
  const spec = result.spec;
  const { deleteJob, insertJob, insertMetric } = statementsOf(db);
  deleteJob.run(result.id);
  insertJob.run({
    id: result.id,
    kind: result.kind,
    status: result.status,
    experiment: spec.experiment,
    method: spec.method.label,
    seed: spec.seed,
    setting: JSON.stringify(spec.setting),
    trainId: spec.kind === 'evaluate' ? spec.trainId : null,
    wall: result.provenance.wallSeconds,
    peak: result.provenance.peakRssBytes,
    startedAt: result.provenance.startedAt,
    reason: result.error?.reason ?? null,
    attempts: result.error?.attempts ?? null,
  });
  for (const row of result.metrics) {
    insertMetric.run(
      result.id,
      row.suite,
      row.metric,
      String(row.level),
      row.source,
      Number.isFinite(row.value) ? row.value : null,
      row.n ?? null,
    );
  }
  return result.metrics.length;
}

/** Writes (replaces) one job and its metric rows in a single immediate transaction. */
export function indexResult(db: IndexDatabase, result: JobResult): void {
  db.transaction(() => insertResult(db, result)).immediate();
}

/** Records the start of a run. */
export function indexRunStart(db: IndexDatabase, run: RunRecord): void {
  db.transaction(() => {
    db.prepare(
      `INSERT OR REPLACE INTO runs (run_id, experiment, started_at, hostname, pid, workers)
       VALUES (@runId, @experiment, @startedAt, @hostname, @pid, @workers)`,
    ).run(run);
  }).immediate();
}

/** Records how a run ended ('complete', 'failures', 'interrupted', 'error'). */
export function indexRunEnd(db: IndexDatabase, runId: string, outcome: string): void {
  db.transaction(() => {
    db.prepare('UPDATE runs SET finished_at = ?, outcome = ? WHERE run_id = ?').run(
      new Date().toISOString(),
      outcome,
      runId,
    );
  }).immediate();
}

/** What a rebuild found. */
export interface RebuildSummary {
  jobs: number;
  metrics: number;
  problems: StoreProblem[];
}

/**
 * Recreates the jobs and metrics tables of `<dir>/index.sqlite` from the result files (the
 * runs table, which has no file of its own, is kept). One transaction: readers see the old
 * index or the new one.
 */
export async function rebuildIndex(dir: string): Promise<RebuildSummary> {
  const { results, problems } = await readRun(dir);
  const db = openIndexDatabase(dir);
  try {
    let metrics = 0;
    db.transaction(() => {
      db.exec('DELETE FROM metrics; DELETE FROM jobs;');
      for (const result of results) metrics += insertResult(db, result);
    }).immediate();
    return { jobs: results.length, metrics, problems };
  } finally {
    db.close();
  }
}
