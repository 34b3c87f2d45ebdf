import { describe, expect, it } from 'vitest';
import { badnessOf, metricDirection } from '../../runner/report/metric-direction.ts';

describe('metricDirection', () => {
  it('reads the direction from the metric name', () => {
    expect(metricDirection('forecast_nmse')).toEqual({ kind: 'lower' });
    expect(metricDirection('bridge_nmse_oracle')).toEqual({ kind: 'lower' });
    expect(metricDirection('nll_per_dim')).toEqual({ kind: 'lower' });
    expect(metricDirection('planning_success')).toEqual({ kind: 'higher' });
    expect(metricDirection('bridge_mrr')).toEqual({ kind: 'higher' });
    expect(metricDirection('bridge_top5')).toEqual({ kind: 'higher' });
    expect(metricDirection('coverage_95')).toEqual({ kind: 'target', target: 0.95 });
    expect(metricDirection('mardia_skew_p')).toEqual({ kind: 'none' });
    expect(metricDirection('episodes_count')).toEqual({ kind: 'none' });
    expect(metricDirection('wall_clock')).toEqual({ kind: 'none' });
  });

  it('turns every direction into a smaller-is-better badness', () => {
    expect(badnessOf(0.3, { kind: 'lower' })).toBe(0.3);
    expect(badnessOf(0.3, { kind: 'higher' })).toBe(-0.3);
    expect(badnessOf(0.85, { kind: 'target', target: 0.9 })).toBeCloseTo(0.05, 12);
    expect(badnessOf(0.3, { kind: 'none' })).toBeNull();
  });
});
