/**
 * Number formatting shared by every human-readable output (Markdown, LaTeX, HTML, SVG), so a
 * value reads the same everywhere. Machine outputs (CSV, JSON) keep full precision.
 */

/** Decimal places that show `x` with `digits` significant digits (0..8). */
export function decimalsFor(x: number, digits = 3): number {
  // Below 1e-9 a value is rounding noise of a sum (e.g. the spread of equal values).
  if (!Number.isFinite(x) || Math.abs(x) < 1e-9) return digits - 1;
  const magnitude = Math.floor(Math.log10(Math.abs(x)));
  return Math.min(8, Math.max(0, digits - 1 - magnitude));
}

/** `x` with three significant digits (fixed notation); '–' for a missing value. */
export function formatValue(x: number, decimals = decimalsFor(x)): string {
  if (!Number.isFinite(x)) return '–';
  const text = x.toFixed(decimals);
  // "-0.000" reads as a sign error; show the zero plainly.
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/** Half-width of an interval, NaN when either end is missing. */
export function halfWidth(low: number, high: number): number {
  return Number.isFinite(low) && Number.isFinite(high) ? (high - low) / 2 : Number.NaN;
}

/**
 * "mean ± half-width" with the same decimals for both (set by the mean, or by the
 * half-width when it is smaller, so the interval never rounds to ± 0).
 */
export function formatMeanInterval(
  mean: number,
  low: number,
  high: number,
  plusMinus = '±',
): { mean: string; interval: string; text: string } {
  const half = halfWidth(low, high);
  const decimals =
    Number.isFinite(half) && half > 0
      ? Math.max(decimalsFor(mean), decimalsFor(half, 2))
      : decimalsFor(mean);
  const m = formatValue(mean, Math.min(8, decimals));
  if (!Number.isFinite(half)) return { mean: m, interval: '', text: m };
  const h = formatValue(half, Math.min(8, decimals));
  return { mean: m, interval: h, text: `${m} ${plusMinus} ${h}` };
}
