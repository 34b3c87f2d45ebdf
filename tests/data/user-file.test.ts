import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import type { DataFileConfig } from '../../runner/config/types.ts';
import { DataError } from '../../runner/data/data-error.ts';
import type { DataErrorCode } from '../../runner/data/data-error.ts';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { makeDataConfig } from './make-data-config.ts';

const fixtures = fileURLToPath(new URL('../fixtures/data/', import.meta.url));

function fileConfig(
  path: string,
  extra: Partial<DataFileConfig> = {},
): ReturnType<typeof makeDataConfig> {
  return makeDataConfig({
    source: 'file',
    file: {
      path,
      episodeColumn: 'episode',
      stepColumn: 'step',
      state: path.endsWith('.npy') ? [] : ['pos'],
      ...extra,
    },
  });
}

async function loadError(
  path: string,
  minSteps = 2,
  extra: Partial<DataFileConfig> = {},
): Promise<DataError> {
  const result = await loadDataset(fileConfig(path, extra), fixtures, { minSteps }).catch(
    (e: unknown) => e,
  );
  expect(result).toBeInstanceOf(DataError);
  return result as DataError;
}

describe('user files: good files', () => {
  it.each(['good.csv', 'good.jsonl'])(
    '%s: 6 episodes × 5 steps, 3 features, state pos',
    async (path) => {
      const ds = await loadDataset(fileConfig(path), fixtures, { minSteps: 5 });
      expect(ds.train.length + ds.val.length + ds.test.length).toBe(6);
      expect([ds.obsDim, ds.stateDim]).toEqual([3, 1]);
      for (const ep of ds.train) expect(Array.from(ep.state!)).toEqual([0, 0.5, 1, 1.5, 2]);
    },
  );

  it('CSV and JSON Lines of the same table give the same bytes', async () => {
    const a = await loadDataset(fileConfig('good.csv'), fixtures);
    const b = await loadDataset(fileConfig('good.jsonl'), fixtures);
    expect(a.train.map((e) => Array.from(e.obs))).toEqual(b.train.map((e) => Array.from(e.obs)));
  });

  it('good.npy: [6, 5, 3] written by NumPy', async () => {
    const ds = await loadDataset(fileConfig('npy/good.npy'), fixtures);
    expect(ds.obsDim).toBe(3);
    expect(ds.train[0]!.steps).toBe(5);
  });

  it('explicit feature list picks and orders columns', async () => {
    const ds = await loadDataset(
      {
        ...fileConfig('good.csv', { features: ['x3', 'x1'] }),
        standardise: false,
        split: { train: 1, val: 0, test: 0 },
      },
      fixtures,
    );
    // good.csv line 2: bay-0,0,0.0,0.8415,0.9093 → x3, x1 = 0.9093, 0.
    expect(Array.from(ds.train[0]!.obs.subarray(0, 2))).toEqual([Math.fround(0.9093), 0]);
  });
});

// Each malformed fixture, the code it must raise, and where (1-based file line, or index).
const cases: [string, DataErrorCode, { row?: number; index?: string }, number?][] = [
  ['nan.csv', 'non-finite', { row: 10, index: "column 'x2'" }],
  ['non-numeric.csv', 'non-numeric', { row: 13, index: "column 'x2'" }],
  ['ragged-row.csv', 'ragged-row', { row: 8 }],
  ['unordered.csv', 'unordered-steps', { row: 16, index: "episode 'bay-2'" }],
  ['missing-steps.csv', 'missing-steps', { row: 20, index: "episode 'bay-3'" }],
  ['short.csv', 'episode-too-short', { row: 27, index: "episode 'bay-5'" }, 4],
  ['two-episodes.csv', 'too-few-episodes', { index: 'split val' }],
  ['missing-column.csv', 'missing-column', { row: 1, index: "column 'step'" }],
  ['empty.csv', 'empty-file', { row: 1 }],
  ['header-only.csv', 'empty-file', { row: 1 }],
  ['nan.jsonl', 'non-finite', { row: 8 }],
  ['non-numeric.jsonl', 'non-numeric', { row: 4, index: "key 'x'[1]" }],
  ['ragged.jsonl', 'ragged-features', { row: 11 }],
  ['missing-key.jsonl', 'missing-column', { row: 6, index: "column 'step'" }],
  ['bad-json.jsonl', 'bad-json', { row: 5 }],
  ['unordered.jsonl', 'unordered-steps', { row: 13, index: "episode 'bay-2'" }],
  ['empty.jsonl', 'empty-file', { row: 1 }],
  ['npy/nan.npy', 'non-finite', { index: '[1, 2, 3]' }],
  ['npy/empty.npy', 'empty-file', { index: 'shape' }],
  ['npy/rank2.npy', 'bad-shape', { index: 'shape' }],
  ['npy/short-episodes.npy', 'episode-too-short', { index: "episode '0'" }, 3],
  ['npy/episodes-f4.npy', 'too-few-episodes', { index: 'split val' }],
  ['npy/big-endian.npy', 'unsupported-dtype', { index: 'header' }],
  ['npy/truncated.npy', 'bad-npy', { index: 'header' }],
  ['data.txt', 'unknown-format', {}],
  ['no-such-file.csv', 'file-not-found', {}],
];

describe('user files: every malformed fixture stops the load with a located error', () => {
  it.each(cases)('%s → %s at %j', async (path, code, where, minSteps) => {
    const error = await loadError(path, minSteps);
    expect(error.code).toBe(code);
    expect(error.file).toBe(path);
    expect(error.message).toContain(path);
    if (where.row !== undefined) {
      expect(error.row).toBe(where.row);
      expect(error.message).toContain(`${path}:${where.row}`);
    }
    if (where.index !== undefined) {
      expect(error.index).toBe(where.index);
      expect(error.message).toContain(where.index);
    }
    expect(error.hint.length).toBeGreaterThan(10);
  });
});
