import { describe, expect, it } from 'vitest';
import type { Dataset } from '../../runner/data/episode.ts';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import type { FitHooks } from '../../runner/training/method.ts';
import { quietHooks, smallData, trainConfig, trainSpec } from './fixtures.ts';

/** .npy version 1.0 bytes (NumPy NEP 1, Kern, 2007): magic, version, header length, dict, data. */
function npyBytes(shape: number[], data: Float32Array): Uint8Array {
  let header = `{'descr': '<f4', 'fortran_order': False, 'shape': (${shape.join(', ')}${shape.length === 1 ? ',' : ''}), }`;
  const total = 10 + header.length + 1;
  header += ' '.repeat((64 - (total % 64)) % 64) + '\n';
  const out = new Uint8Array(10 + header.length + data.byteLength);
  out.set([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59, 1, 0, header.length & 0xff, header.length >> 8]);
  out.set(new TextEncoder().encode(header), 10);
  out.set(new Uint8Array(data.buffer), 10 + header.length);
  return out;
}

/** The true states of every episode in dataset order: someone else's "embeddings". */
function statesInOrder(dataset: Dataset): { data: Float32Array; rows: number; dim: number } {
  const episodes = [...dataset.train, ...dataset.val, ...dataset.test];
  const dim = dataset.stateDim;
  const rows = episodes.reduce((a, e) => a + e.steps, 0);
  const data = new Float32Array(rows * dim);
  let at = 0;
  for (const e of episodes) {
    data.set(e.state!, at);
    at += e.state!.length;
  }
  return { data, rows, dim };
}

function hooksServing(bytes: Uint8Array): FitHooks {
  return { ...quietHooks(), readFile: () => Promise.resolve(bytes) };
}

describe('precomputed representations', () => {
  const data = smallData({ episodes: 10, steps: 16 });

  it('look up .npy embeddings by observation, scaled to variance c', async () => {
    const dataset = await loadDataset(data, '.');
    const states = statesInOrder(dataset);
    const spec = trainSpec({
      data,
      method: { name: 'precomputed', label: 'mine', path: 'emb.npy' },
      train: trainConfig({ scale: 3 }),
    });
    const fit = await fitMethod(
      spec.method,
      dataset,
      spec,
      hooksServing(npyBytes([states.rows, states.dim], states.data)),
    );
    expect(fit.representation.dim).toBe(4);
    const e = dataset.test[1]!;
    const z = fit.representation.encode(e.obs, e.steps);
    // Same embedding up to a per-dimension affine map: correlation 1 with the true state.
    for (let j = 0; j < 4; j++) {
      const a = Array.from({ length: e.steps }, (_, t) => z[t * 4 + j]!);
      const b = Array.from({ length: e.steps }, (_, t) => e.state![t * 4 + j]!);
      const ma = a.reduce((s, v) => s + v, 0) / a.length;
      const mb = b.reduce((s, v) => s + v, 0) / b.length;
      const cov = a.reduce((s, v, i) => s + (v - ma) * (b[i]! - mb), 0);
      const r =
        cov /
        Math.sqrt(
          a.reduce((s, v) => s + (v - ma) ** 2, 0) * b.reduce((s, v) => s + (v - mb) ** 2, 0),
        );
      expect(r).toBeCloseTo(1, 5);
    }
  });

  it('read CSV embeddings, ignoring episode and step columns', async () => {
    const dataset = await loadDataset(data, '.');
    const states = statesInOrder(dataset);
    const lines = ['episode,step,a,b,c,d'];
    for (let i = 0; i < states.rows; i++)
      lines.push(`0,${i},${Array.from(states.data.subarray(i * 4, i * 4 + 4)).join(',')}`);
    const spec = trainSpec({
      data,
      method: { name: 'precomputed', label: 'mine', path: 'emb.csv' },
    });
    const fit = await fitMethod(
      spec.method,
      dataset,
      spec,
      hooksServing(new TextEncoder().encode(lines.join('\n'))),
    );
    expect(fit.representation.dim).toBe(4);
  });

  it('name the expected row count when embeddings do not line up', async () => {
    const dataset = await loadDataset(data, '.');
    const spec = trainSpec({
      data,
      method: { name: 'precomputed', label: 'mine', path: 'emb.npy' },
    });
    const wrong = npyBytes([5, 2], new Float32Array(10));
    await expect(fitMethod(spec.method, dataset, spec, hooksServing(wrong))).rejects.toMatchObject({
      code: 'embeddings-shape',
    });
    const noPath = trainSpec({ data, method: { name: 'precomputed', label: 'mine' } });
    await expect(fitMethod(noPath.method, dataset, noPath, quietHooks())).rejects.toMatchObject({
      code: 'embeddings-missing',
    });
  });
});
