/** Small helpers shared by the SVG charts: fixed-precision coordinates and tick labels. */
import { formatValue } from '../format-number.ts';
import { escapeHtml } from '../html/escape.ts';

/** A pixel coordinate with one decimal: stable text, byte for byte, on every machine. */
export function px(value: number): string {
  const text = value.toFixed(1);
  return text === '-0.0' ? '0.0' : text;
}

/** A tick label: integers plainly, others with three significant digits. */
export function tickLabel(value: number): string {
  return Number.isInteger(value) && Math.abs(value) < 1e6 ? String(value) : formatValue(value);
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
