import { describe, expect, it } from 'vitest';
import type { Dataset, Episode } from '../../runner/data/episode.ts';
import { buildContext } from '../../runner/evaluation/build-context.ts';
import type { MetricRow } from '../../runner/evaluation/metric.ts';
import { runAssumptionsSuite } from '../../runner/evaluation/suites/assumptions.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { evalConfig, identityRepresentation } from './fixtures.ts';

/** Episodes of i.i.d. rows drawn by `draw` (dim 3), observed directly. */
function iidDataset(draw: () => number): Dataset {
  const episode = (): Episode => {
    const obs = Float32Array.from({ length: 50 * 3 }, draw);
    return { obs, steps: 50, obsDim: 3 };
  };
  const test = Array.from({ length: 20 }, episode);
  return {
    name: 'iid',
    description: '',
    obsDim: 3,
    stateDim: 0,
    train: test.slice(0, 4),
    val: [],
    test,
  };
}

const value = (rows: MetricRow[], metric: string): number =>
  rows.find((r) => r.metric === metric)!.value;

function diagnose(draw: () => number, critic: { a: number; c: number }) {
  const config = evalConfig({
    suites: ['assumptions'],
    transitions: ['critic', 'fitted'],
    subsample: 400,
  });
  const context = buildContext(identityRepresentation(3, critic), iidDataset(draw), {
    config,
    discount: 0.8,
    scale: 1,
  });
  return runAssumptionsSuite(context);
}

describe('assumption diagnostics', () => {
  it('accept N(0, cI) encodings, with null-sized effects, on the fixed subsample', () => {
    const rng = createRng(21);
    const c = 2;
    const { metrics } = diagnose(() => Math.sqrt(c) * rng.normal(), { a: Math.sqrt(1 + 1 / c), c });
    expect(metrics.every((m) => m.suite === 'assumptions')).toBe(true);
    expect(metrics.find((m) => m.metric === 'hz_p')!.n).toBe(400);
    // Under the null every p-value is uniform; with a fixed seed these are fixed numbers, and
    // 0.001 leaves room for the 3·5 = 15 p-values here (common practice).
    for (const p of [
      'mardia_skewness_p',
      'mardia_kurtosis_p',
      'hz_p',
      'ks_min_p_holm',
      'cov_identity_p',
    ]) {
      expect(value(metrics, p)).toBeGreaterThan(0.001);
    }
    // Effect sizes near their null values: b₂/d(d+2) ≈ 1, eigenvalues of Cov/c ≈ 1.
    expect(value(metrics, 'mardia_kurtosis_ratio')).toBeCloseTo(1, 1);
    expect(value(metrics, 'cov_eig_spread')).toBeLessThan(1.6);
    expect(value(metrics, 'ks_rejected_fraction')).toBe(0);
    // A = √(1+1/c) I is exactly stationary (MATH.md §2): every singular value ratio is 1.
    expect(value(metrics, 'critic_sv_ratio_min')).toBeCloseTo(1, 12);
    expect(value(metrics, 'critic_sv_ratio_max')).toBeCloseTo(1, 12);
  });

  it('reject skewed encodings and report the wrong scale and a non-stationary critic', () => {
    const rng = createRng(22);
    const { metrics } = diagnose(() => Math.exp(rng.normal()), { a: 3, c: 1 });
    expect(value(metrics, 'mardia_skewness_p')).toBeLessThan(1e-6);
    expect(value(metrics, 'hz_p')).toBeLessThan(1e-6);
    expect(value(metrics, 'ks_rejected_fraction')).toBe(1);
    expect(value(metrics, 'critic_sv_ratio_max')).toBeCloseTo(3 / Math.SQRT2, 12);
  });
});
