/**
 * Number formatting shared by every human-readable output (Markdown, LaTeX, HTML, SVG), so a
 * value reads the same everywhere. Machine outputs (CSV, JSON) keep full precision.
 */

/** Below this a value is rounding noise of a sum (e.g. the spread of equal values). */
const TINY = 1e-9;

/** Fixed notation stops being readable outside [1e-3, 1e6): such values get an exponent. */
function needsExponent(x: number): boolean {
  const a = Math.abs(x);
  return a >= TINY && (a < 1e-3 || a >= 1e6);
}

/** Decimal places that show `x` with `digits` significant digits (0..8). */
export function decimalsFor(x: number, digits = 3): number {
  if (!Number.isFinite(x) || Math.abs(x) < TINY) return digits - 1;
  const magnitude = Math.floor(Math.log10(Math.abs(x)));
  return Math.min(8, Math.max(0, digits - 1 - magnitude));
}

/**
 * `x` with three significant digits: fixed notation, or 1.23e-5 style for very small or very
 * large values; '–' for a missing value. An explicit `decimals` forces fixed notation.
 */
export function formatValue(x: number, decimals?: number): string {
  if (!Number.isFinite(x)) return '–';
  if (decimals === undefined && needsExponent(x)) return x.toExponential(2);
  const text = x.toFixed(decimals ?? decimalsFor(x));
  // "-0.000" reads as a sign error; show the zero plainly.
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

/** Half-width of an interval, NaN when either end is missing. */
export function halfWidth(low: number, high: number): number {
  return Number.isFinite(low) && Number.isFinite(high) ? (high - low) / 2 : Number.NaN;
}

/**
 * "mean ± half-width" with the same decimals for both (set by the mean, or by the
 * half-width when it is smaller, so the interval never rounds to ± 0). Values that would
 * need more than five decimals, or are a million or more, use exponents instead.
 */
export function formatMeanInterval(
  mean: number,
  low: number,
  high: number,
  plusMinus = '±',
): { mean: string; interval: string; text: string } {
  const half = halfWidth(low, high);
  const spread = Number.isFinite(half) && half > TINY;
  const decimals = spread ? Math.max(decimalsFor(mean), decimalsFor(half, 2)) : decimalsFor(mean);
  const exponent = decimals > 5 || Math.abs(mean) >= 1e6;
  const m =
    exponent && Math.abs(mean) >= TINY
      ? mean.toExponential(2)
      : formatValue(mean, Math.min(5, decimals));
  if (!Number.isFinite(half)) return { mean: m, interval: '', text: m };
  const h =
    exponent && spread
      ? half.toExponential(1)
      : formatValue(spread ? half : 0, Math.min(5, decimals));
  return { mean: m, interval: h, text: `${m} ${plusMinus} ${h}` };
}
