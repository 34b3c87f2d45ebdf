import { mkdirSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import type { JobSpec } from '../../runner/plan/job-spec.ts';
import type { JobResult } from '../../runner/store/result.ts';
import type { RunStatus } from '../../runner/store/run-status.ts';
import { writePlanFile, writeResultAtomic } from '../../runner/store/write-result.ts';
import { fakeEvalSpec, fakeTrainSpec } from '../fixtures/execute/fake-plan.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { tempRun } from '../fixtures/execute/fake-sweep.ts';

function resultOf(
  spec: JobSpec,
  status: JobResult['status'],
  wallSeconds: number,
  reason?: string,
): JobResult {
  return {
    id: spec.id,
    kind: spec.kind,
    status,
    spec,
    metrics: [],
    info: {},
    artifacts: [],
    provenance: {
      midpathVersion: '0.1.0',
      gitCommit: null,
      nodeVersion: process.version,
      backend: 'test',
      seed: spec.seed,
      startedAt: '2026-01-01T00:00:00.000Z',
      wallSeconds,
      peakRssBytes: 0,
      hostname: 'h',
    },
    ...(reason === undefined ? {} : { error: { reason, logTail: '', attempts: 1 } }),
  };
}

describe('midpath status (end to end)', () => {
  it('counts states, lists failures and estimates the time left per kind', async () => {
    const { dir } = tempRun();
    const trains = [0, 1, 2, 3, 4].map((i) => fakeTrainSpec(i));
    const evals = trains.map((t) => fakeEvalSpec(t));
    writePlanFile(dir, {
      experiment: 'greenhouse',
      createdAt: 'now',
      config: {},
      jobs: [...trains, ...evals],
    });
    await writeResultAtomic(dir, resultOf(trains[0]!, 'done', 10));
    await writeResultAtomic(dir, resultOf(trains[1]!, 'done', 30));
    await writeResultAtomic(dir, resultOf(trains[2]!, 'failed', 1, 'worker killed by SIGKILL'));
    await writeResultAtomic(dir, resultOf(trains[3]!, 'diverged', 5, 'diverged: step 7'));
    await writeResultAtomic(dir, resultOf(evals[0]!, 'done', 2));
    // trains[4] is held by a live runner (this process): running.
    mkdirSync(join(dir, 'jobs', trains[4]!.id), { recursive: true });
    const lock = { pid: process.pid, hostname: hostname(), runId: 'r', createdAt: 'now' };
    writeFileSync(join(dir, 'jobs', trains[4]!.id, '.lock'), JSON.stringify(lock));

    const io = bufferIo();
    expect(await main(['status', dir, '--json'], io)).toBe(1);
    const status = JSON.parse(io.stdout.join('')) as RunStatus;
    expect(status.counts).toEqual({ done: 3, running: 1, failed: 1, diverged: 1, pending: 4 });
    expect(status.failures.map((f) => f.reason)).toEqual([
      'worker killed by SIGKILL',
      'diverged: step 7',
    ]);
    // Mean train cost (10 + 30 + 5) / 3 = 15 s × 1 left; evaluate 2 s × 4 left; ÷ 1 running.
    expect(status.costs.train).toEqual({ meanSeconds: 15, remaining: 1 });
    expect(status.etaSeconds).toBeCloseTo(15 + 8, 9);

    const text = bufferIo();
    await main(['status', dir], text);
    expect(text.text()).toContain('10 jobs: 3 done, 1 running, 1 failed, 1 diverged, 4 pending');
    expect(text.text()).toContain('worker killed by SIGKILL');
  });

  it('says when the directory is not a run', async () => {
    const io = bufferIo();
    expect(await main(['status', join(tempRun().dir, 'none')], io)).toBe(2);
    expect(io.text()).toContain('store-not-a-run');
  });
});

describe('status with a scheduler view', () => {
  it('takes a missing result plus an ended task as a failure with the scheduler reason', async () => {
    const { readRunStatus } = await import('../../runner/store/run-status.ts');
    const { dir } = tempRun();
    const trains = [fakeTrainSpec(0), fakeTrainSpec(1), fakeTrainSpec(2)];
    writePlanFile(dir, { experiment: 'g', createdAt: 'now', config: {}, jobs: trains });
    await writeResultAtomic(dir, resultOf(trains[2]!, 'failed', 1, 'the job threw: x'));
    const external = new Map([
      [trains[0]!.id, { phase: 'ended' as const, reason: 'SLURM task 7_0 ended TIMEOUT' }],
      [trains[1]!.id, { phase: 'queued' as const, reason: '' }],
      [trains[2]!.id, { phase: 'queued' as const, reason: '' }],
    ]);
    const status = await readRunStatus(dir, external);
    expect(status.counts).toMatchObject({ failed: 1, pending: 2 });
    expect(status.failures).toEqual([
      expect.objectContaining({ reason: 'SLURM task 7_0 ended TIMEOUT' }),
    ]);
  });
});
