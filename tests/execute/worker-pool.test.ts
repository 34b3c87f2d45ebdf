/** The worker pool on its own: what happens when a job's log cannot be written. */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { WorkerPool } from '../../runner/execute/worker-pool.ts';
import type { WorkerLaunch } from '../../runner/execute/worker-pool.ts';
import { fakeTrainSpec } from '../fixtures/execute/fake-plan.ts';
import type { Behaviour } from '../fixtures/execute/fake-plan.ts';
import { fakeHandlersPath } from '../fixtures/execute/fake-sweep.ts';

function launch(logPath: string, behaviour: Behaviour): WorkerLaunch {
  return {
    request: {
      spec: fakeTrainSpec(0, behaviour),
      artifactsDir: mkdtempSync(join(tmpdir(), 'midpath-pool-')),
      dependencies: {},
      threads: 1,
    },
    logPath,
    timeLimitMs: 60_000,
    killGraceMs: 300,
    heapLimitMb: 256,
    env: { MIDPATH_HANDLERS_MODULE: fakeHandlersPath },
  };
}

describe('WorkerPool', () => {
  // /dev/full accepts an open and fails every write with ENOSPC (null(4), Linux man-pages).
  it.skipIf(process.platform !== 'linux')(
    'finishes a job whose log file hits a full disk, keeping the output tail in memory',
    async () => {
      const pool = new WorkerPool({ jobsPerWorker: 5 });
      try {
        const loud = await pool.start(launch('/dev/full', 'loud')).result;
        expect(loud).toMatchObject({ kind: 'outcome', outcome: { status: 'done' } });
        // The same worker still runs the next job: the failed log was the runner's, not the job's.
        const next = await pool.start(launch('/dev/full', 'throw')).result;
        expect(next).toMatchObject({ kind: 'crash', cause: 'threw' });
        if (next.kind === 'crash') {
          expect(next.logTail).toContain('log.txt could not be written further');
          expect(next.logTail).toContain('greenhouse sensor 0 returned no readings');
        }
      } finally {
        pool.close();
      }
    },
  );

  it('keeps what a worker prints between jobs for the next job, under a note', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'midpath-pool-logs-'));
    const pool = new WorkerPool({ jobsPerWorker: 5 });
    try {
      const late = await pool.start(launch(join(dir, 'late.txt'), 'late')).result;
      await new Promise((wake) => setTimeout(wake, 600)); // the worker is idle when it prints
      const next = await pool.start(launch(join(dir, 'next.txt'), 'ok')).result;
      if (late.kind !== 'outcome' || next.kind !== 'outcome') throw new Error('both should finish');
      expect(next.workerPid).toBe(late.workerPid);
      const log = readFileSync(join(dir, 'next.txt'), 'utf8');
      expect(log).toMatch(/^\[worker \d+ printed this after its previous job ended\]\n/);
      expect(log).toContain('late line of');
      expect(log).toContain('late log message of');
      expect(readFileSync(join(dir, 'late.txt'), 'utf8')).not.toContain('late line');
    } finally {
      pool.close();
    }
  });

  it('refuses to start a job whose log cannot be created, without starting a worker', () => {
    const children = (): string =>
      process.platform === 'linux'
        ? execFileSync('ps', ['-o', 'pid=', '--ppid', String(process.pid)], {
            encoding: 'utf8',
          }).replace(/\s+/g, ' ')
        : '';
    const pool = new WorkerPool({ jobsPerWorker: 5 });
    const missing = join(tmpdir(), 'midpath-no-such-dir', 'deeper', 'log.txt');
    const before = children();
    expect(() => pool.start(launch(missing, 'ok'))).toThrow(/ENOENT/);
    // Only the ps started here is new (its own pid differs each time): count, not compare.
    expect(children().trim().split(' ').length).toBe(before.trim().split(' ').length);
    pool.close();
  });
});
