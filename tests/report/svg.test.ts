import { describe, expect, it } from 'vitest';
import { renderLineChart } from '../../runner/report/svg/line-chart.ts';
import { niceTicks } from '../../runner/report/svg/scale.ts';
import { tickLabels } from '../../runner/report/svg/svg-format.ts';

describe('niceTicks', () => {
  it('labels with 1, 2 or 5 × 10^k steps covering the range (Heckbert, Graphics Gems, 1990)', () => {
    // Heckbert's loose labelling of [0.13, 0.96] with about 5 ticks: step 0.2 (worked by hand).
    expect(niceTicks(0.13, 0.96)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(0, 200)).toEqual([0, 50, 100, 150, 200]);
    expect(niceTicks(3, 3).length).toBeGreaterThan(1);
  });

  it('prints each axis with the decimals its step needs', () => {
    expect(tickLabels([0, 0.2, 0.4])).toEqual(['0.0', '0.2', '0.4']);
    expect(tickLabels([0, 50, 100])).toEqual(['0', '50', '100']);
    expect(tickLabels([0.25, 0.3, 0.35])).toEqual(['0.25', '0.30', '0.35']);
  });
});

describe('renderLineChart', () => {
  const spec = {
    title: 'a <b> & "c"',
    xLabel: 'dim',
    yLabel: 'nmse',
    xScale: 'log2' as const,
    series: [
      {
        name: '</text><script>x</script>',
        points: [
          { x: 4, y: 0.5, lo: 0.4, hi: 0.6 },
          { x: 8, y: 0.3, lo: 0.25, hi: 0.35 },
        ],
      },
    ],
  };

  it('escapes every label and is the same string every time', () => {
    const svg = renderLineChart(spec);
    expect(svg).not.toContain('<script>');
    expect(svg).toContain('&lt;/text&gt;&lt;script&gt;');
    expect(svg).toContain('a &lt;b&gt; &amp; &quot;c&quot;');
    expect(renderLineChart(spec)).toBe(svg);
  });

  it('draws one error bar per point that has an interval', () => {
    const svg = renderLineChart(spec);
    // Error bars are vertical paths "M x y1 V y2" in the series colour.
    expect(svg.match(/<path d="M[\d.]+ [\d.]+V[\d.]+" stroke="#1f4e79"/g)).toHaveLength(2);
  });
});
