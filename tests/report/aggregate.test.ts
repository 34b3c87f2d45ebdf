import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  aggregateMetrics,
  compareLevels,
  type MetricSummary,
} from '../../runner/report/aggregate.ts';
import { markBest } from '../../runner/report/best-marks.ts';
import { summaryKey } from '../../runner/report/aggregate.ts';
import { readRun } from '../../runner/store/read-run.ts';
import type { JobResult } from '../../runner/store/result.ts';
import { SPECIAL_LABEL } from '../fixtures/results/build-run.ts';
import { makeFixtureRun } from './fixture-run.ts';

// jstat ships no type declarations; this is the slice the checks use.
interface JStatSlice {
  mean(values: number[]): number;
  stdev(values: number[], sample: boolean): number;
  tci(mean: number, alpha: number, values: number[]): [number, number];
}
const jStat = (createRequire(import.meta.url)('jstat') as { jStat: JStatSlice }).jStat;

let results: JobResult[] = [];
let cleanup = (): void => {};
beforeAll(async () => {
  const run = makeFixtureRun();
  cleanup = run.cleanup;
  results = (await readRun(run.dir)).results;
});
afterAll(() => cleanup());

function find(
  rows: MetricSummary[],
  match: Partial<MetricSummary> & { dim?: string },
): MetricSummary {
  const found = rows.filter(
    (r) =>
      (match.dim === undefined || r.setting.dim === match.dim) &&
      (match.method === undefined || r.method === match.method) &&
      (match.metric === undefined || r.metric === match.metric) &&
      (match.source === undefined || r.source === match.source) &&
      (match.level === undefined || r.level === match.level) &&
      (match.unit === undefined || r.unit === match.unit),
  );
  expect(found).toHaveLength(1);
  return found[0]!;
}

describe('aggregateMetrics', () => {
  it('summarises each group over seeds with the 95 % t-interval of an independent library', () => {
    const rows = aggregateMetrics(results);
    const row = find(rows, {
      dim: '4',
      method: 'pca',
      metric: 'forecast_nmse',
      source: 'fitted',
      level: 2,
    });
    expect(row.seeds).toEqual([0, 1, 2]);
    // Oracle: jStat.tci is the Student-t interval mean ± t_{0.975, n-1} s / √n (jstat docs, test.md).
    const [low, high] = jStat.tci(jStat.mean(row.values), 0.05, row.values);
    expect(row.n).toBe(3);
    expect(row.mean).toBeCloseTo(jStat.mean(row.values), 12);
    expect(row.std).toBeCloseTo(jStat.stdev(row.values, true), 12);
    expect(row.ciLow).toBeCloseTo(low, 10);
    expect(row.ciHigh).toBeCloseTo(high, 10);
  });

  it('matches a textbook t-interval: mean 10, s = 2, n = 4 gives 10 ± 3.182 (t_{0.975,3} = 3.182)', () => {
    // Values 8, 9, 11, 12: mean 10, s = √(10/3); half-width t·s/√n with t_{0.975,3} = 3.182
    // (Fisher & Yates, Statistical Tables, Table III; value from memory).
    const one = results.find((r) => r.kind === 'evaluate' && r.status === 'done')!;
    const copies = [8, 9, 11, 12].map((value, seed) => ({
      ...one,
      spec: { ...one.spec, seed },
      metrics: [{ suite: 'forecast', metric: 'forecast_nmse', level: 1, source: 'fitted', value }],
    }));
    const [row] = aggregateMetrics(copies);
    const half = (3.182 * Math.sqrt(10 / 3)) / 2;
    expect(row!.ciLow).toBeCloseTo(10 - half, 2);
    expect(row!.ciHigh).toBeCloseTo(10 + half, 2);
  });

  it('leaves out failed and diverged jobs, so no partial metric biases a mean', () => {
    const rows = aggregateMetrics(results);
    expect(results.some((r) => r.status === 'diverged' && r.metrics.length > 0)).toBe(true);
    expect(rows.some((r) => r.setting.dim === '16')).toBe(false);
  });

  it('sorts rows by setting, method order, metric and level (numbers and bins numerically)', () => {
    const rows = aggregateMetrics(results, ['pca', 'contrastive', SPECIAL_LABEL]);
    expect(rows[0]!.setting.dim).toBe('4');
    expect(rows[0]!.method).toBe('pca');
    const bins = rows
      .filter((r) => r.setting.dim === '4' && r.method === 'pca' && r.metric === 'planning_success')
      .map((r) => r.level);
    expect(bins).toEqual(['1-4', '5-8', '9-16']);
    expect(['10-16', '2-4', 'all', 3].sort(compareLevels)).toEqual([3, '2-4', '10-16', 'all']);
  });

  it('gives n = 1 groups a mean but no spread or interval', () => {
    const single = results.filter((r) => r.spec.seed === 0);
    const row = find(aggregateMetrics(single), {
      dim: '8',
      method: 'pca',
      metric: 'bridge_nmse',
      level: 1,
    });
    expect(row.n).toBe(1);
    expect(Number.isNaN(row.ciLow)).toBe(true);
  });
});

describe('markBest', () => {
  it('marks the lowest error best and overlapping intervals as ties', () => {
    const rows = aggregateMetrics(results);
    const marks = markBest(rows);
    const mark = (m: Partial<MetricSummary> & { dim?: string }): string =>
      marks.get(summaryKey(find(rows, m))) ?? '';
    const at = { dim: '4', metric: 'forecast_nmse', level: 1, unit: 'step' } as const;
    expect(mark({ ...at, method: 'contrastive', source: 'fitted' })).toBe('best');
    expect(mark({ ...at, method: 'pca', source: 'fitted' })).toBe('');
    // The oracle rows (true model) are identical across methods: a reference, never ranked.
    expect(mark({ ...at, metric: 'forecast_nmse_oracle', method: 'pca', source: 'true' })).toBe('');
    expect(mark({ ...at, method: 'contrastive', source: 'critic' })).toBe('');
  });

  it('marks the highest success best and the coverage closest to its nominal value best', () => {
    const rows = aggregateMetrics(results);
    const marks = markBest(rows);
    const of = (m: Partial<MetricSummary> & { dim?: string }): string =>
      marks.get(summaryKey(find(rows, m))) ?? '';
    expect(of({ dim: '8', method: 'contrastive', metric: 'planning_success', level: '9-16' })).toBe(
      'best',
    );
    expect(of({ dim: '8', method: SPECIAL_LABEL, metric: 'coverage_90', level: 1 })).toBe('');
    expect(['best', 'tie']).toContain(
      of({ dim: '8', method: 'pca', metric: 'coverage_90', level: 1 }),
    );
  });
});
