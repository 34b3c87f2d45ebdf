/**
 * Worker reuse (runner/execute/worker-pool.ts): clean jobs share a process up to
 * run.jobsPerWorker; any other ending retires it; logs and peak memory stay per job.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { JobResult } from '../../runner/store/result.ts';
import { readRun } from '../../runner/store/read-run.ts';
import { fakeTrainSpec } from '../fixtures/execute/fake-plan.ts';
import type { Behaviour } from '../fixtures/execute/fake-plan.ts';
import { runFakeSweep, tempRun } from '../fixtures/execute/fake-sweep.ts';

function byIdOf(results: JobResult[]): (id: string) => JobResult {
  const map = new Map(results.map((r) => [r.id, r]));
  return (id) => {
    const found = map.get(id);
    if (!found) throw new Error(`no result for ${id}`);
    return found;
  };
}

describe('worker reuse', () => {
  it('runs clean jobs in one process up to jobsPerWorker and retires a process after any other ending', async () => {
    const { dir, journal } = tempRun();
    const behaviours: Behaviour[] = [
      'ok',
      'ok',
      'ok',
      'ok',
      'throw',
      'ok',
      'exit',
      'ok',
      'hang',
      'ok',
    ];
    const jobs = behaviours.map((b, i) => fakeTrainSpec(i, b));
    const { summary } = await runFakeSweep(dir, journal, jobs, {
      workers: 1,
      retries: 0,
      jobsPerWorker: 3,
      timeLimitMs: () => 3000,
    });
    expect(summary).toMatchObject({ done: 7, failed: 3 });
    const { results } = await readRun(dir);
    const of = byIdOf(results);
    const worker = (i: number): { pid: number; job: number } | undefined =>
      of(jobs[i]!.id).provenance.worker;
    // Positions in their process: three clean jobs, then a fresh process (limit reached).
    expect([0, 1, 2, 3].map((i) => worker(i)?.job)).toEqual([1, 2, 3, 1]);
    expect(new Set([0, 1, 2].map((i) => worker(i)?.pid)).size).toBe(1);
    expect(worker(3)?.pid).not.toBe(worker(0)?.pid);
    // After a throw, an exit and a time-out, the next job starts in a fresh process.
    expect([5, 7, 9].map((i) => worker(i)?.job)).toEqual([1, 1, 1]);
    const pids = [0, 3, 5, 7, 9].map((i) => worker(i)?.pid);
    expect(new Set(pids).size).toBe(5);
    // The failed jobs ran as the second job of the process before them.
    const journalPid = new Map(
      readFileSync(journal, 'utf8')
        .trim()
        .split('\n')
        .map((line) => line.split(' '))
        .map(([id, , pid]) => [id, Number(pid)] as const),
    );
    expect(journalPid.get(jobs[4]!.id)).toBe(worker(3)?.pid);
    expect(journalPid.get(jobs[6]!.id)).toBe(worker(5)?.pid);
    expect(of(jobs[8]!.id).error?.reason).toContain('time limit exceeded');
  });

  it('retires a worker whose resident memory outgrew its heap limit after a job', async () => {
    const positions = async (heapLimitMb: number): Promise<(number | undefined)[]> => {
      const { dir, journal } = tempRun();
      const jobs = [fakeTrainSpec(0, 'leak'), fakeTrainSpec(1)];
      await runFakeSweep(dir, journal, jobs, { workers: 1, jobsPerWorker: 10, heapLimitMb });
      const of = byIdOf((await readRun(dir)).results);
      return jobs.map((job) => of(job.id).provenance.worker?.job);
    };
    // 200 MB kept alive (outside the V8 heap) against a 160 MB limit: the next job gets a
    // fresh process; under a 2 GB limit the same process goes on.
    expect(await positions(160)).toEqual([1, 1]);
    expect(await positions(2048)).toEqual([1, 2]);
  });

  it('with jobsPerWorker 1 gives every job its own process', async () => {
    const { dir, journal } = tempRun();
    const jobs = [0, 1, 2, 3].map((i) => fakeTrainSpec(i));
    await runFakeSweep(dir, journal, jobs, { workers: 2, jobsPerWorker: 1 });
    const { results } = await readRun(dir);
    expect(results.map((r) => r.provenance.worker?.job)).toEqual([1, 1, 1, 1]);
    expect(new Set(results.map((r) => r.provenance.worker?.pid)).size).toBe(4);
  });

  it("keeps each job's output in its own log, and output printed after a job ended in the next one's", async () => {
    const { dir, journal } = tempRun();
    const jobs = [
      fakeTrainSpec(0),
      fakeTrainSpec(1, 'late'),
      fakeTrainSpec(2, 'ok', 800),
      fakeTrainSpec(3, 'loud'),
      fakeTrainSpec(4),
    ];
    await runFakeSweep(dir, journal, jobs, { workers: 1, jobsPerWorker: 10 });
    const log = (i: number): string =>
      readFileSync(join(dir, 'jobs', jobs[i]!.id, 'log.txt'), 'utf8');
    const { results } = await readRun(dir);
    expect(new Set(results.map((r) => r.provenance.worker?.pid)).size).toBe(1);
    jobs.forEach((job, i) => {
      expect(log(i)).toContain(`stdout of ${job.id}`);
      expect(log(i)).toContain(`stderr of ${job.id}`);
      for (const other of jobs.filter((o) => o.id !== job.id)) {
        expect(log(i)).not.toContain(`stdout of ${other.id}`);
        expect(log(i)).not.toContain(`stderr of ${other.id}`);
      }
      expect(log(i)).not.toContain('::midpath end of job');
    });
    // The 'late' job printed 200 ms after finishing, while job 2 (800 ms long) ran.
    expect(log(1)).not.toContain('late line');
    expect(log(2)).toContain(`late line of ${jobs[1]!.id}`);
    expect(log(2)).toContain(`late log message of ${jobs[1]!.id}`);
    // 8 MB printed just before the outcome: all of it lands in the loud job's own log.
    expect(log(3).length).toBeGreaterThan(8e6);
    expect(log(3)).toContain(`last line of ${jobs[3]!.id}`);
    expect(log(4)).not.toContain(jobs[3]!.id);
  });

  it.skipIf(process.platform !== 'linux')(
    "reports each job's own peak memory, not the process's lifetime peak",
    async () => {
      const { dir, journal } = tempRun();
      const jobs = [fakeTrainSpec(0, 'hog'), fakeTrainSpec(1)];
      await runFakeSweep(dir, journal, jobs, { workers: 1, jobsPerWorker: 10 });
      const { results } = await readRun(dir);
      const of = byIdOf(results);
      const hog = of(jobs[0]!.id).provenance;
      const small = of(jobs[1]!.id).provenance;
      expect(small.worker).toEqual({ pid: hog.worker?.pid, job: 2 });
      // The 200 MB block was resident during the first job only (proc(5): clear_refs, VmHWM).
      expect(hog.peakRssBytes - small.peakRssBytes).toBeGreaterThan(150 * 2 ** 20);
    },
  );
});
