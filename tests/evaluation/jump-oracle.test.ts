import { inv, multiply, pow } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { buildContext } from '../../runner/evaluation/build-context.ts';
import { tasksFor } from '../../runner/evaluation/context.ts';
import { bridgeOnGaps, createGapTable } from '../../runner/evaluation/gap-inference.ts';
import { runBridgeSuite } from '../../runner/evaluation/suites/bridge.ts';
import { runForecastSuite } from '../../runner/evaluation/suites/forecast.ts';
import { oracleSetup } from '../../runner/evaluation/suites/jump-oracle.ts';
import { prepareBridge } from '../../runner/inference/index.ts';
import { evalConfig, identityRepresentation, stateDataset } from './fixtures.ts';

type Matrix = number[][];

const d = 2;
const dataset = stateDataset({ stateDim: d, steps: 40, train: 4, test: 40, seed: 5 });
const known = dataset.model!;
const F: Matrix = [0, 1].map((i) => [0, 1].map((j) => known.F[i * d + j]!));
const P: Matrix = [0, 1].map((i) => [0, 1].map((j) => known.stationary[i * d + j]!));
// A per-jump source (the critic) makes the experiment evaluate jump tasks; γ = 0.8.
const config = evalConfig({
  transitions: ['critic'],
  waypoints: [1, 2],
  jumps: [1, 3],
  queries: 40,
});
const context = buildContext(identityRepresentation(d, { a: 1.2, c: 1 }), dataset, {
  config,
  discount: 0.8,
  scale: 1,
});
const setup = oracleSetup(context)!;

/** State of test episode `e` at step `t`. */
const stateAt = (e: number, t: number): number[] =>
  [0, 1].map((j) => dataset.test[e]!.state![t * d + j]!);

/**
 * Joint covariance of the stationary chain at `times` (increasing): Cov(s_a, s_b) = F^{b−a} P
 * for b ≥ a (s_b = F^{b−a} s_a + noise independent of s_a), its transpose for b < a.
 */
function jointCovariance(times: number[]): Matrix {
  const n = times.length;
  const big: Matrix = Array.from({ length: n * d }, () => new Array<number>(n * d).fill(0));
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      const lag = Math.abs(times[b]! - times[a]!);
      const later: Matrix = multiply(pow(F, lag) as Matrix, P);
      for (let i = 0; i < d; i++)
        for (let j = 0; j < d; j++)
          big[a * d + i]![b * d + j] = times[b]! >= times[a]! ? later[j]![i]! : later[i]![j]!;
    }
  }
  return big;
}

/** E[interior | ends] by dense conditioning, Bishop PRML eq. 2.81 (zero mean): [T·d]. */
function conditionDensely(times: number[], start: number[], goal: number[]): number[] {
  const big = jointCovariance(times);
  const n = times.length;
  const observed = [0, 1, (n - 1) * d, (n - 1) * d + 1];
  const hidden = Array.from({ length: (n - 2) * d }, (_, i) => d + i);
  // μ_{a|b} = Σ_ab Σ_bb⁻¹ x_b (PRML eq. 2.81); the posterior covariance (eq. 2.82) is not scored.
  const gain: Matrix = multiply(
    hidden.map((h) => observed.map((o) => big[h]![o]!)),
    inv(observed.map((a) => observed.map((b) => big[a]![b]!))),
  );
  const x = [...start, ...goal];
  return gain.map((row) => row.reduce((s, g, i) => s + g * x[i]!, 0));
}

describe('jump-unit bridge oracle', () => {
  it('matches dense Gaussian conditioning per task, on tasks with realised gaps > 1', () => {
    // Independent oracle: Bishop PRML eqs. 2.81–2.82 on the stationary joint covariance,
    // computed with mathjs, against the per-task precision solve with F^k, Σ_{j<k} F^jQF^{jᵀ}.
    const table = createGapTable(setup.model);
    const tasks = tasksFor(context, 'bridge', 3, 'jump'); // T = 2 waypoints
    expect(tasks.length).toBeGreaterThan(10);
    const gaps = tasks.flatMap((t) => t.times.slice(1).map((v, i) => v - t.times[i]!));
    expect(Math.max(...gaps)).toBeGreaterThan(1);
    let total = 0;
    for (const task of tasks) {
      const start = stateAt(task.episode, task.times[0]!);
      const goal = stateAt(task.episode, task.times[3]!);
      const mine = bridgeOnGaps(setup.model, table, task.times, start, goal);
      const dense = conditionDensely(task.times, start, goal);
      for (let i = 0; i < dense.length; i++) expect(mine[i]!).toBeCloseTo(dense[i]!, 9);
      for (let k = 1; k <= 2; k++) {
        const truth = stateAt(task.episode, task.times[k]!);
        for (let j = 0; j < d; j++) total += (dense[(k - 1) * d + j]! - truth[j]!) ** 2;
      }
    }
    const row = runBridgeSuite(context).metrics.find(
      (r) => r.metric === 'bridge_nmse_oracle' && r.level === 2 && r.unit === 'jump',
    )!;
    expect(row.source).toBe('true');
    expect(row.n).toBe(tasks.length * 2);
    expect(row.value).toBeCloseTo(total / (tasks.length * 2) / setup.spread, 9);
  });

  it('reduces to the step smoother (Rauch, Tung & Striebel 1965) when every gap is one step', () => {
    const table = createGapTable(setup.model);
    const tasks = tasksFor(context, 'bridge', 3, 'step');
    const starts = tasks.flatMap((t) => stateAt(t.episode, t.times[0]!));
    const goals = tasks.flatMap((t) => stateAt(t.episode, t.times[3]!));
    const { means } = prepareBridge(setup.model, 2).solve(starts, goals, tasks.length);
    tasks.forEach((task, q) => {
      const mine = bridgeOnGaps(
        setup.model,
        table,
        task.times,
        starts.slice(q * d, (q + 1) * d),
        goals.slice(q * d, (q + 1) * d),
      );
      for (let i = 0; i < 2 * d; i++) expect(mine[i]!).toBeCloseTo(means[q * 2 * d + i]!, 10);
    });
  });

  it('sits below the learned critic bridge and its baselines on the same jump tasks', () => {
    // The posterior mean minimises expected squared error (Bishop PRML §1.5.5), so on the same
    // tasks (identity representation: codes = states, one normaliser) it beats a wrong model.
    const rows = runBridgeSuite(context).metrics;
    const at = (metric: string, source: string, unit: string): number =>
      rows.find(
        (r) => r.metric === metric && r.level === 1 && r.source === source && r.unit === unit,
      )!.value;
    const oracle = at('bridge_nmse_oracle', 'true', 'jump');
    expect(oracle).toBeLessThan(at('bridge_nmse', 'critic', 'jump'));
    expect(oracle).toBeLessThan(at('bridge_nmse_midpoint', 'critic', 'jump'));
  });
});

describe('jump-unit forecast oracle', () => {
  it('equals F^k s₀ with k the realised step count (mathjs matrix power)', () => {
    // The k-step mean of a linear-Gaussian chain, Bishop PRML eq. 2.115 applied k times.
    const rows = runForecastSuite(context).metrics.filter(
      (r) => r.metric === 'forecast_nmse_oracle' && r.unit === 'jump',
    );
    expect(rows.map((r) => r.level)).toEqual([1, 3]);
    for (const row of rows) {
      const h = row.level as number;
      const tasks = tasksFor(context, 'forecast', h, 'jump');
      expect(row.n).toBe(tasks.length);
      let total = 0;
      for (const task of tasks) {
        const k = task.times[h]! - task.times[0]!;
        const mean = multiply(pow(F, k) as Matrix, stateAt(task.episode, task.times[0]!));
        const truth = stateAt(task.episode, task.times[h]!);
        for (let j = 0; j < d; j++) total += (mean[j]! - truth[j]!) ** 2;
      }
      expect(row.value).toBeCloseTo(total / tasks.length / setup.spread, 9);
    }
  });

  it('is not emitted when the experiment evaluates no per-jump source', () => {
    const stepOnly = buildContext(identityRepresentation(d), dataset, {
      config: { ...config, transitions: ['fitted'], fit: 'consecutive' },
      discount: 0.8,
      scale: 1,
    });
    const units = runForecastSuite(stepOnly)
      .metrics.filter((r) => r.metric === 'forecast_nmse_oracle')
      .map((r) => r.unit);
    expect(units).toEqual(['step', 'step']);
  });
});
