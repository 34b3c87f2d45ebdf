import { describe, expect, it } from 'vitest';
import { SweepStop } from '../../runner/execute/sweep-stop.ts';
import { readRun } from '../../runner/store/read-run.ts';
import { fakeEvalSpec, fakeTrainSpec } from '../fixtures/execute/fake-plan.ts';
import type { Behaviour } from '../fixtures/execute/fake-plan.ts';
import { readJournal, runFakeSweep, tempRun } from '../fixtures/execute/fake-sweep.ts';

describe('failure isolation', () => {
  it('records each way a worker can fail with its reason and completes the rest', async () => {
    const { dir, journal } = tempRun();
    const behaviours: Behaviour[] = [
      'throw',
      'exit',
      'kill',
      'ok',
      'oom',
      'diverge',
      'flaky',
      'ok',
    ];
    const trains = behaviours.map((b, i) => fakeTrainSpec(i, b));
    const okTrain = trains[7]!;
    const flakyTrain = trains[6]!;
    const divergedTrain = trains[5]!;
    const evals = [fakeEvalSpec(okTrain), fakeEvalSpec(flakyTrain), fakeEvalSpec(divergedTrain)];
    const { summary } = await runFakeSweep(dir, journal, [...trains, ...evals], {
      retries: 1,
      heapLimitMb: 96,
      timeLimitMs: () => 120_000,
    });
    const { results } = await readRun(dir);
    const byId = new Map(results.map((r) => [r.id, r]));
    const reason = (i: number): string => byId.get(trains[i]!.id)?.error?.reason ?? '';

    expect(results).toHaveLength(trains.length + evals.length); // nothing lost
    expect(summary).toMatchObject({ done: 5, diverged: 1, failed: 5, unfinished: 0 });
    expect(reason(0)).toContain('the job threw: greenhouse sensor 0 returned no readings');
    expect(reason(1)).toContain('exited with code 3');
    expect(reason(2)).toContain('killed by SIGKILL');
    expect(byId.get(trains[3]!.id)?.status).toBe('done');
    expect(reason(4)).toContain('out of memory');
    expect(reason(5)).toContain('diverged: step 7');
    expect(byId.get(trains[0]!.id)?.error?.logTail).toContain('fake train job');
    // Crashes are retried once; running out of memory and a divergence are not.
    const attempts = readJournal(journal);
    expect(behaviours.map((_, i) => attempts.get(trains[i]!.id))).toEqual([2, 2, 2, 1, 1, 1, 2, 1]);
    expect(byId.get(flakyTrain.id)?.status).toBe('done');
    expect(byId.get(evals[0]!.id)?.status).toBe('done');
    expect(byId.get(evals[1]!.id)?.status).toBe('done');
    // The evaluation of a diverged encoder is recorded, not run.
    expect(byId.get(evals[2]!.id)?.error?.reason).toContain(
      `train job ${divergedTrain.id} diverged`,
    );
    expect(attempts.get(evals[2]!.id)).toBeUndefined();
  });

  it('stops the sweep when a job finds the disk full, keeping what was written and recording nothing for it', async () => {
    const { dir, journal } = tempRun();
    const behaviours: Behaviour[] = ['ok', 'ok', 'disk-full', 'ok', 'ok'];
    const jobs = behaviours.map((b, i) => fakeTrainSpec(i, b));
    const stopped = runFakeSweep(dir, journal, jobs, { workers: 1, retries: 2 });
    await expect(stopped).rejects.toThrow(SweepStop);
    await expect(stopped).rejects.toMatchObject({ code: 'disk-full' });
    await expect(stopped).rejects.toThrow(
      new RegExp(
        `job ${jobs[2]!.id} ran out of disk space .*ENOSPC.*Free space or choose another directory with --out`,
      ),
    );
    const { results } = await readRun(dir);
    expect(results.map((r) => r.id).sort()).toEqual([jobs[0]!.id, jobs[1]!.id].sort());
    // Tried once (a full disk is not retried); nothing after it started.
    const attempts = readJournal(journal);
    expect(jobs.map((j) => attempts.get(j.id))).toEqual([1, 1, 1, undefined, undefined]);
  });

  it('stops a job that hangs past the time limit of its kind and does not retry it', async () => {
    const { dir, journal } = tempRun();
    const hang = fakeTrainSpec(0, 'hang');
    const { summary } = await runFakeSweep(dir, journal, [hang], {
      retries: 2,
      timeLimitMs: (kind) => (kind === 'train' ? 4000 : 60_000),
    });
    const { results } = await readRun(dir);
    expect(summary).toMatchObject({ failed: 1, unfinished: 0 });
    expect(results[0]?.error?.reason).toContain(
      'time limit exceeded: ran past 4 s (raise run.timeout.train',
    );
    expect(readJournal(journal).get(hang.id)).toBe(1);
  });
});
