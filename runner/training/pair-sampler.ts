/**
 * Positive pairs for temporal InfoNCE (MATH.md §1): an anchor x_t drawn uniformly among the
 * steps that have a successor, and its positive x_{t+k} with k from the geometric law
 * P(k) = (1−γ)γ^(k−1), k ≥ 1. An offset that runs past the episode's end is redrawn, never
 * clipped (clipping would pile probability on the last step).
 */
import type { Episode } from '../data/episode.ts';
import type { Rng } from '../numeric/random.ts';
import { TrainingError } from './training-error.ts';

/** Draws k ≥ 1 with P(k) = (1−γ)γ^(k−1) by inversion: k = 1 + ⌊log U / log γ⌋ (common practice). */
export function drawGeometric(rng: Rng, gamma: number): number {
  const u = 1 - rng.next(); // (0, 1]
  return 1 + Math.floor(Math.log(u) / Math.log(gamma));
}

/** A batch of pairs: rows of x and y are [batch, obsDim]. */
export interface PairBatch {
  x: Float32Array;
  y: Float32Array;
  size: number;
}

/** Samples batches of (anchor, positive) pairs from a list of episodes. */
export class PairSampler {
  /** Cumulative count of anchors (steps with a successor) per episode. */
  private readonly cumulative: number[] = [];
  private readonly total: number;
  readonly obsDim: number;

  constructor(
    private readonly episodes: Episode[],
    private readonly gamma: number,
    where = 'dataset',
  ) {
    let total = 0;
    for (const e of episodes) {
      total += Math.max(0, e.steps - 1);
      this.cumulative.push(total);
    }
    this.total = total;
    if (total === 0) {
      throw new TrainingError(
        'dataset-too-short',
        `expected at least one episode with 2 or more steps, got ${episodes.length} episodes with none; raise data.steps`,
        where,
      );
    }
    this.obsDim = episodes[0]!.obsDim;
  }

  /** Index of an anchor: episode and step. */
  private locate(anchor: number): [Episode, number] {
    let lo = 0;
    let hi = this.cumulative.length - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.cumulative[mid]! > anchor) hi = mid;
      else lo = mid + 1;
    }
    const before = lo === 0 ? 0 : this.cumulative[lo - 1]!;
    return [this.episodes[lo]!, anchor - before];
  }

  /** Draws `size` pairs; anchor, then offset (redrawn until it lands inside the episode). */
  sample(rng: Rng, size: number): PairBatch {
    const d = this.obsDim;
    const x = new Float32Array(size * d);
    const y = new Float32Array(size * d);
    for (let i = 0; i < size; i++) {
      const [episode, t] = this.locate(rng.int(this.total));
      let k = drawGeometric(rng, this.gamma);
      while (t + k >= episode.steps) k = drawGeometric(rng, this.gamma);
      x.set(episode.obs.subarray(t * d, (t + 1) * d), i * d);
      y.set(episode.obs.subarray((t + k) * d, (t + k + 1) * d), i * d);
    }
    return { x, y, size };
  }
}
