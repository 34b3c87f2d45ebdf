import * as tf from '@tensorflow/tfjs';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { initDenseParams } from '../../runner/encoders/dense-layout.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { createEngine } from '../../runner/training/engine.ts';
import { loadEngines } from '../../runner/training/engines.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import { PairSampler } from '../../runner/training/pair-sampler.ts';
import { encoderConfig, quietHooks, smallData, trainConfig, trainSpec } from './fixtures.ts';
import { heldOutR2 } from './linear-probe.ts';
import { setupBackend } from './tf-setup.ts';

beforeAll(async () => {
  await setupBackend();
  await loadEngines();
});

describe('contrastive training on the linear-Gaussian dataset', () => {
  it('recovers the latent state up to a linear map', async () => {
    // Threshold 0.9: with a linear observation map the state is a linear function of the
    // noiseless observation, and PCA on the same data reaches R² ≈ 0.99 — the ceiling of a
    // 4-d linear summary; the same encoder untrained reaches ≈ 0.58 (measured), so 0.9 is
    // only met by learning, and leaves room for a 300-step budget.
    const data = smallData({ noise: 0.1 });
    const dataset = await loadDataset(data, '.');
    const spec = (steps: number) =>
      trainSpec({
        data,
        encoder: encoderConfig({ widths: [32] }),
        train: trainConfig({ steps, batch: 64, logEvery: 100 }),
      });
    const trained = await fitMethod(spec(300).method, dataset, spec(300), quietHooks());
    const untrained = await fitMethod(spec(0).method, dataset, spec(0), quietHooks());
    const r2 = heldOutR2(trained.representation, dataset.train, dataset.test);
    expect(r2).toBeGreaterThan(0.9);
    expect(r2).toBeGreaterThan(
      heldOutR2(untrained.representation, dataset.train, dataset.test) + 0.2,
    );
    expect(trained.curves.map((c) => c.step)).toEqual([100, 200, 300]);
    expect(trained.curves[2]!.trainLoss).toBeLessThan(trained.curves[0]!.trainLoss);
    expect(trained.representation.critic?.A.rows).toBe(4);
  });
});

describe('robustness', () => {
  it('ends a run whose loss blows up as diverged, naming the step and the term', async () => {
    // Fixture: no clipping and an absurd learning rate drive ψ to overflow within steps.
    const spec = trainSpec({ train: trainConfig({ steps: 200, lr: 1e30, clip: 0, logEvery: 10 }) });
    const dataset = await loadDataset(spec.data, '.');
    const lines: string[] = [];
    const fit = await fitMethod(spec.method, dataset, spec, quietHooks(lines));
    expect(fit.status).toBe('diverged');
    expect(fit.reason).toMatch(
      /^step \d+: the (InfoNCE term|regulariser term|gradient norm) is (NaN|-?Infinity); last finite loss /,
    );
    expect(lines.some((l) => l.startsWith('diverged at step'))).toBe(true);
  });

  it('is deterministic for a seed and differs across seeds', async () => {
    const data = smallData({ episodes: 10, steps: 20 });
    const dataset = await loadDataset(data, '.');
    const run = async (seed: number) => {
      const spec = trainSpec({ data, seed, train: trainConfig({ steps: 20, logEvery: 10 }) });
      const fit = await fitMethod(spec.method, dataset, spec, quietHooks());
      return fit.representation.encode(dataset.test[0]!.obs, 5);
    };
    const [a, b, c] = [await run(3), await run(3), await run(4)];
    expect(Array.from(a)).toEqual(Array.from(b));
    expect(Array.from(a)).not.toEqual(Array.from(c));
  });

  it('leaks no tensors across steps', async () => {
    const spec = trainSpec({ train: trainConfig({ regulariser: 'kl', critic: 'distance' }) });
    const dataset = await loadDataset(smallData({ episodes: 10, steps: 20 }), '.');
    const engine = await createEngine('tfjs', {
      encoder: spec.encoder,
      obsDim: dataset.obsDim,
      dim: 4,
      train: spec.train,
      threads: 1,
      seed: 0,
    });
    const sampler = new PairSampler(dataset.train, 0.8);
    const rng = createRng(0);
    const step = () => {
      const b = sampler.sample(rng, 16);
      engine.step(b.x, b.y, b.size);
      engine.evaluate(b.x, b.y, b.size);
    };
    step(); // Adam creates its moment slots on the first step
    const before = tf.memory().numTensors;
    for (let i = 0; i < 5; i++) step();
    expect(tf.memory().numTensors).toBe(before);
    engine.dispose();
  });

  it('reports statistics before the update and round-trips parameters (engine seam)', async () => {
    const spec = trainSpec();
    const options = {
      encoder: spec.encoder,
      obsDim: 12,
      dim: 4,
      train: spec.train,
      threads: 1,
      seed: 0,
    };
    const engine = await createEngine('tfjs', options);
    const init = initDenseParams(spec.encoder, 12, 4, 'distance', createRng(5));
    engine.init(init);
    expect(engine.getParams().map((p) => Array.from(p))).toEqual(init.map((p) => Array.from(p)));
    const rng = createRng(1);
    const x = Float32Array.from({ length: 8 * 12 }, () => rng.normal());
    const y = Float32Array.from({ length: 8 * 12 }, () => rng.normal());
    const evaluated = engine.evaluate(x, y, 8);
    const stepped = engine.step(x, y, 8);
    expect(stepped.loss).toBeCloseTo(evaluated.loss, 5);
    expect(engine.evaluate(x, y, 8).loss).not.toBeCloseTo(evaluated.loss, 5);
    engine.dispose();
  });
});
