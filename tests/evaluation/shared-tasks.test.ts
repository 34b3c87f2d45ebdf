import { describe, expect, it } from 'vitest';
import { buildContext } from '../../runner/evaluation/build-context.ts';
import { tasksFor } from '../../runner/evaluation/context.ts';
import { evaluateRepresentation } from '../../runner/evaluation/evaluate.ts';
import { runAssumptionsSuite } from '../../runner/evaluation/suites/assumptions.ts';
import { retrievalRanks } from '../../runner/evaluation/suites/retrieval.ts';
import { drawChainTasks, taskRng } from '../../runner/evaluation/tasks.ts';
import {
  evalConfig,
  evalSpec,
  identityRepresentation,
  linearRepresentation,
  stateDataset,
} from './fixtures.ts';

// Paired comparisons need every method and training seed to answer the same evaluation
// tasks (MATH.md §4; Agarwal et al. 2021 on paired designs). These tests change everything
// but the evaluation seed and the data, and require identical tasks.
describe('every method in one experiment sees the same evaluation tasks', () => {
  const dataset = stateDataset({ stateDim: 3, steps: 30, train: 10, test: 40, seed: 9 });
  const config = evalConfig({ queries: 50 });
  const settings = { config, discount: 0.8, scale: 1 };
  const a = buildContext(identityRepresentation(3, { a: 1.4, c: 1 }), dataset, settings);
  const b = buildContext(linearRepresentation(3, 5, 17), dataset, settings);

  it('draws identical chains for different methods and dimensions', () => {
    for (const [kind, n, unit] of [
      ['forecast', 3, 'step'],
      ['forecast', 2, 'jump'],
      ['bridge', 4, 'step'],
      ['bridge', 2, 'jump'],
    ] as const) {
      const ta = tasksFor(a, kind, n, unit);
      expect(ta.length).toBeGreaterThan(0);
      expect(tasksFor(b, kind, n, unit)).toEqual(ta);
    }
  });

  it('changes the tasks only when the evaluation seed changes', () => {
    const other = buildContext(identityRepresentation(3), dataset, {
      ...settings,
      config: { ...config, seed: 1 },
    });
    expect(tasksFor(other, 'bridge', 4, 'step')).not.toEqual(tasksFor(a, 'bridge', 4, 'step'));
  });

  it('gives identical task-only rows across methods and training seeds end to end', async () => {
    const c = evalConfig({ suites: ['forecast', 'bridge'], queries: 60 });
    const first = await evaluateRepresentation(
      identityRepresentation(3),
      dataset,
      evalSpec(c, 0, 'identity'),
    );
    const second = await evaluateRepresentation(
      linearRepresentation(3, 4, 2),
      dataset,
      evalSpec(c, 7, 'random-linear'),
    );
    const third = await evaluateRepresentation(
      identityRepresentation(3, { a: 1.4, c: 1 }),
      dataset,
      evalSpec(c, 3, 'critic-identity'),
    );
    // The oracle rows depend on the tasks and the data only, never on the representation,
    // the training seed or whether the method has a critic: step rows at eval.horizons and
    // eval.waypoints, jump rows (realised step gaps of the shared jump tasks) at eval.jumps
    // and eval.waypoints.
    const oracle = (rows: typeof first.metrics): string[] =>
      rows
        .filter((r) => r.metric.endsWith('_oracle'))
        .map((r) => `${r.metric}@${r.level}:${r.unit}:${r.source}:${r.n}=${r.value}`);
    const keys = oracle(first.metrics).map((k) => k.split('=')[0]);
    expect(keys).toEqual([
      'forecast_nmse_oracle@1:step:true:60',
      'forecast_nmse_oracle@3:step:true:60',
      'forecast_nmse_oracle@1:jump:true:60',
      'forecast_nmse_oracle@2:jump:true:60',
      'bridge_nmse_oracle@1:step:true:60',
      'bridge_nmse_oracle@3:step:true:180',
      'bridge_nmse_oracle@1:jump:true:60',
      'bridge_nmse_oracle@3:jump:true:180',
    ]);
    expect(oracle(second.metrics)).toEqual(oracle(first.metrics));
    expect(oracle(third.metrics)).toEqual(oracle(first.metrics));
    // And the critic's learned jump rows answer the very tasks of the jump oracle rows.
    const criticBridge = third.metrics.find(
      (r) => r.metric === 'bridge_nmse' && r.source === 'critic' && r.level === 3,
    );
    expect(criticBridge?.unit).toBe('jump');
    expect(criticBridge?.n).toBe(180);
  });

  it('redraws chains that run past the episode end instead of clipping them', () => {
    // MATH.md §1: an offset past the end is redrawn. A chain of 3 geometric jumps has a
    // negative-binomial span, P(S = s) = C(s-1, 2)(1-γ)³γ^(s-3) (Feller 1968, §VI.8); redrawing
    // conditions it on S ≤ 11 and the start is then uniform over the 12 - S places, so
    // P(chain ends on the last step) = E[1/(12 - S) | S ≤ 11]. Clipping would pile mass there.
    const gamma = 0.7;
    const count = 4000;
    const tasks = drawChainTasks(
      [12, 12, 12],
      { transitions: 3, unit: 'jump', discount: gamma, count },
      taskRng(3, 'x'),
    );
    expect(tasks.length).toBe(count);
    for (const t of tasks) {
      expect(t.times[3]!).toBeLessThanOrEqual(11);
      for (let i = 0; i < 3; i++) expect(t.times[i + 1]! - t.times[i]!).toBeGreaterThanOrEqual(1);
    }
    let mass = 0;
    let expected = 0;
    for (let span = 3; span <= 11; span++) {
      const p = (((span - 1) * (span - 2)) / 2) * (1 - gamma) ** 3 * gamma ** (span - 3);
      mass += p;
      expected += p / (12 - span);
    }
    expected /= mass;
    const observed = tasks.filter((t) => t.times[3] === 11).length / count;
    // 4 binomial standard deviations (common practice).
    expect(Math.abs(observed - expected)).toBeLessThan(
      4 * Math.sqrt((expected * (1 - expected)) / count),
    );
  });
});

describe('retrievalRanks', () => {
  it('ranks the own truth by distance among the batch, ties counting against it', () => {
    // Hand-worked: predictions at 0, 10, 20 on a line; truths at 1, 10, 14.
    // Query 0: own |0-1| = 1, others 10, 14 → rank 1. Query 1: own 0 → rank 1.
    // Query 2: own |20-14| = 6, |20-10| = 10, |20-1| = 19 → rank 1. Then move truth 2 to 30:
    // query 2: own 10, and |20-10| = 10 ties → rank 2.
    expect(
      Array.from(
        retrievalRanks(Float64Array.from([0, 10, 20]), Float64Array.from([1, 10, 14]), 3, 1),
      ),
    ).toEqual([1, 1, 1]);
    expect(
      Array.from(
        retrievalRanks(Float64Array.from([0, 10, 20]), Float64Array.from([1, 10, 30]), 3, 1),
      ),
    ).toEqual([1, 1, 2]);
  });
});

describe('bad representations', () => {
  it('fail with a stable code naming the episode, step and dimension', () => {
    const dataset = stateDataset({ stateDim: 2, steps: 5, train: 1, test: 2, seed: 1 });
    const settings = { config: evalConfig(), discount: 0.8, scale: 1 };
    const short = { ...identityRepresentation(2), encode: () => new Float32Array(3) };
    expect(() => buildContext(short, dataset, settings)).toThrow(
      expect.objectContaining({
        code: 'encode-shape',
        message: expect.stringMatching(/expected \[5, 2\] = 10 values, got 3/) as string,
      }),
    );
    const nan = {
      ...identityRepresentation(2),
      encode: (_: Float32Array, n: number) => new Float32Array(n * 2).fill(NaN),
    };
    expect(() => buildContext(nan, dataset, settings)).toThrow(
      expect.objectContaining({
        code: 'encode-non-finite',
        message: expect.stringMatching(/step 0, dimension 0/) as string,
      }),
    );
  });

  it('refuse a dataset without test episodes with a stable code', async () => {
    const dataset = {
      ...stateDataset({ stateDim: 2, steps: 5, train: 1, test: 1, seed: 1 }),
      test: [],
    };
    await expect(
      evaluateRepresentation(identityRepresentation(2), dataset, evalSpec(evalConfig())),
    ).rejects.toMatchObject({
      code: 'no-test-episodes',
    });
  });

  it('still get marginal diagnostics when the covariance is singular', () => {
    // A constant dimension: Mardia and Henze–Zirkler need S⁻¹ and are skipped with a note;
    // KS and the eigenvalues (one of them 0) still report the collapse.
    const dataset = stateDataset({ stateDim: 2, steps: 30, train: 2, test: 10, seed: 1 });
    const flat = {
      ...identityRepresentation(2),
      encode: (obs: Float32Array, n: number) =>
        Float32Array.from({ length: n * 2 }, (_, i) => (i % 2 === 0 ? obs[i]! : 0)),
    };
    const config = evalConfig({ suites: ['assumptions'], transitions: [] });
    const context = buildContext(flat, dataset, { config, discount: 0.8, scale: 1 });
    const out = runAssumptionsSuite(context);
    expect(out.metrics.some((m) => m.metric === 'hz_p')).toBe(false);
    expect(out.metrics.find((m) => m.metric === 'cov_eig_min')!.value).toBeCloseTo(0, 12);
    expect((out.artifacts as { skipped: string }).skipped).toMatch(/singular/);
  });
});
