import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadExperiment } from '../../runner/config/load-experiment.ts';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import { quietHooks, trainSpec } from './fixtures.ts';

describe('configs/examples/plugin-encoder.yaml', () => {
  it('resolves and trains its plugin encoder (shortened budget)', async () => {
    const loaded = await loadExperiment(
      path.resolve(import.meta.dirname, '../../configs/examples/plugin-encoder.yaml'),
    );
    if (!loaded.ok) throw new Error(JSON.stringify(loaded.errors));
    const { config, baseDir } = loaded;
    const spec = trainSpec({
      data: config.data,
      encoder: config.encoder,
      dim: config.dim,
      train: { ...config.train, steps: 20, logEvery: 10 },
      baseDir,
    });
    const dataset = await loadDataset(config.data, baseDir);
    const fit = await fitMethod(spec.method, dataset, spec, quietHooks());
    expect(fit.status).toBe('done');
    expect(fit.info.engine).toBe('tfjs'); // 'auto' never sends a plugin to the native engine
    expect(fit.curves).toHaveLength(2);
    expect(fit.representation.encode(dataset.test[0]!.obs, 3)).toHaveLength(3 * config.dim);
  });
});
