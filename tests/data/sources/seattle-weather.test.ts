import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../../runner/data/load-dataset.ts';
import { makeDataConfig } from '../make-data-config.ts';

const pkgDir = join(dirname(createRequire(import.meta.url).resolve('vega-datasets')), '..');

describe('seattle-weather source (NOAA via vega-datasets)', () => {
  it('reads the file the package catalogues: same SHA-1 as its datapackage.json', () => {
    // The package's Data Package descriptor (Data Package Standard v2) records a hash of
    // every resource; matching it shows we read the published file unchanged.
    const catalogue = JSON.parse(readFileSync(join(pkgDir, 'datapackage.json'), 'utf8')) as {
      resources: { path: string; hash: string; bytes: number; licenses: { title: string }[] }[];
    };
    const entry = catalogue.resources.find((r) => r.path === 'seattle-weather.csv')!;
    const bytes = readFileSync(join(pkgDir, 'data', 'seattle-weather.csv'));
    expect(bytes.length).toBe(entry.bytes);
    // The catalogue's sha1 is Git's blob id: sha1 of "blob <size>\0" followed by the bytes
    // (Pro Git, 2nd ed., §10.2 "Git Objects").
    const sha1 = createHash('sha1').update(`blob ${bytes.length}\0`).update(bytes).digest('hex');
    expect(`sha1:${sha1}`).toBe(entry.hash);
    expect(entry.licenses[0]!.title).toBe('U.S. Government Dataset');
  });

  it('cuts 1461 days into consecutive windows, in calendar order, with raw values intact', async () => {
    const ds = await loadDataset(
      makeDataConfig({
        source: 'seattle-weather',
        steps: 28,
        standardise: false,
        split: { train: 1, val: 0, test: 0 },
      }),
      '.',
    );
    // 2012-01-01 … 2015-12-31 is 1461 days (three 365-day years and leap year 2012): 52 windows.
    expect(ds.train.length).toBe(52);
    expect(ds.obsDim).toBe(4);
    // First row of the CSV: 2012-01-01,0.0,12.8,5.0,4.7 (precipitation, temp_max, temp_min, wind).
    expect(Array.from(ds.train[0]!.obs.subarray(0, 4))).toEqual([0, 12.8, 5, 4.7].map(Math.fround));
    expect(ds.provenance?.join(' ')).toContain('NOAA');
    // temp_max ≥ temp_min on every day.
    for (const ep of ds.train)
      for (let t = 0; t < ep.steps; t++)
        expect(ep.obs[4 * t + 1]!).toBeGreaterThanOrEqual(ep.obs[4 * t + 2]!);
  });
});
