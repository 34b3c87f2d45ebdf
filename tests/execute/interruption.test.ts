import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { SweepControl } from '../../runner/execute/sweep-control.ts';
import type { JobSpec } from '../../runner/plan/job-spec.ts';
import { readRun } from '../../runner/store/read-run.ts';
import { rebuildIndex } from '../../runner/store/run-index.ts';
import { fakePlan } from '../fixtures/execute/fake-plan.ts';
import { readJournal, runFakeSweep, tempRun } from '../fixtures/execute/fake-sweep.ts';

const driver = fileURLToPath(new URL('../fixtures/execute/drive-sweep.ts', import.meta.url));

/** Starts the runner as its own process; `lines` fills with its stdout lines. */
function startDriver(jobs: JobSpec[], dir: string, journal: string) {
  const planPath = join(dir, '..', `plan-${Math.random()}.json`);
  mkdirSync(join(dir, '..'), { recursive: true });
  writeFileSync(planPath, JSON.stringify(jobs));
  const child = spawn(process.execPath, ['--import', 'tsx', driver, planPath, dir, journal], {
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const lines: string[] = [];
  child.stdout.on('data', (chunk: Buffer) =>
    lines.push(...chunk.toString().split('\n').filter(Boolean)),
  );
  const exited = new Promise<number | null>((done) => child.on('close', (code) => done(code)));
  return { child, lines, exited };
}

async function waitFor(check: () => boolean, timeoutMs = 90_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!check()) {
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((wake) => setTimeout(wake, 50));
  }
}

/** id → metric values of every result: what must match between two runs. */
async function resultSet(dir: string): Promise<Map<string, number[]>> {
  const { results, problems } = await readRun(dir);
  expect(problems.filter((p) => p.code !== 'store-missing-plan')).toEqual([]);
  return new Map(results.map((r) => [r.id, r.metrics.map((m) => m.value)]));
}

describe('interruption and concurrent runners', () => {
  it('after kill -9 of the runner, a second run completes the same result set as an uninterrupted run', async () => {
    const jobs = fakePlan(3, 1200);
    const reference = tempRun();
    await runFakeSweep(reference.dir, reference.journal, jobs);

    const { dir, journal } = tempRun();
    const first = startDriver(jobs, dir, journal);
    await waitFor(() => first.lines.filter((l) => l.startsWith('finished')).length >= 2);
    first.child.kill('SIGKILL');
    await first.exited;
    const before = await resultSet(dir); // readable: no torn result.json
    expect(before.size).toBeGreaterThanOrEqual(2);
    expect(before.size).toBeLessThan(jobs.length);

    await runFakeSweep(dir, journal, jobs);
    expect(await resultSet(dir)).toEqual(await resultSet(reference.dir));
    const attempts = readJournal(journal);
    for (const id of before.keys()) expect(attempts.get(id)).toBe(1); // kept, not redone
    for (const id of readdirSync(join(dir, 'jobs'))) {
      expect(readdirSync(join(dir, 'jobs', id)).filter((f) => f.startsWith('.'))).toEqual([]);
    }
  });

  it('two runners on one directory do each job once and leave a consistent index', async () => {
    const jobs = fakePlan(3, 300);
    const { dir, journal } = tempRun();
    const a = startDriver(jobs, dir, journal);
    const b = startDriver(jobs, dir, journal);
    expect(await a.exited).toBe(0);
    expect(await b.exited).toBe(0);
    expect([...readJournal(journal).values()]).toEqual(Array(jobs.length).fill(1));
    expect((await resultSet(dir)).size).toBe(jobs.length);
    const count = (sql: string): number => {
      const db = new Database(join(dir, 'index.sqlite'), { readonly: true });
      try {
        return (db.prepare(sql).get() as { n: number }).n;
      } finally {
        db.close();
      }
    };
    expect(count('SELECT count(*) AS n FROM jobs')).toBe(jobs.length);
    expect(count('SELECT count(*) AS n FROM metrics')).toBe(jobs.length);
    const rebuilt = await rebuildIndex(dir);
    expect(rebuilt).toMatchObject({ jobs: jobs.length, metrics: jobs.length });
    expect(count("SELECT count(*) AS n FROM jobs WHERE status = 'done'")).toBe(jobs.length);
  });

  it('drains on the first stop and kills on the second, keeping only finished results', async () => {
    const jobs = fakePlan(3, 1500);
    const { dir, journal } = tempRun();
    const control = new SweepControl();
    const drained = await runFakeSweep(dir, journal, jobs, {
      control,
      workers: 1,
      onEvent: (event) => {
        if (event.type === 'started') control.drain();
      },
    });
    expect(drained.summary).toMatchObject({
      interrupted: true,
      done: 1,
      unfinished: jobs.length - 1,
    });

    const killer = new SweepControl();
    const killed = await runFakeSweep(dir, journal, jobs, {
      control: killer,
      workers: 1,
      onEvent: (event) => {
        if (event.type === 'started') setTimeout(() => killer.kill(), 200);
      },
    });
    expect(killed.summary).toMatchObject({
      interrupted: true,
      stored: 1,
      done: 0,
      failed: 0,
      unfinished: jobs.length - 1,
    });
    expect((await resultSet(dir)).size).toBe(1);
    for (const id of readdirSync(join(dir, 'jobs')))
      expect(existsSync(join(dir, 'jobs', id, '.lock'))).toBe(false);
  });

  it('stops with store-unwritable when the output cannot be written, marking nothing complete', async () => {
    const { dir, journal } = tempRun();
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'jobs'), 'a file where the jobs directory belongs');
    await expect(runFakeSweep(dir, journal, fakePlan(2))).rejects.toMatchObject({
      code: 'store-unwritable',
    });
    expect((await readRun(dir)).results).toEqual([]);
    expect(readJournal(journal).size).toBe(0);
  });
});
