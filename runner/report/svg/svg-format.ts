/** Small helpers shared by the SVG charts: fixed-precision coordinates and tick labels. */
import { escapeHtml } from '../html/escape.ts';

/** A pixel coordinate with one decimal: stable text, byte for byte, on every machine. */
export function px(value: number): string {
  const text = value.toFixed(1);
  return text === '-0.0' ? '0.0' : text;
}

/**
 * Tick labels of one axis, all with the decimals their spacing needs (0.2, 0.4 … rather
 * than 0.200, 0.400), so labels line up and never show noise digits.
 */
export function tickLabels(ticks: readonly number[]): string[] {
  let step = Infinity;
  for (let i = 1; i < ticks.length; i++)
    step = Math.min(step, Math.abs((ticks[i] ?? 0) - (ticks[i - 1] ?? 0)));
  const integers = ticks.every((t) => Number.isInteger(t));
  const decimals =
    integers || !Number.isFinite(step) || step === 0
      ? 0
      : Math.max(0, Math.ceil(-Math.log10(step) - 1e-9));
  return ticks.map((t) => {
    const text = t.toFixed(Math.min(decimals, 8));
    return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
  });
}

/** An SVG <text> element with escaped content. */
export function svgText(
  x: number,
  y: number,
  text: string,
  attributes: Record<string, string> = {},
): string {
  const extra = Object.entries(attributes)
    .map(([k, v]) => ` ${k}="${escapeHtml(v)}"`)
    .join('');
  return `<text x="${px(x)}" y="${px(y)}"${extra}>${escapeHtml(text)}</text>`;
}

/** Rough width of `text` at the charts' 11 px font, for laying out legends. */
export function textWidth(text: string): number {
  return text.length * 6.2;
}
