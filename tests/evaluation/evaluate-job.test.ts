import { mkdir, mkdtemp, readFile, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import type { DataConfig } from '../../runner/config/types.ts';
import { requiredSteps } from '../../runner/data/required-steps.ts';
import { evaluateJob } from '../../runner/execute/jobs/evaluate-job.ts';
import { saveRepresentation } from '../../runner/execute/jobs/representation-files.ts';
import type { JobContext } from '../../runner/execute/job-handler.ts';
import { evalConfig, evalSpec } from './fixtures.ts';

const data: DataConfig = {
  source: 'linear-gaussian',
  seed: 3,
  episodes: 30,
  steps: 24,
  obsDim: 6,
  noise: 0.05,
  stateDim: 2,
  map: 'linear',
  layout: 'open-hall',
  image: 16,
  dt: 0,
  split: { train: 0.6, val: 0.1, test: 0.3 },
  standardise: true,
};

describe('evaluateJob', () => {
  const dirs: string[] = [];
  afterAll(async () => {
    for (const d of dirs) await rm(d, { recursive: true, force: true });
  });

  it('loads the data and the saved representation, writes JSON artifacts, returns metrics', async () => {
    const root = await mkdtemp(join(tmpdir(), 'midpath-eval-'));
    dirs.push(root);
    const trainDir = join(root, 'train');
    const evalDir = join(root, 'eval');
    await Promise.all([mkdir(trainDir), mkdir(evalDir)]);
    // An affine representation (the first 3 standardised sensors) with a distance critic.
    const W = new Float32Array(6 * 3);
    for (let j = 0; j < 3; j++) W[j * 3 + j] = 1;
    await saveRepresentation(trainDir, {
      method: 'pca',
      label: 'pca',
      dim: 3,
      obsDim: 6,
      model: { kind: 'affine' },
      arrays: {
        mean: { shape: [6], data: new Float32Array(6) },
        W: { shape: [6, 3], data: W },
        A: { shape: [3, 3], data: Float32Array.from([1.4, 0, 0, 0, 1.4, 0, 0, 0, 1.4]) },
      },
      critic: { kind: 'distance', c: 1 },
      meta: {},
    });
    const spec = evalSpec(
      evalConfig({
        suites: ['forecast', 'bridge', 'calibration', 'assumptions', 'projections'],
        queries: 40,
      }),
    );
    spec.train.data = data;
    const lines: string[] = [];
    const ctx: JobContext = {
      artifactsDir: evalDir,
      artifactsOf: () => trainDir,
      threads: 1,
      log: (line) => lines.push(line),
      signal: new AbortController().signal,
    };
    const outcome = await evaluateJob(spec, ctx);
    expect(outcome.status).toBe('done');
    const metrics = outcome.metrics;
    for (const name of [
      'forecast_nmse',
      'bridge_nmse',
      'bridge_nmse_oracle',
      'coverage_90',
      'mardia_skewness',
    ]) {
      expect(metrics.some((m) => m.metric === name)).toBe(true);
    }
    // Critic rows exist (the saved A), the 'true' source is skipped (ψ is not the state).
    expect(metrics.some((m) => m.source === 'critic')).toBe(true);
    expect(metrics.some((m) => m.source === 'true' && m.metric === 'bridge_nmse')).toBe(false);
    const files = (await readdir(evalDir)).sort();
    expect(files).toEqual([
      'assumptions.json',
      'bridge.json',
      'calibration.json',
      'diagnostics.json',
      'forecast.json',
      'projections.json',
    ]);
    const projection = JSON.parse(await readFile(join(evalDir, 'projections.json'), 'utf8')) as {
      projection: { points: number[][]; state: number[][] };
    };
    expect(projection.projection.points.length).toBe(projection.projection.state.length);
    expect(lines.some((l) => l.includes('true: skipped'))).toBe(true);
  });

  it('asks the dataset for episodes long enough for the step horizons and bridges', () => {
    expect(requiredSteps(evalConfig({ horizons: [1, 8], waypoints: [1, 3] }))).toBe(9);
    expect(requiredSteps(evalConfig({ horizons: [2], waypoints: [7] }))).toBe(9);
  });
});
