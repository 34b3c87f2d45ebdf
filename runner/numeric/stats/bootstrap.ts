/**
 * Percentile bootstrap interval (Efron & Tibshirani, "An Introduction to the Bootstrap",
 * 1993, §13.3), seeded by the project's one PRNG so tables are reproducible.
 */
import { createRng } from '../random.ts';
import { quantileSorted } from './summary.ts';

export interface BootstrapOptions {
  /** Resamples drawn. (default 2000) */
  resamples?: number;
  /** Interval level. (default 0.95) */
  level?: number;
  /** PRNG seed. (default 0) */
  seed?: number;
}

export interface BootstrapInterval {
  /** The statistic on the original values. */
  estimate: number;
  low: number;
  high: number;
}

/**
 * Percentile interval of `statistic` over resamples drawn with replacement. An empty list
 * gives NaN throughout; one value gives a zero-width interval (every resample is that value).
 */
export function bootstrapInterval(
  values: ArrayLike<number>,
  statistic: (sample: Float64Array) => number,
  options: BootstrapOptions = {},
): BootstrapInterval {
  const { resamples = 2000, level = 0.95, seed = 0 } = options;
  const n = values.length;
  const original = Float64Array.from(values);
  if (n === 0) return { estimate: NaN, low: NaN, high: NaN };
  const rng = createRng(seed);
  const stats = new Float64Array(resamples);
  const sample = new Float64Array(n);
  for (let r = 0; r < resamples; r++) {
    for (let i = 0; i < n; i++) sample[i] = original[rng.int(n)]!;
    stats[r] = statistic(sample);
  }
  stats.sort();
  const alpha = (1 - level) / 2;
  return {
    estimate: statistic(original),
    low: quantileSorted(stats, alpha),
    high: quantileSorted(stats, 1 - alpha),
  };
}
