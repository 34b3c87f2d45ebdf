import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../../runner/data/load-dataset.ts';
import { renderLamp } from '../../../runner/data/sources/swinging-lamp.ts';
import { makeDataConfig } from '../make-data-config.ts';

/** (row, col) of the brightest pixel. */
function brightest(img: Float32Array, side: number): [number, number] {
  let best = 0;
  for (let i = 1; i < img.length; i++) if (img[i]! > img[best]!) best = i;
  return [Math.floor(best / side), best % side];
}

describe('swinging-lamp source', () => {
  it('renders the bulb below the pivot at θ = 0 and to the right at θ = π/2', () => {
    const side = 16;
    const img = new Float32Array(side * side);
    renderLamp(0, side, img);
    const [r0, c0] = brightest(img, side);
    expect(r0).toBeGreaterThan(side / 2 + 3);
    expect(Math.abs(c0 + 0.5 - side / 2)).toBeLessThanOrEqual(1);
    renderLamp(Math.PI / 2, side, img);
    const [r1, c1] = brightest(img, side);
    expect(c1).toBeGreaterThan(side / 2 + 3);
    expect(Math.abs(r1 + 0.5 - side / 2)).toBeLessThanOrEqual(1);
  });

  it('yields image×image frames with the image shape set and wrapped angles as state', async () => {
    const ds = await loadDataset(
      makeDataConfig({ source: 'swinging-lamp', image: 12, episodes: 6, steps: 30 }),
      '.',
    );
    expect(ds.imageShape).toEqual([12, 12]);
    expect(ds.obsDim).toBe(144);
    expect(ds.standardisation?.mode).toBe('global');
    for (const ep of ds.train) {
      expect(ep.obs.length).toBe(30 * 144);
      for (let t = 0; t < ep.steps; t++) {
        expect(Math.abs(ep.state![2 * t]!)).toBeLessThanOrEqual(Math.PI + 1e-6);
      }
    }
  });
});
