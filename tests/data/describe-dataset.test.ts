import { describe, expect, it } from 'vitest';
import { describeDataset, renderAsciiFrames } from '../../runner/data/describe-dataset.ts';
import type { Dataset } from '../../runner/data/episode.ts';

const episode = (values: number[], state?: number[]): Dataset['train'][number] => ({
  obs: Float32Array.from(values),
  steps: values.length / 2,
  obsDim: 2,
  ...(state ? { state: Float32Array.from(state), stateDim: 1 } : {}),
});

describe('describeDataset', () => {
  it('counts episodes and steps per split and takes column ranges over every split', () => {
    const ds: Dataset = {
      name: 'toy',
      description: 'two columns',
      obsDim: 2,
      stateDim: 1,
      train: [episode([0, 10, 1, 11, 2, 12], [0, 1, 2]), episode([-1, 5, 0, 6], [3, 4])],
      val: [],
      test: [episode([4, -3, 5, -2], [5, 6])],
    };
    const s = describeDataset(ds);
    expect(s.splits.train).toEqual({ episodes: 2, steps: 5, minSteps: 2, maxSteps: 3 });
    expect(s.splits.val).toEqual({ episodes: 0, steps: 0, minSteps: 0, maxSteps: 0 });
    expect(s.obsRanges).toEqual([
      { min: -1, max: 5 },
      { min: -3, max: 12 },
    ]);
    expect(s.obsRange).toEqual({ min: -3, max: 12 });
    expect(s.stateRanges).toEqual([{ min: 0, max: 6 }]);
    expect(s.standardised).toBe('no');
  });
});

describe('renderAsciiFrames', () => {
  it('draws the brightest pixel as @ and a dark background as blanks, two characters per pixel', () => {
    const frame = new Float32Array(9); // [3, 3]
    frame[4] = 1;
    const lines = renderAsciiFrames([frame], [3, 3]);
    expect(lines).toEqual(['      ', '  @@  ', '      ']);
  });
});
