/**
 * Two-sided t-tests for comparing methods over seeds.
 */
import { mean, sampleVariance } from './summary.ts';
import { studentTTail } from './student-t.ts';

export interface TTestResult {
  t: number;
  df: number;
  /** Two-sided p-value. */
  p: number;
}

/**
 * Welch's unequal-variance t-test (Welch, 1947) with the Welch–Satterthwaite degrees of
 * freedom (Satterthwaite, 1946). Needs at least two values per group (else NaN).
 */
export function welchTTest(a: ArrayLike<number>, b: ArrayLike<number>): TTestResult {
  const na = a.length;
  const nb = b.length;
  if (na < 2 || nb < 2) return { t: NaN, df: NaN, p: NaN };
  const va = sampleVariance(a) / na;
  const vb = sampleVariance(b) / nb;
  const t = (mean(a) - mean(b)) / Math.sqrt(va + vb);
  const df = (va + vb) ** 2 / ((va * va) / (na - 1) + (vb * vb) / (nb - 1));
  return { t, df, p: twoSided(t, df) };
}

/**
 * Paired t-test on the differences a[i] - b[i] (same seeds, same tasks), df = n - 1.
 * Throws when the lengths differ: pairs must line up.
 */
export function pairedTTest(a: ArrayLike<number>, b: ArrayLike<number>): TTestResult {
  if (a.length !== b.length) {
    throw new RangeError(`paired t-test: expected equal lengths, got ${a.length} and ${b.length}`);
  }
  const n = a.length;
  if (n < 2) return { t: NaN, df: NaN, p: NaN };
  const diff = new Float64Array(n);
  for (let i = 0; i < n; i++) diff[i] = a[i]! - b[i]!;
  const t = mean(diff) / Math.sqrt(sampleVariance(diff) / n);
  return { t, df: n - 1, p: twoSided(t, n - 1) };
}

function twoSided(t: number, df: number): number {
  if (Number.isNaN(t)) return NaN;
  return Math.min(1, 2 * studentTTail(t, df));
}
