/**
 * χ² distribution with `df` degrees of freedom (df > 0, not necessarily an integer).
 */
import { normalQuantile } from './normal.ts';
import { gammaP, gammaQ, invertCdf, logGamma } from './special.ts';

/** Distribution function P(X ≤ x) = P(df/2, x/2) (Abramowitz & Stegun 26.4.19). */
export function chiSquareCdf(x: number, df: number): number {
  if (!(df > 0)) return NaN;
  return gammaP(df / 2, Math.max(0, x) / 2);
}

/** Upper tail P(X > x), accurate for small p-values. */
export function chiSquareTail(x: number, df: number): number {
  if (!(df > 0)) return NaN;
  return gammaQ(df / 2, Math.max(0, x) / 2);
}

/** Density of χ²_df. */
export function chiSquarePdf(x: number, df: number): number {
  if (x < 0) return 0;
  if (x === 0) return df === 2 ? 0.5 : df < 2 ? Infinity : 0;
  const k = df / 2;
  return Math.exp((k - 1) * Math.log(x) - x / 2 - k * Math.LN2 - logGamma(k));
}

/**
 * Quantile of χ²_df. Start from the Wilson & Hilferty (1931) cube-root normal approximation,
 * then refine on the exact distribution function.
 */
export function chiSquareQuantile(p: number, df: number): number {
  if (Number.isNaN(p) || p < 0 || p > 1 || !(df > 0)) return NaN;
  if (p === 0) return 0;
  if (p === 1) return Infinity;
  const a = 2 / (9 * df);
  const start = Math.max(1e-8, df * (1 - a + normalQuantile(p) * Math.sqrt(a)) ** 3);
  let hi = Math.max(start, df, 1);
  while (chiSquareCdf(hi, df) < p) hi *= 2;
  // Upper quantiles are solved on the upper tail so p close to 1 keeps its precision.
  if (p > 0.5) {
    return invertCdf(
      (x) => -chiSquareTail(x, df),
      (x) => chiSquarePdf(x, df),
      -(1 - p),
      start,
      [0, hi],
    );
  }
  return invertCdf(
    (x) => chiSquareCdf(x, df),
    (x) => chiSquarePdf(x, df),
    p,
    start,
    [0, hi],
  );
}
