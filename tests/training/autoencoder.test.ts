import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import { encoderConfig, quietHooks, smallData, trainConfig, trainSpec } from './fixtures.ts';
import { heldOutR2 } from './linear-probe.ts';

describe('autoencoder baseline', () => {
  it('learns codes that carry the latent state (better than its untrained encoder)', async () => {
    // Same encoder shape and budget as the contrastive method; with a linear observation map
    // the reconstruction optimum spans the principal subspace (Baldi & Hornik, 1989), which
    // holds the state, so a trained code must predict it better than the random initial one.
    const data = smallData({ noise: 0.1 });
    const dataset = await loadDataset(data, '.');
    const spec = (steps: number) =>
      trainSpec({
        data,
        method: { name: 'autoencoder', label: 'ae' },
        encoder: encoderConfig({ widths: [32] }),
        train: trainConfig({ steps, batch: 64, lr: 0.005, logEvery: 100 }),
      });
    const trained = await fitMethod(spec(150).method, dataset, spec(150), quietHooks());
    const untrained = await fitMethod(spec(0).method, dataset, spec(0), quietHooks());
    const r2 = heldOutR2(trained.representation, dataset.train, dataset.test);
    expect(r2).toBeGreaterThan(
      heldOutR2(untrained.representation, dataset.train, dataset.test) + 0.1,
    );
    expect(trained.info.finalReconstruction).toBeLessThan(0.2);
  });
});
