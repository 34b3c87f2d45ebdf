/**
 * Student's t distribution (any real df > 0; Welch's df is fractional).
 */
import { normalCdf, normalQuantile } from './normal.ts';
import { betaIncomplete, invertCdf, logGamma } from './special.ts';

/** Upper tail P(T > |t|) for T ~ t_df, via I_x(df/2, 1/2), x = df/(df+t²) (A&S 26.7.1, 26.5.27). */
export function studentTTail(t: number, df: number): number {
  if (Number.isNaN(t) || !(df > 0)) return NaN;
  if (df === Infinity) return normalCdf(-Math.abs(t));
  if (!Number.isFinite(t)) return 0;
  return 0.5 * betaIncomplete(df / (df + t * t), df / 2, 0.5);
}

/** Distribution function of Student's t with `df` degrees of freedom. */
export function studentTCdf(t: number, df: number): number {
  const tail = studentTTail(t, df);
  return t < 0 ? tail : 1 - tail;
}

/** Density of Student's t. */
export function studentTPdf(t: number, df: number): number {
  if (df === Infinity) return Math.exp(-0.5 * t * t) / Math.sqrt(2 * Math.PI);
  const logC = logGamma((df + 1) / 2) - logGamma(df / 2) - 0.5 * Math.log(df * Math.PI);
  return Math.exp(logC - ((df + 1) / 2) * Math.log1p((t * t) / df));
}

/** Quantile of Student's t: the t with P(T ≤ t) = p. */
export function studentTQuantile(p: number, df: number): number {
  if (Number.isNaN(p) || p < 0 || p > 1 || !(df > 0)) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  if (df === Infinity) return normalQuantile(p);
  if (p > 0.5) return -studentTQuantile(1 - p, df);
  // Lower tail (t < 0): solve tail(t) = p on a bracket grown from the normal quantile.
  let lo = Math.min(normalQuantile(p), -1);
  while (studentTTail(lo, df) > p) lo *= 2;
  return invertCdf(
    (t) => studentTTail(t, df),
    (t) => studentTPdf(t, df),
    p,
    normalQuantile(p),
    [lo, 0],
  );
}
