import { describe, expect, it } from 'vitest';
import type { DataSource } from '../../runner/config/types.ts';
import { DataError } from '../../runner/data/data-error.ts';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { hashDataset } from './hash-dataset.ts';
import { makeDataConfig } from './make-data-config.ts';

const small = { episodes: 10, steps: 12, obsDim: 5, image: 8 };
const generated: DataSource[] = [
  'linear-gaussian',
  'rover-maze',
  'swinging-lamp',
  'lorenz',
  'seattle-weather',
];

describe('loadDataset', () => {
  it.each(generated)('%s: same seed, same bytes; another seed, other bytes', async (source) => {
    const a = await loadDataset(makeDataConfig({ source, ...small, seed: 3 }), '.');
    const b = await loadDataset(makeDataConfig({ source, ...small, seed: 3 }), '.');
    const c = await loadDataset(makeDataConfig({ source, ...small, seed: 4 }), '.');
    expect(hashDataset(a)).toBe(hashDataset(b));
    expect(hashDataset(a)).not.toBe(hashDataset(c));
  });

  it('splits by whole episodes with the configured fractions', async () => {
    const ds = await loadDataset(
      makeDataConfig({ episodes: 20, steps: 5, obsDim: 3, standardise: false }),
      '.',
    );
    expect([ds.train.length, ds.val.length, ds.test.length]).toEqual([14, 2, 4]);
    const all = [...ds.train, ...ds.val, ...ds.test];
    expect(new Set(all.map((e) => e.obs)).size).toBe(20); // no episode in two splits
  });

  it('fits standardisation on training episodes only', async () => {
    const cfg = makeDataConfig({ source: 'rover-maze', episodes: 30, steps: 20, obsDim: 4 });
    const ds = await loadDataset(cfg, '.');
    for (let k = 0; k < 4; k++) {
      let sum = 0;
      let sq = 0;
      let n = 0;
      for (const ep of ds.train)
        for (let t = 0; t < ep.steps; t++) {
          const x = ep.obs[t * 4 + k]!;
          sum += x;
          sq += x * x;
          n++;
        }
      expect(sum / n).toBeCloseTo(0, 5);
      expect(sq / n).toBeCloseTo(1, 4);
    }
    // The same data unstandardised, mapped by the stored statistics, gives the same values.
    const raw = await loadDataset({ ...cfg, standardise: false }, '.');
    const { mean, scale } = ds.standardisation!;
    expect(ds.test[0]!.obs[3]).toBeCloseTo((raw.test[0]!.obs[3]! - mean[3]!) / scale[3]!, 5);
  });

  it('rejects episodes shorter than the longest horizon (episode-too-short)', async () => {
    await expect(
      loadDataset(makeDataConfig({ steps: 8 }), '.', { minSteps: 9 }),
    ).rejects.toMatchObject({
      code: 'episode-too-short',
      index: 'episode 0',
    });
  });

  it('rejects too few episodes to split (too-few-episodes)', async () => {
    const error = await loadDataset(makeDataConfig({ episodes: 2 }), '.').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(DataError);
    expect((error as DataError).code).toBe('too-few-episodes');
  });

  it('rejects out-of-range options (bad-config)', async () => {
    await expect(
      loadDataset(makeDataConfig({ split: { train: 0.5, val: 0.1, test: 0.1 } }), '.'),
    ).rejects.toMatchObject({
      code: 'bad-config',
      index: 'data.split',
    });
  });
});
