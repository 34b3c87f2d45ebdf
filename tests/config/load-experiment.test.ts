import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadExperiment, nameFromFile } from '../../runner/config/load-experiment.ts';

const good = resolve('tests/fixtures/config/good');

describe('loadExperiment', () => {
  it('resolves the demo with every default filled in and methods written out', async () => {
    const result = await loadExperiment('configs/demo.yaml');
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { config } = result;
    expect(config.name).toBe('demo');
    // Defaults from configs/schema.json for keys the demo leaves out.
    expect(config.train.lr).toBe(0.001);
    expect(config.data.split).toEqual({ train: 0.7, val: 0.1, test: 0.2 });
    expect(config.run).toEqual({
      maxJobs: 100000,
      retries: 1,
      jobsPerWorker: 20,
      timeout: { train: 60, evaluate: 30 },
    });
    expect(config.methods).toEqual([
      { name: 'contrastive', label: 'contrastive' },
      { name: 'pca', label: 'pca' },
      { name: 'sfa', label: 'sfa' },
      { name: 'raw', label: 'raw' },
    ]);
    expect(result.baseDir).toBe(resolve('configs'));
  });

  it('merges an extends chain deeply: mappings key by key, lists replaced', async () => {
    const result = await loadExperiment(join(good, 'child.yaml'));
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { config } = result;
    expect(config.name).toBe('greenhouse-night');
    expect(config.data).toMatchObject({
      source: 'linear-gaussian',
      episodes: 40,
      steps: 36,
      obsDim: 12,
    });
    expect(config.train).toMatchObject({ steps: 50, batch: 32, discount: 0.95 });
    expect(config.methods.map((m) => m.name)).toEqual(['contrastive', 'pca']);
    expect(config.sweep.seeds).toEqual([3, 5]);
  });

  it('locates an error inherited from a base file in the base file', async () => {
    const result = await loadExperiment(join(good, 'child-of-broken-base.yaml'));
    expect(result).toMatchObject({
      ok: false,
      errors: [
        { code: 'out-of-range', file: 'tests/fixtures/config/broken-base.yaml', line: 3, col: 10 },
      ],
    });
  });

  it('shows file names relative to cwd when the file is inside it', async () => {
    const result = await loadExperiment('child-of-broken-base.yaml', { cwd: good });
    expect(result.ok ? '' : result.errors[0]?.file).toBe(
      resolve('tests/fixtures/config/broken-base.yaml'),
    );
    const inside = await loadExperiment('bad/empty-axis.yaml', {
      cwd: resolve('tests/fixtures/config'),
    });
    expect(inside.ok ? '' : inside.errors[0]?.file).toBe('bad/empty-axis.yaml');
  });

  it('defaults the name to the file name, made valid', () => {
    expect(nameFromFile('/x/Night Sweep.yaml')).toBe('night-sweep');
    expect(nameFromFile('/x/--.yaml')).toBe('experiment');
  });
});

describe('--set overrides', () => {
  const demo = 'configs/demo.yaml';

  it('overrides values after merging, typed by the schema', async () => {
    const result = await loadExperiment(demo, {
      overrides: [
        'dim=12',
        'name=2024',
        'train.discount=0.95',
        'sweep.axes.train.weight=[0.1, 10]',
        'methods=[pca]',
      ],
    });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.config.dim).toBe(12);
    expect(result.config.name).toBe('2024'); // text in the schema, so not the number 2024
    expect(result.config.train.discount).toBe(0.95);
    expect(result.config.sweep.axes['train.weight']).toEqual([0.1, 10]);
    expect(result.config.methods).toEqual([{ name: 'pca', label: 'pca' }]);
  });

  it('reports override errors against `--set`, line = the override number', async () => {
    const result = await loadExperiment(demo, {
      overrides: ['dim=4', 'train.stpes=10', 'train.steps=-1', 'nonsense', 'eval.horizons=[1, 2'],
    });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors.map((e) => `${e.file}:${e.line}:${e.col} ${e.code}`)).toEqual([
      '--set:2:7 unknown-key',
      '--set:3:13 out-of-range',
      '--set:4:1 bad-override',
      '--set:5:15 bad-override',
    ]);
    expect(result.errors[0]?.hint).toBe('did you mean `steps`?');
  });

  it('checks overridden sweep axes like axes in the file', async () => {
    const result = await loadExperiment(demo, {
      overrides: ['sweep.axes.train.discount=[0.5, 1.5]'],
    });
    expect(result).toMatchObject({
      ok: false,
      errors: [{ code: 'bad-axis-value', file: '--set', line: 1, col: 27 }],
    });
  });
});
