import { PCA } from 'ml-pca';
import { describe, expect, it } from 'vitest';
import { buildContext } from '../../runner/evaluation/build-context.ts';
import {
  projectPca,
  runProjectionsSuite,
  type Projection,
} from '../../runner/evaluation/suites/projections.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { evalConfig, identityRepresentation, stateDataset } from './fixtures.ts';

describe('PCA projection', () => {
  it('matches ml-pca (independent implementation) up to the sign of each axis', () => {
    const rng = createRng(5);
    const rows = Array.from({ length: 60 }, () => {
      const a = rng.normal();
      return [3 * a + 0.1 * rng.normal(), a - rng.normal(), rng.normal() * 0.5, 2 * rng.normal()];
    });
    const ours = projectPca(rows, 4);
    const reference = new PCA(rows);
    const projected = reference.predict(rows, { nComponents: 2 }).to2DArray();
    for (let axis = 0; axis < 2; axis++) {
      const sign = Math.sign(ours.points[0]![axis]!) === Math.sign(projected[0]![axis]!) ? 1 : -1;
      rows.forEach((_, i) =>
        expect(ours.points[i]![axis]!).toBeCloseTo(sign * projected[i]![axis]!, 8),
      );
    }
    const explained = reference.getExplainedVariance();
    expect(ours.explained[0]).toBeCloseTo(explained[0]!, 10);
    expect(ours.explained[1]).toBeCloseTo(explained[1]!, 10);
  });
});

describe('UMAP projection', () => {
  it('is reproducible for an evaluation seed and carries the true state for colouring', () => {
    const dataset = stateDataset({ stateDim: 3, steps: 10, train: 2, test: 8, seed: 1 });
    const config = evalConfig({ suites: ['projections'], projection: 'umap' });
    const run = (): Projection => {
      const context = buildContext(identityRepresentation(3), dataset, {
        config,
        discount: 0.8,
        scale: 1,
      });
      const out = runProjectionsSuite(context);
      expect(out.metrics).toEqual([]);
      return (out.artifacts as { projection: Projection }).projection;
    };
    const a = run();
    expect(a.method).toBe('umap');
    expect(a.points.length).toBe(80);
    expect(a.state!.length).toBe(80);
    expect(a.points.every((p) => p.length === 2 && p.every(Number.isFinite))).toBe(true);
    expect(run().points).toEqual(a.points);
  });
});
