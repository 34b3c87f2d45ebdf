import { PCA } from 'ml-pca';
import { describe, expect, it } from 'vitest';
import type { Dataset, Episode } from '../../runner/data/episode.ts';
import { loadDataset } from '../../runner/data/load-dataset.ts';
import { fitMethod } from '../../runner/training/fit-method.ts';
import { principalDirections } from '../../runner/training/methods/pca.ts';
import { slowFeatures } from '../../runner/training/methods/sfa.ts';
import { quietHooks, smallData, trainConfig, trainSpec } from './fixtures.ts';

function columnVariance(z: Float32Array, n: number, d: number, j: number): number {
  let s = 0;
  let ss = 0;
  for (let i = 0; i < n; i++) s += z[i * d + j]!;
  for (let i = 0; i < n; i++) ss += (z[i * d + j]! - s / n) ** 2;
  return ss / n;
}

function correlation(a: number[], b: number[]): number {
  const ma = a.reduce((s, v) => s + v, 0) / a.length;
  const mb = b.reduce((s, v) => s + v, 0) / b.length;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  a.forEach((v, i) => {
    sab += (v - ma) * (b[i]! - mb);
    saa += (v - ma) ** 2;
    sbb += (b[i]! - mb) ** 2;
  });
  return sab / Math.sqrt(saa * sbb);
}

function stacked(episodes: Episode[]): { obs: Float32Array; n: number } {
  const n = episodes.reduce((a, e) => a + e.steps, 0);
  const obs = new Float32Array(n * episodes[0]!.obsDim);
  let at = 0;
  for (const e of episodes) {
    obs.set(e.obs, at);
    at += e.obs.length;
  }
  return { obs, n };
}

describe('PCA baseline', () => {
  it('spans the same leading directions as ml-pca and scales them to variance c', async () => {
    const spec = trainSpec({
      method: { name: 'pca', label: 'pca' },
      train: trainConfig({ scale: 2 }),
    });
    const dataset = await loadDataset(spec.data, '.');
    const { obs, n } = stacked(dataset.train);
    const rows = Array.from({ length: n }, (_, i) =>
      Array.from(obs.subarray(i * 12, (i + 1) * 12)),
    );
    // ml-pca (an independent implementation, SVD of the centred data) as the oracle.
    const oracle = new PCA(rows, { center: true, scale: false });
    const ours = principalDirections(dataset.train, 4);
    const theirs = oracle.getLoadings(); // [components, features]
    for (let k = 0; k < 4; k++) {
      let dot = 0;
      for (let f = 0; f < 12; f++) dot += ours.w.get(f, k) * theirs.get(k, f);
      expect(Math.abs(dot)).toBeCloseTo(1, 4); // unit vectors, equal up to sign
      expect((ours.values[k]! * n) / (n - 1)).toBeCloseTo(oracle.getEigenvalues()[k]!, 3);
    }
    const fit = await fitMethod(spec.method, dataset, spec, quietHooks());
    const z = fit.representation.encode(obs, n);
    for (let j = 0; j < 4; j++) expect(columnVariance(z, n, 4, j)).toBeCloseTo(2, 3);
  });
});

describe('slow feature analysis', () => {
  it('recovers the slow source of the Wiskott & Sejnowski (2002) toy problem', () => {
    // Wiskott & Sejnowski (2002), §4.1: x1(t) = sin t + cos²(11t), x2(t) = cos(11t),
    // t ∈ [0, 2π]; the slow source sin t = x1 − x2² is a linear function of the quadratic
    // expansion [x1, x2, x1², x1x2, x2²] they use, so linear SFA on it must find it.
    const steps = 2000;
    const obsDim = 5;
    const obs = new Float32Array(steps * obsDim);
    const source: number[] = [];
    for (let t = 0; t < steps; t++) {
      const time = (2 * Math.PI * t) / steps;
      const x1 = Math.sin(time) + Math.cos(11 * time) ** 2;
      const x2 = Math.cos(11 * time);
      obs.set([x1, x2, x1 * x1, x1 * x2, x2 * x2], t * obsDim);
      source.push(Math.sin(time));
    }
    const episode: Episode = { obs, steps, obsDim };
    const { x, mean, w } = slowFeatures([episode], 1);
    const y = x.clone().subRowVector(Array.from(mean)).mmul(w).getColumn(0);
    expect(Math.abs(correlation(y, source))).toBeGreaterThan(0.99);
    // The problem is not trivial: the raw input x2 = cos 11t is uncorrelated with sin t.
    expect(
      Math.abs(
        correlation(
          Array.from({ length: steps }, (_, t) => obs[t * obsDim + 1]!),
          source,
        ),
      ),
    ).toBeLessThan(0.1);
  });
});

describe('other baselines', () => {
  it('raw, random and sfa give variance c per dimension on the training data', async () => {
    const spec = trainSpec({ data: smallData({ obsDim: 3 }), train: trainConfig({ scale: 0.5 }) });
    const dataset: Dataset = await loadDataset(spec.data, '.');
    const { obs, n } = stacked(dataset.train);
    for (const name of ['raw', 'random', 'sfa'] as const) {
      const fit = await fitMethod(
        { name, label: name },
        dataset,
        { ...spec, method: { name, label: name } },
        quietHooks(),
      );
      const d = fit.representation.dim;
      expect(d).toBe(name === 'random' ? 4 : 3); // raw is the identity on obsDim 3 ≤ d 4
      const z = fit.representation.encode(obs, n);
      for (let j = 0; j < d; j++) expect(columnVariance(z, n, d, j)).toBeCloseTo(0.5, 3);
    }
  });
});
