import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import {
  loadRepresentation,
  saveRepresentation,
} from '../../runner/execute/jobs/representation-files.ts';
import { trainJob } from '../../runner/execute/jobs/train-job.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import type { CurvePoint } from '../../runner/training/representation.ts';
import { encoderConfig, quietHooks, smallData, trainConfig, trainSpec } from './fixtures.ts';

const dirs: string[] = [];
async function tempDir(): Promise<string> {
  const dir = await mkdtemp(join(tmpdir(), 'midpath-training-'));
  dirs.push(dir);
  return dir;
}
afterAll(async () => {
  await Promise.all(dirs.map((d) => rm(d, { recursive: true, force: true })));
});

describe('representation files', () => {
  const data = smallData({ episodes: 12, steps: 20 });
  for (const [name, encoder] of [
    ['contrastive', encoderConfig({ layerNorm: true, activation: 'gelu' })],
    ['autoencoder', encoderConfig()],
    ['sfa', encoderConfig()],
  ] as const) {
    it(`reload a ${name} representation that encodes identically`, async () => {
      const spec = trainSpec({
        data,
        encoder,
        method: { name, label: name },
        train: trainConfig({ steps: 10, logEvery: 5 }),
      });
      const dataset = await loadDataset(data, '.');
      const fit = await fitMethod(spec.method, dataset, spec, quietHooks());
      const dir = await tempDir();
      await saveRepresentation(dir, fit.serialised);
      const reloaded = await loadRepresentation(dir);
      const e = dataset.test[0]!;
      expect(Array.from(reloaded.encode(e.obs, e.steps))).toEqual(
        Array.from(fit.representation.encode(e.obs, e.steps)),
      );
      expect(reloaded.critic?.A.data).toEqual(fit.representation.critic?.A.data);
    });
  }

  it('rejects a truncated array file with a code', async () => {
    const spec = trainSpec({ data, method: { name: 'pca', label: 'pca' } });
    const fit = await fitMethod(spec.method, await loadDataset(data, '.'), spec, quietHooks());
    const dir = await tempDir();
    await saveRepresentation(dir, fit.serialised);
    await writeFile(join(dir, 'representation.W.f32'), new Uint8Array(7));
    await expect(loadRepresentation(dir)).rejects.toMatchObject({ code: 'representation-file' });
  });
});

describe('train job', () => {
  it('saves representation, curves and spec, and reports training metrics', async () => {
    const spec = trainSpec({
      data: smallData({ episodes: 12, steps: 20 }),
      train: trainConfig({ steps: 20, logEvery: 10 }),
    });
    const dir = await tempDir();
    const lines: string[] = [];
    const outcome = await trainJob(spec, {
      artifactsDir: dir,
      artifactsOf: () => dir,
      threads: 1,
      log: (l) => lines.push(l),
      signal: new AbortController().signal,
    });
    expect(outcome.status).toBe('done');
    expect(outcome.metrics.map((m) => m.metric)).toEqual([
      'final_train_loss',
      'final_val_loss',
      'final_train_accuracy',
      'final_val_accuracy',
    ]);
    const curves = JSON.parse(await readFile(join(dir, 'curves.json'), 'utf8')) as CurvePoint[];
    expect(curves.map((c) => c.step)).toEqual([10, 20]);
    expect(outcome.metrics[0]!.value).toBe(curves[1]!.trainLoss);
    expect(outcome.info.backend).toMatch(/^tfjs-(wasm-simd|wasm|cpu|tensorflow) \(\d+ threads?\)$/);
    expect(JSON.parse(await readFile(join(dir, 'spec.json'), 'utf8'))).toEqual(spec);
    expect((await loadRepresentation(dir)).dim).toBe(4);
  });

  it('returns diverged (not a crash) for a run forced to blow up', async () => {
    const spec = trainSpec({
      data: smallData({ episodes: 12, steps: 20 }),
      train: trainConfig({ steps: 100, lr: 1e30, clip: 0, logEvery: 10 }),
    });
    const dir = await tempDir();
    const outcome = await trainJob(spec, {
      artifactsDir: dir,
      artifactsOf: () => dir,
      threads: 1,
      log: () => undefined,
      signal: new AbortController().signal,
    });
    expect(outcome.status).toBe('diverged');
    if (outcome.status === 'diverged') expect(outcome.reason).toMatch(/^step \d+: /);
  });
});
