/**
 * Forecast suite (MATH.md §4): for each transition source and horizon, the normalised
 * error NMSE = ‖μ - ψ_true‖² / tr Cov(ψ) of the n-transition forecast mean, the persistence
 * baseline (ψ_true ≈ ψ₀) on the same tasks, skill against both, and the error in state space
 * through the probe and through nearest-neighbour decoding. On datasets with a known model,
 * the oracle: the true model forecasting the true latent state, at step horizons and (through
 * jump-oracle.ts) on the jump tasks with their realised step counts.
 */
import { forecastBatch, trueTransition } from '../../inference/index.ts';
import { fromArray } from '../../numeric/matrix.ts';
import type { MetricRow } from '../metric.ts';
import {
  gatherCodes,
  gatherStates,
  metricRow,
  tasksFor,
  type EvalContext,
  type SourceModel,
  type SuiteOutput,
} from '../context.ts';
import { normalisedError, poolRows, traceCovariance } from '../moments.ts';
import { forecastJumpOracleRows } from './jump-oracle.ts';

/** Horizons evaluated for a source: steps for step models, jumps for jump models. */
export function horizonsFor(context: EvalContext, source: SourceModel): number[] {
  return source.unit === 'step' ? context.config.horizons : context.config.jumps;
}

/** Runs the forecast suite. */
export function runForecastSuite(context: EvalContext): SuiteOutput {
  const metrics: MetricRow[] = [];
  const fittedError = new Map<string, number>(); // `${unit}:${h}` → fitted NMSE
  const errors: { source: string; unit: string; h: number; nmse: number; n: number }[] = [];
  for (const source of context.models) {
    for (const h of horizonsFor(context, source)) {
      const rows = forecastRows(context, source, h);
      metrics.push(...rows.metrics);
      errors.push({ source: source.source, unit: source.unit, h, nmse: rows.nmse, n: rows.n });
      if (source.source === 'fitted') fittedError.set(`${source.unit}:${h}`, rows.nmse);
    }
  }
  // Skill against the fitted model, on the same tasks (same unit and horizon).
  for (const e of errors) {
    const fitted = fittedError.get(`${e.unit}:${e.h}`);
    if (e.source === 'fitted' || fitted === undefined) continue;
    const unit = e.unit === 'step' ? 'step' : 'jump';
    metrics.push(
      metricRow('forecast', 'forecast_skill_vs_fitted', e.h, e.source, 1 - e.nmse / fitted, {
        unit,
      }),
    );
  }
  metrics.push(...forecastOracleRows(context), ...forecastJumpOracleRows(context));
  return { metrics, artifacts: { errors } };
}

function forecastRows(
  context: EvalContext,
  source: SourceModel,
  h: number,
): { metrics: MetricRow[]; nmse: number; n: number } {
  const { dim, spread, decoders } = context;
  const tasks = tasksFor(context, 'forecast', h, source.unit);
  const count = tasks.length;
  const extra = { n: count, unit: source.unit };
  const name = source.source;
  if (count === 0)
    return {
      metrics: [metricRow('forecast', 'forecast_nmse', h, name, NaN, extra)],
      nmse: NaN,
      n: 0,
    };
  const starts = gatherCodes(context.test, tasks, 0, dim);
  const truth = gatherCodes(context.test, tasks, h, dim);
  const { means } = forecastBatch(source.model, starts, count, h);
  const nmse = normalisedError(means, truth, count, dim, spread);
  const persistence = normalisedError(starts, truth, count, dim, spread);
  const metrics = [
    metricRow('forecast', 'forecast_nmse', h, name, nmse, extra),
    metricRow('forecast', 'forecast_nmse_persistence', h, name, persistence, extra),
    metricRow('forecast', 'forecast_skill', h, name, 1 - nmse / persistence, extra),
  ];
  if (decoders !== undefined) {
    const s = decoders.stateDim;
    const states = gatherStates(context.test, tasks, h, s);
    const probe = normalisedError(decoders.probe(means, count), states, count, s, decoders.spread);
    const knn = normalisedError(decoders.nearest(means, count), states, count, s, decoders.spread);
    metrics.push(metricRow('forecast', 'forecast_state_nmse_probe', h, name, probe, extra));
    metrics.push(metricRow('forecast', 'forecast_state_nmse_knn', h, name, knn, extra));
  }
  return { metrics, nmse, n: count };
}

/** The true model on the true latent state: the best possible forecast (Kalman prediction). */
function forecastOracleRows(context: EvalContext): MetricRow[] {
  const model = context.dataset.model;
  if (model === undefined || context.test.some((e) => e.state === undefined)) return [];
  const s = model.stateDim;
  const truthModel = trueTransition(fromArray(s, s, model.F), fromArray(s, s, model.Q));
  const pooled = poolRows(
    context.test.map((e) => ({ data: e.state!, rows: e.steps })),
    s,
  );
  const spread = traceCovariance(pooled.data, pooled.rows, s);
  return context.config.horizons.map((h) => {
    const tasks = tasksFor(context, 'forecast', h, 'step');
    const starts = gatherStates(context.test, tasks, 0, s);
    const truth = gatherStates(context.test, tasks, h, s);
    const { means } = forecastBatch(truthModel, starts, tasks.length, h);
    const nmse = normalisedError(means, truth, tasks.length, s, spread);
    return metricRow('forecast', 'forecast_nmse_oracle', h, 'true', nmse, {
      n: tasks.length,
      unit: 'step',
    });
  });
}
