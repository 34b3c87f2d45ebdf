/**
 * Bridge suite (MATH.md §3–4): for each transition source and waypoint count T, infer the T
 * waypoints between an observed start and goal (T + 1 transitions apart) and score them
 * against the true intermediate encodings: NMSE per waypoint and overall, the baselines
 * "midpoint" and "copy the nearer endpoint" on the same tasks, retrieval of the truth among
 * the same waypoint of every task (top-1, mean reciprocal rank), state-space error through
 * decoding and, with a known model, the oracle: the optimal smoother (Rauch, Tung & Striebel
 * 1965) on the true latent state with the true F, Q, on the step tasks and (jump-oracle.ts) on
 * the jump tasks with their realised step gaps.
 */
import { prepareBridge, trueTransition } from '../../inference/index.ts';
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
import { bridgeJumpOracle } from './jump-oracle.ts';
import { retrievalRanks } from './retrieval.ts';

/** Per-waypoint errors of one (source, T), for plots. */
export interface BridgeProfile {
  source: string;
  unit: string;
  T: number;
  n: number;
  /** [T] NMSE of each waypoint; baselines alike. */
  nmse: number[];
  midpoint: number[];
  nearer: number[];
}

/** Waypoint k's slice [count, dim] of bridge means [count, T, dim]. */
export function waypointSlice(
  means: Float64Array,
  count: number,
  T: number,
  k: number,
  dim: number,
): Float64Array {
  const out = new Float64Array(count * dim);
  for (let q = 0; q < count; q++)
    out.set(means.subarray((q * T + k) * dim, (q * T + k + 1) * dim), q * dim);
  return out;
}

/** Runs the bridge suite. */
export function runBridgeSuite(context: EvalContext): SuiteOutput {
  const metrics: MetricRow[] = [];
  const profiles: BridgeProfile[] = [];
  for (const source of context.models) {
    for (const T of context.config.waypoints) {
      const result = bridgeRows(context, source, T);
      metrics.push(...result.metrics);
      if (result.profile !== null) profiles.push(result.profile);
    }
  }
  const oracle = bridgeOracle(context);
  metrics.push(...oracle.metrics);
  profiles.push(...oracle.profiles);
  // The same oracle on the jump tasks the per-jump sources answer (realised step gaps).
  for (const { T, n, nmse } of bridgeJumpOracle(context)) {
    const value = nmse.reduce((a, b) => a + b, 0) / T;
    metrics.push(
      metricRow('bridge', 'bridge_nmse_oracle', T, 'true', value, { n: n * T, unit: 'jump' }),
    );
    profiles.push({ source: 'oracle', unit: 'jump', T, n, nmse, midpoint: [], nearer: [] });
  }
  return { metrics, artifacts: { profiles } };
}

function bridgeRows(
  context: EvalContext,
  source: SourceModel,
  T: number,
): { metrics: MetricRow[]; profile: BridgeProfile | null } {
  const { dim, spread } = context;
  const tasks = tasksFor(context, 'bridge', T + 1, source.unit);
  const count = tasks.length;
  const extra = { n: count * T, unit: source.unit };
  const name = source.source;
  if (count === 0)
    return { metrics: [metricRow('bridge', 'bridge_nmse', T, name, NaN, extra)], profile: null };
  const starts = gatherCodes(context.test, tasks, 0, dim);
  const goals = gatherCodes(context.test, tasks, T + 1, dim);
  const { means } = prepareBridge(source.model, T).solve(starts, goals, count);
  const midpoint = starts.map((v, i) => 0.5 * (v + goals[i]!));
  const profile: BridgeProfile = {
    source: name,
    unit: source.unit,
    T,
    n: count,
    nmse: [],
    midpoint: [],
    nearer: [],
  };
  let reciprocal = 0;
  let top1 = 0;
  let top5 = 0;
  const probeTruth: Float64Array[] = [];
  for (let k = 0; k < T; k++) {
    const truth = gatherCodes(context.test, tasks, k + 1, dim);
    const predicted = waypointSlice(means, count, T, k, dim);
    // Nearer endpoint by position in the chain; a tie (the middle of an even span) copies the start.
    const nearer = k + 1 <= T + 1 - (k + 1) ? starts : goals;
    profile.nmse.push(normalisedError(predicted, truth, count, dim, spread));
    profile.midpoint.push(normalisedError(midpoint, truth, count, dim, spread));
    profile.nearer.push(normalisedError(nearer, truth, count, dim, spread));
    const ranks = retrievalRanks(predicted, truth, count, dim);
    for (const r of ranks) {
      reciprocal += 1 / r;
      if (r === 1) top1 += 1;
      if (r <= 5) top5 += 1;
    }
    probeTruth.push(predicted);
  }
  const average = (values: number[]): number => values.reduce((s, v) => s + v, 0) / values.length;
  const metrics = [
    metricRow('bridge', 'bridge_nmse', T, name, average(profile.nmse), extra),
    metricRow('bridge', 'bridge_nmse_midpoint', T, name, average(profile.midpoint), extra),
    metricRow('bridge', 'bridge_nmse_nearer', T, name, average(profile.nearer), extra),
    metricRow('bridge', 'bridge_top1', T, name, top1 / (count * T), extra),
    metricRow('bridge', 'bridge_top5', T, name, top5 / (count * T), extra),
    metricRow('bridge', 'bridge_mrr', T, name, reciprocal / (count * T), extra),
  ];
  metrics.push(...stateRows(context, tasks, probeTruth, T, name, extra));
  return { metrics, profile };
}

/** Waypoint error in state space through the probe and nearest-neighbour decoding. */
function stateRows(
  context: EvalContext,
  tasks: ReturnType<typeof tasksFor>,
  waypoints: Float64Array[],
  T: number,
  source: string,
  extra: { n: number; unit: 'step' | 'jump' },
): MetricRow[] {
  const decoders = context.decoders;
  if (decoders === undefined) return [];
  const s = decoders.stateDim;
  const count = tasks.length;
  let probe = 0;
  let knn = 0;
  waypoints.forEach((predicted, k) => {
    const states = gatherStates(context.test, tasks, k + 1, s);
    probe +=
      normalisedError(decoders.probe(predicted, count), states, count, s, decoders.spread) / T;
    knn +=
      normalisedError(decoders.nearest(predicted, count), states, count, s, decoders.spread) / T;
  });
  return [
    metricRow('bridge', 'bridge_state_nmse_probe', T, source, probe, extra),
    metricRow('bridge', 'bridge_state_nmse_knn', T, source, knn, extra),
  ];
}

/** The optimal smoother on the true latent state with the true F, Q (step tasks). */
function bridgeOracle(context: EvalContext): { metrics: MetricRow[]; profiles: BridgeProfile[] } {
  const model = context.dataset.model;
  if (model === undefined || context.test.some((e) => e.state === undefined))
    return { metrics: [], profiles: [] };
  const s = model.stateDim;
  const truthModel = trueTransition(fromArray(s, s, model.F), fromArray(s, s, model.Q));
  const pooled = poolRows(
    context.test.map((e) => ({ data: e.state!, rows: e.steps })),
    s,
  );
  const spread = traceCovariance(pooled.data, pooled.rows, s);
  const metrics: MetricRow[] = [];
  const profiles: BridgeProfile[] = [];
  for (const T of context.config.waypoints) {
    const tasks = tasksFor(context, 'bridge', T + 1, 'step');
    const count = tasks.length;
    if (count === 0) continue;
    const starts = gatherStates(context.test, tasks, 0, s);
    const goals = gatherStates(context.test, tasks, T + 1, s);
    const { means } = prepareBridge(truthModel, T).solve(starts, goals, count);
    const nmse: number[] = [];
    for (let k = 0; k < T; k++) {
      const truth = gatherStates(context.test, tasks, k + 1, s);
      nmse.push(normalisedError(waypointSlice(means, count, T, k, s), truth, count, s, spread));
    }
    const value = nmse.reduce((a, b) => a + b, 0) / T;
    metrics.push(
      metricRow('bridge', 'bridge_nmse_oracle', T, 'true', value, { n: count * T, unit: 'step' }),
    );
    profiles.push({ source: 'oracle', unit: 'step', T, n: count, nmse, midpoint: [], nearer: [] });
  }
  return { metrics, profiles };
}
