import { describe, expect, it } from 'vitest';
import { evaluateRepresentation } from '../../runner/evaluation/evaluate.ts';
import type { MetricRow } from '../../runner/evaluation/metric.ts';
import { evalConfig, evalSpec, identityRepresentation, stateDataset } from './fixtures.ts';

const find = (rows: MetricRow[], metric: string, level: number, source: string): MetricRow => {
  const row = rows.find((r) => r.metric === metric && r.level === level && r.source === source);
  if (row === undefined) throw new Error(`no ${metric} at ${level} (${source})`);
  return row;
};

describe('the whole chain on a linear-Gaussian system with the true transition', () => {
  // A representation equal to the true latent state, evaluated with the true F, Q: inference
  // in representation space is then the optimal smoother itself, and every predictive
  // distribution is exact, so D² ~ χ²_d (MATH.md §4).
  const dataset = stateDataset({ stateDim: 3, steps: 40, train: 20, test: 300, seed: 4 });
  const config = evalConfig({
    transitions: ['true'],
    queries: 2000,
    horizons: [1, 4],
    waypoints: [1, 3],
  });
  const run = evaluateRepresentation(identityRepresentation(3), dataset, evalSpec(config));

  it('bridge and forecast errors equal the oracle rows', async () => {
    const { metrics } = await run;
    for (const T of [1, 3]) {
      const bridge = find(metrics, 'bridge_nmse', T, 'true').value;
      expect(bridge).toBeGreaterThan(0);
      expect(bridge).toBeCloseTo(find(metrics, 'bridge_nmse_oracle', T, 'true').value, 9);
      // The optimal smoother beats both baselines on the same tasks (it is the posterior mean).
      expect(bridge).toBeLessThan(find(metrics, 'bridge_nmse_midpoint', T, 'true').value);
      expect(bridge).toBeLessThan(find(metrics, 'bridge_nmse_nearer', T, 'true').value);
    }
    for (const h of [1, 4]) {
      expect(find(metrics, 'forecast_nmse', h, 'true').value).toBeCloseTo(
        find(metrics, 'forecast_nmse_oracle', h, 'true').value,
        9,
      );
    }
  });

  it('covers at the nominal rates within binomial sampling error', async () => {
    const { metrics } = await run;
    // Tolerance: 4 binomial standard deviations √(q(1-q)/n) with n = number of tasks
    // (common practice). Bridge waypoints of one task are correlated; the hit rate averaged
    // over a task's waypoints has variance ≤ q(1-q), so n = tasks is the conservative count.
    for (const [prefix, levels, perTask] of [
      ['', [1, 4], 1],
      ['bridge_', [1, 3], 0],
    ] as const) {
      for (const level of levels) {
        for (const q of [50, 80, 90, 95]) {
          const row = find(metrics, `${prefix}coverage_${q}`, level, 'true');
          const tasks = perTask === 1 ? row.n! : row.n! / level;
          const sigma = Math.sqrt(((q / 100) * (1 - q / 100)) / tasks);
          expect(Math.abs(row.value - q / 100)).toBeLessThan(4 * sigma);
        }
      }
    }
  });
});
