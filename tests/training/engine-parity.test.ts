import { beforeAll, describe, expect, it } from 'vitest';
import { initDenseParams } from '../../runner/encoders/dense-layout.ts';
import { createRng } from '../../runner/numeric/random.ts';
import {
  createEngine,
  getEngineFactory,
  type EngineOptions,
} from '../../runner/training/engine.ts';
import { loadEngines } from '../../runner/training/engines.ts';
import { encoderConfig, trainConfig } from './fixtures.ts';
import { setupBackend } from './tf-setup.ts';

await loadEngines();
const hasNative = getEngineFactory('native') !== undefined;

beforeAll(async () => {
  await setupBackend();
});

describe('engine parity', () => {
  // Two independent implementations of the same step (TF.js autodiff vs hand-written C++)
  // must agree from identical weights and batches; skipped where the addon is not built.
  it.skipIf(!hasNative)('tfjs and native give the same loss curve for 15 steps', async () => {
    const options: EngineOptions = {
      encoder: encoderConfig({ widths: [16, 16], activation: 'tanh' }),
      obsDim: 6,
      dim: 3,
      train: trainConfig({ lr: 0.01, clip: 0.5, regulariser: 'kl', weight: 0.3 }),
      threads: 1,
      seed: 0,
    };
    const init = initDenseParams(options.encoder, 6, 3, 'distance', createRng(4));
    const engines = [await createEngine('tfjs', options), await createEngine('native', options)];
    engines.forEach((e) => e.init(init));
    const rng = createRng(8);
    for (let step = 0; step < 15; step++) {
      const x = Float32Array.from({ length: 32 * 6 }, () => rng.normal());
      const y = Float32Array.from({ length: 32 * 6 }, () => rng.normal());
      const [a, b] = engines.map((e) => e.step(x, y, 32));
      expect(b!.loss).toBeCloseTo(a!.loss, 3);
      expect(b!.gradNorm).toBeCloseTo(a!.gradNorm, 3);
    }
    engines.forEach((e) => e.dispose());
  });
});
