import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../../runner/data/load-dataset.ts';
import { makeDataConfig } from '../make-data-config.ts';

describe('rover-maze source', () => {
  it.each(['open-hall', 'long-corridors'] as const)(
    '%s: walks move one open cell at a time',
    async (layout) => {
      const ds = await loadDataset(
        makeDataConfig({ source: 'rover-maze', layout, episodes: 20, steps: 50, obsDim: 8 }),
        '.',
      );
      const maze = ds.maze!;
      expect(ds.stateDim).toBe(2);
      for (const ep of [...ds.train, ...ds.val, ...ds.test]) {
        for (let t = 0; t < ep.steps; t++) {
          const cell = ep.state![2 * t]! * maze.width + ep.state![2 * t + 1]!;
          expect(maze.walls[cell]).toBe(0);
          if (t > 0) {
            const prev = ep.state![2 * t - 2]! * maze.width + ep.state![2 * t - 1]!;
            expect(maze.distance(prev, cell)).toBeLessThanOrEqual(1);
          }
        }
      }
    },
  );

  it('maze.observe(cell) is the noiseless reading in the standardised units of the data', async () => {
    const noise = 0.05;
    const ds = await loadDataset(
      makeDataConfig({ source: 'rover-maze', episodes: 30, steps: 60, obsDim: 6, noise }),
      '.',
    );
    const maze = ds.maze!;
    const scale = ds.standardisation!.scale;
    let sq = 0;
    let count = 0;
    for (const ep of ds.train) {
      for (let t = 0; t < ep.steps; t++) {
        const cell = ep.state![2 * t]! * maze.width + ep.state![2 * t + 1]!;
        const clean = maze.observe(cell);
        for (let k = 0; k < 6; k++) {
          sq += ((ep.obs[t * 6 + k]! - clean[k]!) * scale[k]!) ** 2;
          count++;
        }
      }
    }
    // In raw units the residual is the sensor noise: its RMS must match `noise` (±10 %).
    expect(Math.sqrt(sq / count)).toBeGreaterThan(0.9 * noise);
    expect(Math.sqrt(sq / count)).toBeLessThan(1.1 * noise);
  });
});
