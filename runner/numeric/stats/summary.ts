/**
 * Summaries of a handful of values (typically one metric over training seeds).
 */
import { studentTQuantile } from './student-t.ts';

export interface Summary {
  n: number;
  mean: number;
  /** Sample standard deviation (divisor n - 1); NaN when n < 2. */
  std: number;
  /** Student-t interval for the mean; NaN..NaN when n < 2 (no spread to estimate). */
  ciLow: number;
  ciHigh: number;
}

/** Arithmetic mean; NaN for an empty list. */
export function mean(values: ArrayLike<number>): number {
  if (values.length === 0) return NaN;
  let s = 0;
  for (let i = 0; i < values.length; i++) s += values[i]!;
  return s / values.length;
}

/** Sample variance with divisor n - 1 (two-pass for accuracy); NaN when n < 2. */
export function sampleVariance(values: ArrayLike<number>): number {
  const n = values.length;
  if (n < 2) return NaN;
  const m = mean(values);
  let s = 0;
  for (let i = 0; i < n; i++) s += (values[i]! - m) ** 2;
  return s / (n - 1);
}

/**
 * Mean, sample standard deviation and the Student-t interval
 * mean ± t_{(1+level)/2, n-1} · s/√n (Student, 1908). With n = 1 the standard deviation
 * and the interval are NaN: one value says nothing about spread. Non-finite values are
 * kept (they propagate), so a diverged run is never silently dropped.
 */
export function summarise(values: number[], level = 0.95): Summary {
  const n = values.length;
  const m = mean(values);
  const std = Math.sqrt(sampleVariance(values));
  if (n < 2) return { n, mean: m, std: NaN, ciLow: NaN, ciHigh: NaN };
  const half = studentTQuantile((1 + level) / 2, n - 1) * (std / Math.sqrt(n));
  return { n, mean: m, std, ciLow: m - half, ciHigh: m + half };
}

/**
 * Interquartile mean: the mean of the middle half after dropping ⌊n/4⌋ values from each
 * end, the 25 % trimmed mean used by Agarwal et al. (2021, "Deep RL at the edge of the
 * statistical precipice", §4) for few-run comparisons. NaN for an empty list.
 */
export function interquartileMean(values: ArrayLike<number>): number {
  const n = values.length;
  if (n === 0) return NaN;
  const sorted = Float64Array.from(values).sort();
  const cut = Math.floor(n / 4);
  return mean(sorted.subarray(cut, n - cut));
}

/**
 * Sample quantile by linear interpolation between order statistics (Hyndman & Fan 1996,
 * definition 7). `sorted` must be ascending.
 */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}
