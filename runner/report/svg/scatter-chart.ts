/**
 * A 2-D scatter of projected representations (one point per observation), coloured along a
 * light-to-dark ramp by an ordering value such as the time step, so a trajectory's direction
 * reads from the shading. Same byte-for-byte rules as the line chart.
 */
import { escapeHtml } from '../html/escape.ts';
import { linearScale } from './scale.ts';
import { px, svgText, tickLabels } from './svg-format.ts';

export interface ScatterSpec {
  /** First title line (the method). */
  title: string;
  /** Second title line (setting and seed). */
  subtitle: string;
  /** [count][2] */
  points: [number, number][];
  /** One ordering value per point (e.g. time step); points are drawn darker as it grows. */
  colour?: number[];
}

const SIZE = 230;
const LEFT = 42;
const TOP = 34;
const BOTTOM = SIZE - 22;
const RIGHT = SIZE - 8;

/** Light sand to deep blue, linear in RGB: t in [0, 1]. */
function ramp(t: number): string {
  const from = [222, 203, 160];
  const to = [31, 78, 121];
  const channel = (i: number): string =>
    Math.round((from[i] ?? 0) + ((to[i] ?? 0) - (from[i] ?? 0)) * t)
      .toString(16)
      .padStart(2, '0');
  return `#${channel(0)}${channel(1)}${channel(2)}`;
}

/** Shortens a title line to what fits the panel (about 42 characters at 10 px). */
function fit(text: string): string {
  return text.length <= 42 ? text : `${text.slice(0, 41)}…`;
}

/** Renders the scatter; points with a non-finite coordinate are skipped. */
export function renderScatter(spec: ScatterSpec): string {
  const kept = spec.points
    .map((p, i) => ({ p, c: spec.colour?.[i] ?? i }))
    .filter(({ p }) => Number.isFinite(p[0]) && Number.isFinite(p[1]));
  const xs = kept.map(({ p }) => p[0]);
  const ys = kept.map(({ p }) => p[1]);
  const x = linearScale(Math.min(...xs), Math.max(...xs), LEFT, RIGHT);
  const y = linearScale(Math.min(...ys), Math.max(...ys), BOTTOM, TOP);
  const cs = kept.map(({ c }) => c);
  const cMin = Math.min(...cs);
  const cSpan = Math.max(...cs) - cMin || 1;
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" class="chart scatter" viewBox="0 0 ${SIZE} ${SIZE}" width="${SIZE}" height="${SIZE}" role="img" font-family="inherit" font-size="10">`,
    `<title>${escapeHtml(`${spec.title}, ${spec.subtitle}`)}</title>`,
    svgText(4, 12, fit(spec.title), { class: 'chart-title' }),
    svgText(4, 25, fit(spec.subtitle), { class: 'axis-label' }),
    `<rect x="${LEFT}" y="${TOP}" width="${RIGHT - LEFT}" height="${BOTTOM - TOP}" fill="none" stroke="#bbb" stroke-width="0.6"/>`,
  ];
  const xLabels = tickLabels(x.ticks);
  x.ticks.forEach((t, i) =>
    parts.push(svgText(x.map(t), BOTTOM + 13, xLabels[i] ?? '', { 'text-anchor': 'middle' })),
  );
  const yLabels = tickLabels(y.ticks);
  y.ticks.forEach((t, i) =>
    parts.push(svgText(LEFT - 4, y.map(t) + 3, yLabels[i] ?? '', { 'text-anchor': 'end' })),
  );
  for (const { p, c } of kept) {
    parts.push(
      `<circle cx="${px(x.map(p[0]))}" cy="${px(y.map(p[1]))}" r="2.2" fill="${ramp((c - cMin) / cSpan)}"/>`,
    );
  }
  parts.push('</svg>');
  return parts.join('\n');
}
