import { mkdirSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readRun } from '../../runner/store/read-run.ts';
import type { JobResult } from '../../runner/store/result.ts';
import { writePlanFile, writeResultAtomic } from '../../runner/store/write-result.ts';
import { fakeEvalSpec, fakeTrainSpec } from '../fixtures/execute/fake-plan.ts';
import { tempRun } from '../fixtures/execute/fake-sweep.ts';

function resultOf(spec: JobResult['spec'], value: number): JobResult {
  return {
    id: spec.id,
    kind: spec.kind,
    status: 'done',
    spec,
    metrics: [{ suite: 'forecast', metric: 'forecast_nmse', level: 1, source: 'fitted', value }],
    info: {},
    artifacts: [],
    provenance: {
      midpathVersion: '0.1.0',
      gitCommit: null,
      nodeVersion: process.version,
      backend: 'test',
      seed: spec.seed,
      startedAt: '2026-01-01T00:00:00.000Z',
      wallSeconds: 1,
      peakRssBytes: 1,
      hostname: 'h',
    },
  };
}

describe('writeResultAtomic and readRun', () => {
  it('round-trips the plan and results in plan order, leaving no temporary files', async () => {
    const { dir } = tempRun();
    const train = fakeTrainSpec(0);
    const evaluate = fakeEvalSpec(train);
    writePlanFile(dir, { experiment: 'e', createdAt: 'now', config: {}, jobs: [train, evaluate] });
    await writeResultAtomic(dir, resultOf(evaluate, 2));
    const path = await writeResultAtomic(dir, resultOf(train, 1));
    expect(path).toBe(join(dir, 'jobs', train.id, 'result.json'));
    const run = await readRun(dir);
    expect(run.problems).toEqual([]);
    expect(run.plan?.jobs).toHaveLength(2);
    expect(run.results.map((r) => r.id)).toEqual([train.id, evaluate.id]);
    expect(readdirSync(join(dir, 'jobs', train.id))).toEqual(['result.json']);
  });

  it('reports corrupt, mismatched and missing files by code and keeps reading', async () => {
    const { dir } = tempRun();
    const good = fakeTrainSpec(1);
    await writeResultAtomic(dir, resultOf(good, 1));
    mkdirSync(join(dir, 'jobs', 'aaaa'), { recursive: true });
    writeFileSync(join(dir, 'jobs', 'aaaa', 'result.json'), '{"id": "aaaa", "kind": "tra'); // torn write
    mkdirSync(join(dir, 'jobs', 'bbbb'), { recursive: true });
    writeFileSync(join(dir, 'jobs', 'bbbb', 'result.json'), JSON.stringify(resultOf(good, 1)));
    mkdirSync(join(dir, 'jobs', 'cccc'), { recursive: true });
    writeFileSync(
      join(dir, 'jobs', 'cccc', 'result.json'),
      JSON.stringify({ id: 'cccc', kind: 'train', status: 'finished' }),
    );
    const run = await readRun(dir);
    expect(run.plan).toBeNull();
    expect(run.results.map((r) => r.id)).toEqual([good.id]);
    expect(run.problems.map((p) => p.code).sort()).toEqual(
      [
        'store-corrupt-file',
        'store-corrupt-file',
        'store-missing-plan',
        'store-mismatched-id',
      ].sort(),
    );
    expect(run.problems.find((p) => p.file.includes('cccc'))?.message).toContain('"status"');
  });

  it('says the directory is not a run when it does not exist', async () => {
    const run = await readRun(join(tempRun().dir, 'nowhere'));
    expect(run.problems.map((p) => p.code)).toEqual(['store-not-a-run']);
  });

  it('refuses a job id that would leave the jobs directory', async () => {
    const { dir } = tempRun();
    const bad = { ...resultOf(fakeTrainSpec(2), 1), id: '../escape' };
    await expect(writeResultAtomic(dir, bad)).rejects.toMatchObject({ code: 'store-bad-job-id' });
  });

  it('reports an unwritable directory as store-unwritable', async () => {
    const { dir } = tempRun();
    mkdirSync(dir, { recursive: true });
    writeFileSync(join(dir, 'jobs'), 'a file where the jobs directory belongs');
    await expect(writeResultAtomic(dir, resultOf(fakeTrainSpec(3), 1))).rejects.toMatchObject({
      code: 'store-unwritable',
    });
  });
});
