/**
 * A line chart with one line per series and the 95 % interval of each point drawn as an error
 * bar (or, for dense x such as training steps, as a shaded band). The intervals are the ones
 * the tables show, computed once by the aggregation. Output is a plain SVG string with no ids,
 * no timestamps and fixed-precision numbers, so the same data gives the same bytes.
 */
import { escapeHtml } from '../html/escape.ts';
import { seriesColour, seriesDash } from './palette.ts';
import { linearScale, log2Scale, pointScale, type Scale } from './scale.ts';
import { px, svgText, textWidth, tickLabels } from './svg-format.ts';

export interface ChartPoint {
  x: number;
  y: number;
  /** Interval ends; omitted or NaN when there is no interval (one seed). */
  lo?: number;
  hi?: number;
}

export interface ChartSeries {
  name: string;
  points: ChartPoint[];
  /** Dashed line (used for oracle / reference series). */
  dashed?: boolean;
}

export interface LineChartSpec {
  title: string;
  xLabel: string;
  yLabel: string;
  /** 'log2' for dimensions, 'points' for a few discrete values, 'linear' for dense x. */
  xScale: 'linear' | 'log2' | 'points';
  /** Draw intervals as a shaded band instead of error bars. */
  band?: boolean;
  series: ChartSeries[];
}

const WIDTH = 340;
const PLOT_HEIGHT = 190;
const MARGIN = { left: 50, right: 12, top: 24, bottom: 36 };
const LEGEND_ROW = 15;

function finite(v: number | undefined): v is number {
  return v !== undefined && Number.isFinite(v);
}

function scalesOf(spec: LineChartSpec): { x: Scale; y: Scale } {
  const points = spec.series.flatMap((s) => s.points);
  const xs = points.map((p) => p.x);
  const ys = points.flatMap((p) => [p.y, p.lo, p.hi].filter(finite));
  const x0 = MARGIN.left;
  const x1 = WIDTH - MARGIN.right;
  const x =
    spec.xScale === 'log2' && xs.every((v) => v > 0)
      ? log2Scale(xs, x0, x1)
      : spec.xScale === 'points' && new Set(xs).size <= 10
        ? pointScale(xs, x0, x1)
        : linearScale(Math.min(...xs), Math.max(...xs), x0, x1);
  const y = linearScale(Math.min(...ys), Math.max(...ys), MARGIN.top + PLOT_HEIGHT, MARGIN.top);
  return { x, y };
}

function axes(spec: LineChartSpec, x: Scale, y: Scale): string[] {
  const bottom = MARGIN.top + PLOT_HEIGHT;
  const parts = [
    `<path class="axis" d="M${px(MARGIN.left)} ${px(MARGIN.top)}V${px(bottom)}H${px(WIDTH - MARGIN.right)}" fill="none" stroke="#333" stroke-width="0.8"/>`,
  ];
  const yLabels = tickLabels(y.ticks);
  y.ticks.forEach((t, i) => {
    const yy = y.map(t);
    parts.push(
      `<path d="M${px(MARGIN.left)} ${px(yy)}H${px(WIDTH - MARGIN.right)}" stroke="#e3e0d8" stroke-width="0.6"/>`,
    );
    parts.push(svgText(MARGIN.left - 5, yy + 3.5, yLabels[i] ?? '', { 'text-anchor': 'end' }));
  });
  const xLabels = tickLabels(x.ticks);
  x.ticks.forEach((t, i) => {
    const xx = x.map(t);
    parts.push(`<path d="M${px(xx)} ${px(bottom)}v4" stroke="#333" stroke-width="0.8"/>`);
    parts.push(svgText(xx, bottom + 15, xLabels[i] ?? '', { 'text-anchor': 'middle' }));
  });
  parts.push(
    svgText((MARGIN.left + WIDTH - MARGIN.right) / 2, bottom + 30, spec.xLabel, {
      'text-anchor': 'middle',
      class: 'axis-label',
    }),
  );
  parts.push(
    svgText(12, MARGIN.top + PLOT_HEIGHT / 2, spec.yLabel, {
      'text-anchor': 'middle',
      class: 'axis-label',
      transform: `rotate(-90 12 ${px(MARGIN.top + PLOT_HEIGHT / 2)})`,
    }),
  );
  parts.push(svgText(MARGIN.left, 14, spec.title, { class: 'chart-title' }));
  return parts;
}

function seriesMarks(
  series: ChartSeries,
  index: number,
  x: Scale,
  y: Scale,
  band: boolean,
): string[] {
  const colour = seriesColour(index);
  const dash = seriesDash(index, series.dashed ?? false);
  const dashAttr = dash ? ` stroke-dasharray="${dash}"` : '';
  const points = [...series.points].sort((a, b) => a.x - b.x);
  const parts: string[] = [];
  const withInterval = points.filter((p) => finite(p.lo) && finite(p.hi));
  if (band && withInterval.length >= 2) {
    const upper = withInterval.map((p) => `${px(x.map(p.x))},${px(y.map(p.hi ?? p.y))}`);
    const lower = [...withInterval]
      .reverse()
      .map((p) => `${px(x.map(p.x))},${px(y.map(p.lo ?? p.y))}`);
    parts.push(
      `<polygon points="${[...upper, ...lower].join(' ')}" fill="${colour}" fill-opacity="0.15" stroke="none"/>`,
    );
  } else {
    for (const p of withInterval) {
      const xx = px(x.map(p.x));
      parts.push(
        `<path d="M${xx} ${px(y.map(p.lo ?? p.y))}V${px(y.map(p.hi ?? p.y))}" stroke="${colour}" stroke-width="1.2"/>`,
      );
    }
  }
  const path = points
    .map((p, i) => `${i === 0 ? 'M' : 'L'}${px(x.map(p.x))} ${px(y.map(p.y))}`)
    .join('');
  parts.push(`<path d="${path}" fill="none" stroke="${colour}" stroke-width="1.6"${dashAttr}/>`);
  if (!band) {
    for (const p of points)
      parts.push(
        `<circle cx="${px(x.map(p.x))}" cy="${px(y.map(p.y))}" r="2.4" fill="${colour}"/>`,
      );
  }
  return parts;
}

/** Lays the legend out in rows under the plot; returns the marks and the height used. */
export function legend(
  names: { name: string; dashed: boolean }[],
  top: number,
): { parts: string[]; height: number } {
  const parts: string[] = [];
  let xPos = MARGIN.left;
  let row = 0;
  names.forEach(({ name, dashed }, i) => {
    const width = 22 + textWidth(name) + 12;
    if (xPos + width > WIDTH && xPos > MARGIN.left) {
      row += 1;
      xPos = MARGIN.left;
    }
    const yy = top + row * LEGEND_ROW;
    const dash = seriesDash(i, dashed);
    parts.push(
      `<path d="M${px(xPos)} ${px(yy - 4)}h16" stroke="${seriesColour(i)}" stroke-width="2"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`,
    );
    parts.push(svgText(xPos + 20, yy, name));
    xPos += width;
  });
  return { parts, height: names.length === 0 ? 0 : (row + 1) * LEGEND_ROW };
}

/** Renders the chart as a standalone <svg> element. */
export function renderLineChart(spec: LineChartSpec): string {
  const series = spec.series.filter((s) => s.points.some((p) => finite(p.y)));
  const clean = {
    ...spec,
    series: series.map((s) => ({ ...s, points: s.points.filter((p) => finite(p.y)) })),
  };
  const { x, y } = scalesOf(clean);
  const body = [...axes(clean, x, y)];
  clean.series.forEach((s, i) => body.push(...seriesMarks(s, i, x, y, spec.band ?? false)));
  const legendTop = MARGIN.top + PLOT_HEIGHT + MARGIN.bottom + 8;
  const key = legend(
    clean.series.map((s) => ({ name: s.name, dashed: s.dashed ?? false })),
    legendTop,
  );
  const height = legendTop + key.height;
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" class="chart" viewBox="0 0 ${WIDTH} ${px(height)}" width="${WIDTH}" height="${px(height)}" role="img" font-family="inherit" font-size="11">`,
    `<title>${escapeHtml(spec.title)}</title>`,
    ...body,
    ...key.parts,
    '</svg>',
  ].join('\n');
}
