import * as tf from '@tensorflow/tfjs';
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { setFastMatMul } from '../../runner/encoders/fast-matmul.ts';
import { buildEncoder } from '../../runner/encoders/index.ts';
import { createRng } from '../../runner/numeric/random.ts';
import type { TrainConfig } from '../../runner/config/types.ts';
import { batchObjective } from '../../runner/training/tfjs-engine.ts';
import { encoderConfig, trainConfig } from './fixtures.ts';
import { setupBackend } from './tf-setup.ts';

beforeAll(async () => {
  await setupBackend();
});
afterEach(() => setFastMatMul(true));

/**
 * Central differences (f(θ+h) − f(θ−h)) / 2h, error O(h²) (common practice), against the
 * gradient TF.js computes through our custom products, log-determinant and critics.
 */
async function checkGradients(
  train: TrainConfig,
  activation: 'relu' | 'tanh' | 'gelu' | 'elu',
  layerNorm: boolean,
): Promise<number> {
  const rng = createRng(11);
  const obsDim = 5;
  const dim = 3;
  const encoder = await buildEncoder(
    { config: encoderConfig({ widths: [6], activation, layerNorm }), obsDim, dim, seed: 0 },
    rng.fork('init'),
  );
  const a =
    train.critic === 'distance-identity'
      ? null
      : tf.variable(tf.tensor2d([0.9, 0.2, -0.1, 0.1, 1.1, 0.3, -0.2, 0.05, 0.8], [3, 3]));
  const batch = 8;
  const x = tf.tensor2d(
    Array.from({ length: batch * obsDim }, () => rng.normal()),
    [batch, obsDim],
  );
  const y = tf.tensor2d(
    Array.from({ length: batch * obsDim }, () => rng.normal()),
    [batch, obsDim],
  );
  const vars = a === null ? encoder.variables : [...encoder.variables, a];
  const loss = (): number =>
    tf.tidy(() => batchObjective(encoder, a, x, y, train).total.dataSync()[0]!);
  const { grads } = tf.variableGrads(() => batchObjective(encoder, a, x, y, train).total, vars);
  let worst = 0;
  const h = 1e-2;
  for (const v of vars) {
    const g = grads[v.name]!.dataSync();
    const values = Float32Array.from(v.dataSync());
    for (let i = 0; i < values.length; i += Math.max(1, Math.floor(values.length / 6))) {
      const probe = (delta: number): number => {
        const copy = Float32Array.from(values);
        copy[i] = copy[i]! + delta;
        v.assign(tf.tensor(copy, v.shape));
        return loss();
      };
      const numeric = (probe(h) - probe(-h)) / (2 * h);
      v.assign(tf.tensor(values, v.shape));
      worst = Math.max(worst, Math.abs(numeric - g[i]!) / Math.max(0.05, Math.abs(numeric)));
    }
  }
  tf.dispose([x, y, ...Object.values(grads)]);
  encoder.dispose();
  a?.dispose();
  return worst;
}

describe('gradients of the full loss', () => {
  it('match central differences: learned-A distance critic, penalty, symmetric, layer norm', async () => {
    expect(
      await checkGradients(
        trainConfig({ critic: 'distance', regulariser: 'penalty', loss: 'symmetric' }),
        'tanh',
        true,
      ),
    ).toBeLessThan(0.03);
  });

  it('match central differences: inner critic, moment KL, forward, gelu', async () => {
    expect(
      await checkGradients(
        trainConfig({ critic: 'inner', regulariser: 'kl', loss: 'forward', weight: 0.5 }),
        'gelu',
        false,
      ),
    ).toBeLessThan(0.03);
  });

  it('match central differences: A = I, no regulariser, backward, elu', async () => {
    expect(
      await checkGradients(
        trainConfig({ critic: 'distance-identity', regulariser: 'none', loss: 'backward' }),
        'elu',
        false,
      ),
    ).toBeLessThan(0.03);
  });

  it('match central differences: fused ReLU layers (the fast path), penalty, symmetric', async () => {
    expect(
      await checkGradients(
        trainConfig({ critic: 'distance', regulariser: 'penalty', loss: 'symmetric' }),
        'relu',
        false,
      ),
    ).toBeLessThan(0.03);
  });

  it('match central differences with TF.js default gradients too', async () => {
    setFastMatMul(false);
    expect(
      await checkGradients(
        trainConfig({ critic: 'distance', regulariser: 'kl', loss: 'symmetric' }),
        'tanh',
        false,
      ),
    ).toBeLessThan(0.03);
  });
});
