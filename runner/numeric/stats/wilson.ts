/**
 * Wilson score interval for a binomial proportion (Wilson, 1927; recommended by
 * Newcombe, 1998, and Agresti & Coull, 1998, over the Wald interval).
 */
import { normalQuantile } from './normal.ts';

/** Interval for the success probability after `successes` out of `n` trials. */
export function wilsonInterval(
  successes: number,
  n: number,
  level = 0.95,
): { low: number; high: number } {
  if (!(n > 0) || successes < 0 || successes > n) return { low: NaN, high: NaN };
  const z = normalQuantile(1 - (1 - level) / 2);
  const p = successes / n;
  const z2n = (z * z) / n;
  const centre = (p + z2n / 2) / (1 + z2n);
  const half = (z / (1 + z2n)) * Math.sqrt((p * (1 - p)) / n + z2n / (4 * n));
  return { low: Math.max(0, centre - half), high: Math.min(1, centre + half) };
}
