/**
 * Evaluation tasks: which test episode, which start index, which offsets. Drawn from the
 * evaluation seed and the test episodes' lengths only — never from the representation or the
 * training seed — so every method and training seed of an experiment answers the same tasks
 * and rows compare pairwise (MATH.md §4, paired comparisons).
 */
import { createRng, type Rng } from '../numeric/random.ts';

/** What one transition means: one environment step, or one geometric jump (MATH.md §2). */
export type TransitionUnit = 'step' | 'jump';

/**
 * A chain of observed times in one episode: times[0] the start, times[n] the end (the goal of
 * a bridge, the target of a forecast), interior times the true waypoints. n = transitions.
 */
export interface ChainTask {
  episode: number;
  times: number[];
}

export interface ChainTaskRequest {
  /** Transitions in the chain (forecast horizon, or waypoints + 1 for a bridge). */
  transitions: number;
  unit: TransitionUnit;
  /** γ of the geometric law P(k) = (1-γ)γ^(k-1), used when unit = 'jump'. */
  discount: number;
  /** Tasks wanted; fewer come back when the episodes are too short (see attempts). */
  count: number;
}

/** A fresh stream for one labelled task list: same seed and label, same tasks. */
export function taskRng(seed: number, label: string): Rng {
  return createRng(seed).fork(label);
}

/** Draws one geometric offset k ≥ 1 with P(k) = (1-γ)γ^(k-1) by inversion (common practice). */
export function drawGeometric(rng: Rng, discount: number): number {
  const u = 1 - rng.next(); // (0, 1]
  return Math.max(1, Math.ceil(Math.log(u) / Math.log(discount)));
}

/**
 * Draws chain tasks over episodes of the given lengths. Jump offsets are drawn first and a
 * chain that does not fit its episode is redrawn whole, not clipped (MATH.md §1: clipping piles
 * mass on the last step); the start is then uniform over the places the chain fits. The
 * redraw conditions long chains on fitting, which shortens them; up to 50 attempts per task
 * are made, and a level with too-short episodes returns fewer tasks (reported as `n`).
 */
export function drawChainTasks(
  lengths: readonly number[],
  request: ChainTaskRequest,
  rng: Rng,
): ChainTask[] {
  const { transitions, unit, discount, count } = request;
  const tasks: ChainTask[] = [];
  if (lengths.length === 0 || transitions < 1) return tasks;
  const offsets = new Array<number>(transitions);
  for (let attempt = 0; attempt < 50 * count && tasks.length < count; attempt++) {
    const episode = rng.int(lengths.length);
    let span = 0;
    for (let i = 0; i < transitions; i++) {
      offsets[i] = unit === 'step' ? 1 : drawGeometric(rng, discount);
      span += offsets[i]!;
    }
    const room = lengths[episode]! - 1 - span;
    if (room < 0) continue;
    const times = [rng.int(room + 1)];
    for (let i = 0; i < transitions; i++) times.push(times[i]! + offsets[i]!);
    tasks.push({ episode, times });
  }
  return tasks;
}

/** The label of a chain task list, so forecasts, bridges and calibration share lists. */
export function chainLabel(kind: 'forecast' | 'bridge', request: ChainTaskRequest): string {
  const gamma = request.unit === 'jump' ? `:g${request.discount}` : '';
  return `${kind}:${request.unit}:${request.transitions}${gamma}`;
}
