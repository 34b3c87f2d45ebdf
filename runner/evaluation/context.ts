/**
 * What every evaluation suite receives: the encoded episodes, the transition models by
 * source, optional decoders to the true state, and the evaluation settings. Suites are pure
 * functions of this context.
 */
import type { EvalConfig, TransitionSource } from '../config/types.ts';
import type { Dataset } from '../data/episode.ts';
import type { TransitionModel } from '../inference/index.ts';
import type { Representation } from '../training/representation.ts';
import type { MetricRow } from './metric.ts';
import {
  chainLabel,
  drawChainTasks,
  taskRng,
  type ChainTask,
  type TransitionUnit,
} from './tasks.ts';

/** One episode in representation space. */
export interface EncodedEpisode {
  /** [steps, dim] */
  codes: Float64Array;
  steps: number;
  /** [steps, stateDim] true state, when the dataset knows it. */
  state?: Float32Array;
}

/** A transition model and what one of its transitions means. */
export interface SourceModel {
  source: TransitionSource;
  unit: TransitionUnit;
  model: TransitionModel;
}

/** Maps representations back to the true state (MATH.md §4, decoding). */
export interface StateDecoders {
  stateDim: number;
  /** tr Cov(state) over the test episodes: the normaliser of state-space NMSE. */
  spread: number;
  /** Ridge probe fitted on training encodings → states: [count, dim] → [count, stateDim]. */
  probe(codes: Float64Array, count: number): Float64Array;
  /** State of the nearest encoded training observation: [count, dim] → [count, stateDim]. */
  nearest(codes: Float64Array, count: number): Float64Array;
}

export interface EvalContext {
  representation: Representation;
  dataset: Dataset;
  config: EvalConfig;
  dim: number;
  /** γ of the training config: fixes what one jump means. */
  discount: number;
  /** Target marginal variance c (the critic's, else the training config's). */
  scale: number;
  test: EncodedEpisode[];
  train: EncodedEpisode[];
  /** tr Cov(ψ) over all test steps: the normaliser of NMSE (MATH.md §4). */
  spread: number;
  models: SourceModel[];
  decoders?: StateDecoders;
  /** Repairs and skipped sources, for the diagnostics artifact. */
  notes: string[];
}

/** What a suite returns: tidy metrics and plot data (stored as a JSON artifact). */
export interface SuiteOutput {
  metrics: MetricRow[];
  artifacts?: Record<string, unknown>;
}

/** The shared chain tasks of a kind, length and unit (same for every method: eval seed only). */
export function tasksFor(
  context: EvalContext,
  kind: 'forecast' | 'bridge',
  transitions: number,
  unit: TransitionUnit,
): ChainTask[] {
  const request = {
    transitions,
    unit,
    discount: context.discount,
    count: context.config.queries,
  };
  const lengths = context.test.map((e) => e.steps);
  return drawChainTasks(lengths, request, taskRng(context.config.seed, chainLabel(kind, request)));
}

/** Encodings at position `index` of every task's chain: [tasks, dim]. */
export function gatherCodes(
  episodes: readonly EncodedEpisode[],
  tasks: readonly ChainTask[],
  index: number,
  dim: number,
): Float64Array {
  const out = new Float64Array(tasks.length * dim);
  tasks.forEach((task, i) => {
    const t = task.times[index]!;
    out.set(episodes[task.episode]!.codes.subarray(t * dim, (t + 1) * dim), i * dim);
  });
  return out;
}

/** True states at position `index` of every task's chain: [tasks, stateDim]. */
export function gatherStates(
  episodes: readonly EncodedEpisode[],
  tasks: readonly ChainTask[],
  index: number,
  stateDim: number,
): Float64Array {
  const out = new Float64Array(tasks.length * stateDim);
  tasks.forEach((task, i) => {
    const t = task.times[index]!;
    const state = episodes[task.episode]!.state;
    if (state === undefined) throw new RangeError(`test episode ${task.episode} has no true state`);
    for (let j = 0; j < stateDim; j++) out[i * stateDim + j] = state[t * stateDim + j]!;
  });
  return out;
}

/** A metric row with the unit of its level. */
export function metricRow(
  suite: string,
  metric: string,
  level: number | string,
  source: string,
  value: number,
  extra: { n?: number; unit?: TransitionUnit } = {},
): MetricRow {
  return { suite, metric, level, source, value, ...extra };
}
