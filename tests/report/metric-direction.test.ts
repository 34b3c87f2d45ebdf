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
    expect(metricDirection('bridge_coverage_80')).toEqual({ kind: 'target', target: 0.8 });
    expect(metricDirection('mardia_kurtosis_ratio')).toEqual({ kind: 'target', target: 1 });
    expect(metricDirection('critic_sv_ratio_min')).toEqual({ kind: 'target', target: 1 });
    expect(metricDirection('mardia_skewness_p')).toEqual({ kind: 'none' });
    expect(metricDirection('ks_min_p_holm')).toEqual({ kind: 'none' });
    expect(metricDirection('ks_max_statistic')).toEqual({ kind: 'none' });
    expect(metricDirection('cov_eig_min')).toEqual({ kind: 'none' });
    expect(metricDirection('cov_eig_spread')).toEqual({ kind: 'lower' });
    expect(metricDirection('marginal_kl_per_dim')).toEqual({ kind: 'lower' });
    expect(metricDirection('fitted_critic_f_gap')).toEqual({ kind: 'lower' });
    expect(metricDirection('planning_length_ratio')).toEqual({ kind: 'lower' });
    expect(metricDirection('forecast_skill_vs_fitted')).toEqual({ kind: 'higher' });
    expect(metricDirection('final_val_accuracy')).toEqual({ kind: 'higher' });
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
