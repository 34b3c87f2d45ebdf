/**
 * Calibration suite (MATH.md §4): are the predicted covariances honest? For forecasts (each
 * horizon) and bridges (each waypoint count, every waypoint's marginal), per transition
 * source: coverage of the 50/80/90/95 % credible ellipsoids — D² against χ²_d quantiles —
 * and the negative log-likelihood per dimension. Tasks are those of the forecast and bridge
 * suites.
 */
import { forecastBatch, prepareBridge } from '../../inference/index.ts';
import type { MetricRow } from '../metric.ts';
import {
  gatherCodes,
  metricRow,
  tasksFor,
  type EvalContext,
  type SourceModel,
  type SuiteOutput,
} from '../context.ts';
import {
  COVERAGE_LEVELS,
  scoreGaussian,
  summariseScores,
  type GaussianScores,
} from '../gaussian-scores.ts';
import { waypointSlice } from './bridge.ts';
import { horizonsFor } from './forecast.ts';

/** Runs the calibration suite. */
export function runCalibrationSuite(context: EvalContext): SuiteOutput {
  const metrics: MetricRow[] = [];
  const histograms: { target: string; source: string; level: number; pit: number[] }[] = [];
  for (const source of context.models) {
    for (const h of horizonsFor(context, source)) {
      const scores = forecastScores(context, source, h);
      if (scores === null) continue;
      const summary = summariseScores([scores], context.dim);
      metrics.push(...rows('', h, source, summary));
      histograms.push({ target: 'forecast', source: source.source, level: h, pit: summary.pit });
    }
    for (const T of context.config.waypoints) {
      const scores = bridgeScores(context, source, T);
      if (scores.length === 0) continue;
      const summary = summariseScores(scores, context.dim);
      metrics.push(...rows('bridge_', T, source, summary));
      histograms.push({ target: 'bridge', source: source.source, level: T, pit: summary.pit });
    }
  }
  return { metrics, artifacts: { histograms } };
}

function rows(
  prefix: string,
  level: number,
  source: SourceModel,
  summary: ReturnType<typeof summariseScores>,
): MetricRow[] {
  const extra = { n: summary.n, unit: source.unit };
  const out = COVERAGE_LEVELS.map((c) =>
    metricRow(
      'calibration',
      `${prefix}coverage_${c}`,
      level,
      source.source,
      summary.coverage[c],
      extra,
    ),
  );
  out.push(
    metricRow('calibration', `${prefix}nll_per_dim`, level, source.source, summary.nll, extra),
  );
  return out;
}

function forecastScores(
  context: EvalContext,
  source: SourceModel,
  h: number,
): GaussianScores | null {
  const tasks = tasksFor(context, 'forecast', h, source.unit);
  if (tasks.length === 0) return null;
  const starts = gatherCodes(context.test, tasks, 0, context.dim);
  const truth = gatherCodes(context.test, tasks, h, context.dim);
  const { means, cov } = forecastBatch(source.model, starts, tasks.length, h);
  return scoreGaussian(means, cov, truth, tasks.length);
}

/** One score set per waypoint, each under that waypoint's marginal covariance. */
function bridgeScores(context: EvalContext, source: SourceModel, T: number): GaussianScores[] {
  const { dim } = context;
  const tasks = tasksFor(context, 'bridge', T + 1, source.unit);
  const count = tasks.length;
  if (count === 0) return [];
  const starts = gatherCodes(context.test, tasks, 0, dim);
  const goals = gatherCodes(context.test, tasks, T + 1, dim);
  const posterior = prepareBridge(source.model, T).solve(starts, goals, count);
  const out: GaussianScores[] = [];
  for (let k = 0; k < T; k++) {
    const truth = gatherCodes(context.test, tasks, k + 1, dim);
    const mean = waypointSlice(posterior.means, count, T, k, dim);
    out.push(scoreGaussian(mean, posterior.covariances[k]!, truth, count));
  }
  return out;
}
