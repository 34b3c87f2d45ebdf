import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import type { MetricSummary } from '../../runner/report/aggregate.ts';
import { compareSummaries, DEFAULT_COMPARE } from '../../runner/report/compare/compare-runs.ts';
import { parseTolerance } from '../../runner/report/compare/index.ts';

// jstat ships no type declarations; this is the slice the checks use.
interface JStatSlice {
  ttest(t: number, n: number, sides: number): number;
  mean(values: number[]): number;
  stdev(values: number[], sample: boolean): number;
}
const jStat = (createRequire(import.meta.url)('jstat') as { jStat: JStatSlice }).jStat;

function summary(metric: string, values: number[], seeds = values.map((_, i) => i)): MetricSummary {
  const n = values.length;
  const mean = values.reduce((a, v) => a + v, 0) / n;
  return {
    setting: { dim: '8' },
    method: 'contrastive',
    suite: 'forecast',
    metric,
    source: 'fitted',
    level: 1,
    unit: 'step',
    seeds,
    values,
    tasks: values.map(() => 20),
    n,
    mean,
    std: Number.NaN,
    ciLow: Number.NaN,
    ciHigh: Number.NaN,
  };
}

describe('compareSummaries', () => {
  it('uses the paired t-test on shared seeds, with the p-value of an independent library', () => {
    const base = [1.0, 1.2, 0.8];
    const cand = [1.3, 0.9, 1.4];
    const c = compareSummaries([summary('forecast_nmse', base)], [summary('forecast_nmse', cand)]);
    const row = c.rows[0]!;
    expect(row.test).toBe('paired');
    // Oracle: a paired t-test is a one-sample t-test on the differences (Student, 1908);
    // jStat.ttest(t, n, 2) is its two-sided p-value with n - 1 degrees of freedom.
    const d = cand.map((v, i) => v - base[i]!);
    const t = jStat.mean(d) / (jStat.stdev(d, true) / Math.sqrt(d.length));
    expect(row.p).toBeCloseTo(jStat.ttest(t, d.length, 2), 8);
    // +20 % is beyond tolerance but not significant with this spread: unchanged.
    expect(row.relativeChange).toBeCloseTo(0.2, 12);
    expect(row.verdict).toBe('unchanged');
  });

  it('uses Welch when the seeds differ, and flags a clear regression', () => {
    const c = compareSummaries(
      [summary('forecast_nmse', [0.3, 0.31, 0.29], [0, 1, 2])],
      [summary('forecast_nmse', [0.4, 0.41, 0.39], [3, 4, 5])],
    );
    expect(c.rows[0]!.test).toBe('welch');
    expect(c.rows[0]!.verdict).toBe('regressed');
    expect(c.counts.regressed).toBe(1);
  });

  it('reads direction from the metric: higher success is an improvement, not a regression', () => {
    const c = compareSummaries(
      [summary('planning_success', [0.5, 0.55, 0.45])],
      [summary('planning_success', [0.7, 0.76, 0.66])],
    );
    expect(c.rows[0]!.verdict).toBe('improved');
  });

  it('measures coverage by its distance to the nominal level', () => {
    // 0.90 → 0.80 moves away from the nominal 0.90: worse, though the number fell.
    const c = compareSummaries(
      [summary('coverage_90', [0.9, 0.91, 0.89])],
      [summary('coverage_90', [0.8, 0.81, 0.79])],
    );
    expect(c.rows[0]!.relativeChange).toBeGreaterThan(0.05);
    expect(c.rows[0]!.verdict).toBe('regressed');
  });

  it('counts a change beyond tolerance with one seed as an untested regression', () => {
    const c = compareSummaries([summary('bridge_nmse', [0.3])], [summary('bridge_nmse', [0.4])]);
    expect(c.rows[0]!.test).toBe('none');
    expect(c.rows[0]!.verdict).toBe('regressed');
  });

  it('never ranks a metric without a direction', () => {
    const c = compareSummaries([summary('hz_p', [0.3, 0.2])], [summary('hz_p', [0.01, 0.02])]);
    expect(c.rows[0]!.verdict).toBe('not-ranked');
    expect(c.counts.regressed).toBe(0);
  });

  it('keeps changes within tolerance unchanged whatever the test says', () => {
    const c = compareSummaries(
      [summary('forecast_nmse', [1, 1, 1])],
      [summary('forecast_nmse', [1.04, 1.04, 1.04])],
      DEFAULT_COMPARE,
    );
    expect(c.rows[0]!.verdict).toBe('unchanged');
    expect(c.rows[0]!.p).toBeNull();
  });
});

describe('parseTolerance', () => {
  it('reads fractions and percentages and rejects the rest with a code', () => {
    expect(parseTolerance('0.1')).toBe(0.1);
    expect(parseTolerance('5%')).toBeCloseTo(0.05, 12);
    expect(() => parseTolerance('-1')).toThrow(
      expect.objectContaining({ code: 'bad-tolerance' }) as Error,
    );
    expect(() => parseTolerance('lots')).toThrow(
      expect.objectContaining({ code: 'bad-tolerance' }) as Error,
    );
  });
});
