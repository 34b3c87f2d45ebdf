/**
 * Oracle rows in jump units: the best possible inference on exactly the jump tasks the
 * learned per-jump sources answer (same episodes, start indices and realised step gaps),
 * computed on the true latent state with the true per-step F, Q. A gap of k steps is the
 * k-step transition F^k, Σ_{j<k} F^j Q F^{jᵀ} (gap-inference.ts), so learned jump inference and
 * the optimum sit side by side in one table. Emitted whenever the experiment evaluates a
 * per-jump source (critic, or fitted on geometric pairs): a property of the configuration,
 * not of the method, so every method and seed gets the same rows.
 */
import type { EvalConfig } from '../../config/types.ts';
import { trueTransition, type TransitionModel } from '../../inference/index.ts';
import { fromArray } from '../../numeric/matrix.ts';
import { gatherStates, metricRow, tasksFor, type EvalContext } from '../context.ts';
import { bridgeOnGaps, createGapTable, forecastOnGap } from '../gap-inference.ts';
import type { MetricRow } from '../metric.ts';
import { normalisedError, poolRows, traceCovariance } from '../moments.ts';

/** The true per-step model and tr Cov(state), or null without a known model and states. */
export function oracleSetup(
  context: EvalContext,
): { model: TransitionModel; spread: number } | null {
  const known = context.dataset.model;
  if (known === undefined || context.test.some((e) => e.state === undefined)) return null;
  const s = known.stateDim;
  const model = trueTransition(fromArray(s, s, known.F), fromArray(s, s, known.Q));
  const pooled = poolRows(
    context.test.map((e) => ({ data: e.state!, rows: e.steps })),
    s,
  );
  return { model, spread: traceCovariance(pooled.data, pooled.rows, s) };
}

/** Whether the configuration asks for a per-jump source (then jump-unit oracle rows exist). */
export function wantsJumpOracle(config: EvalConfig): boolean {
  return (
    config.transitions.includes('critic') ||
    (config.transitions.includes('fitted') && config.fit === 'geometric')
  );
}

/**
 * `bridge_nmse_oracle` (unit 'jump') for each waypoint count T, with per-waypoint NMSE for the
 * bridge profile: each task's waypoints inferred from its true start and goal states.
 */
export function bridgeJumpOracle(context: EvalContext): { T: number; n: number; nmse: number[] }[] {
  const setup = oracleSetup(context);
  if (setup === null || !wantsJumpOracle(context.config)) return [];
  const { model, spread } = setup;
  const s = model.dim;
  const table = createGapTable(model);
  const out: { T: number; n: number; nmse: number[] }[] = [];
  for (const T of context.config.waypoints) {
    const tasks = tasksFor(context, 'bridge', T + 1, 'jump');
    const count = tasks.length;
    if (count === 0) continue;
    const starts = gatherStates(context.test, tasks, 0, s); // [count, s]
    const goals = gatherStates(context.test, tasks, T + 1, s); // [count, s]
    const means = new Float64Array(count * T * s); // [count, T, s]
    tasks.forEach((task, q) => {
      const mu = bridgeOnGaps(
        model,
        table,
        task.times,
        starts.subarray(q * s, (q + 1) * s),
        goals.subarray(q * s, (q + 1) * s),
      );
      means.set(mu, q * T * s);
    });
    const nmse: number[] = [];
    for (let k = 0; k < T; k++) {
      const predicted = new Float64Array(count * s);
      for (let q = 0; q < count; q++)
        predicted.set(means.subarray((q * T + k) * s, (q * T + k + 1) * s), q * s);
      const truth = gatherStates(context.test, tasks, k + 1, s);
      nmse.push(normalisedError(predicted, truth, count, s, spread));
    }
    out.push({ T, n: count, nmse });
  }
  return out;
}

/** `forecast_nmse_oracle` (unit 'jump') at each of `eval.jumps`: mean F^k s₀, k the realised steps. */
export function forecastJumpOracleRows(context: EvalContext): MetricRow[] {
  const setup = oracleSetup(context);
  if (setup === null || !wantsJumpOracle(context.config)) return [];
  const { model, spread } = setup;
  const s = model.dim;
  const table = createGapTable(model);
  return context.config.jumps.map((h) => {
    const tasks = tasksFor(context, 'forecast', h, 'jump');
    const count = tasks.length;
    const starts = gatherStates(context.test, tasks, 0, s);
    const truth = gatherStates(context.test, tasks, h, s);
    const means = new Float64Array(count * s); // [count, s]
    tasks.forEach((task, q) => {
      const steps = task.times[h]! - task.times[0]!;
      means.set(forecastOnGap(model, table, starts.subarray(q * s, (q + 1) * s), steps), q * s);
    });
    const nmse = normalisedError(means, truth, count, s, spread);
    return metricRow('forecast', 'forecast_nmse_oracle', h, 'true', nmse, {
      n: count,
      unit: 'jump',
    });
  });
}
