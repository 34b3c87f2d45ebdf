import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createMazeEnvironment } from '../../../runner/data/maze/maze-environment.ts';
import { LAYOUTS, parseMazeLayout } from '../../../runner/data/maze/maze-layouts.ts';

const noObs = (): Float32Array => new Float32Array(0);

// Hand-drawn maze; the distances below were counted by hand on this drawing.
//   col 0123456
const HAND = `
#######
#.....#
#.###.#
#...#.#
###.#.#
#.....#
#######`;

describe('maze environment (breadth-first search, Moore 1959)', () => {
  const layout = parseMazeLayout(HAND);
  const env = createMazeEnvironment(layout, noObs);
  const cell = (r: number, c: number): number => r * layout.width + c;

  it.each([
    [[1, 1], [1, 1], 0],
    [[1, 1], [3, 3], 4], // down the left side, then right along row 3
    [[1, 1], [5, 1], 8], // through (4,3) and left along the bottom row
    [[1, 1], [3, 5], 6], // along the top, then down the right side
    [[3, 1], [5, 5], 6], // (3,2) (3,3) (4,3) (5,3) (5,4) (5,5)
    [[1, 5], [5, 1], 8], // either way round the loop is 8
  ] as const)('distance %j → %j is %i', (from, to, d) => {
    expect(env.distance(cell(from[0], from[1]), cell(to[0], to[1]))).toBe(d);
    expect(env.distance(cell(to[0], to[1]), cell(from[0], from[1]))).toBe(d);
  });

  it('walls block moves and neighbours are the open 4-neighbours', () => {
    expect(env.neighbours(cell(1, 1)).sort((a, b) => a - b)).toEqual([cell(1, 2), cell(2, 1)]);
    expect(env.step!(cell(1, 1), 0)).toBe(cell(1, 1)); // up into the wall: stays
    expect(env.step!(cell(1, 1), 1)).toBe(cell(1, 2));
  });

  it('an enclosed cell is unreachable (Infinity)', () => {
    const split = createMazeEnvironment(parseMazeLayout('#####\n#.#.#\n#####'), noObs);
    expect(split.distance(6, 8)).toBe(Infinity);
  });

  it.each(Object.keys(LAYOUTS))(
    'built-in layout %s: every free cell reaches every other',
    (name) => {
      const l = parseMazeLayout(LAYOUTS[name as keyof typeof LAYOUTS]);
      const e = createMazeEnvironment(l, noObs);
      const free = e.freeCells!;
      expect(free.length).toBeGreaterThan(20);
      for (const c of free) expect(e.distance(free[0]!, c)).toBeLessThan(Infinity);
    },
  );

  it('long-corridors has dead ends and detours, open-hall has neither', () => {
    const stats = (name: keyof typeof LAYOUTS): { deadEnds: number; detour: number } => {
      const l = parseMazeLayout(LAYOUTS[name]);
      const e = createMazeEnvironment(l, noObs);
      const free = e.freeCells!;
      let detour = 0;
      for (const a of free) {
        for (const b of free) {
          const manhattan =
            Math.abs(Math.floor(a / l.width) - Math.floor(b / l.width)) +
            Math.abs((a % l.width) - (b % l.width));
          detour = Math.max(detour, e.distance(a, b) / Math.max(1, manhattan));
        }
      }
      return { deadEnds: free.filter((c) => e.neighbours(c).length === 1).length, detour };
    };
    const hall = stats('open-hall');
    const corridors = stats('long-corridors');
    expect(hall.deadEnds).toBe(0);
    expect(corridors.deadEnds).toBe(6); // counted on the drawing
    expect(corridors.detour).toBeGreaterThan(3 * hall.detour);
  });

  it('BFS distance is a metric on free cells (property test)', () => {
    const l = parseMazeLayout(LAYOUTS['long-corridors']);
    const e = createMazeEnvironment(l, noObs);
    const free = e.freeCells!;
    const pick = fc.integer({ min: 0, max: free.length - 1 }).map((i) => free[i]!);
    fc.assert(
      fc.property(pick, pick, pick, (a, b, c) => {
        expect(e.distance(a, b)).toBe(e.distance(b, a));
        expect(e.distance(a, c)).toBeLessThanOrEqual(e.distance(a, b) + e.distance(b, c));
        // One move changes the distance to any target by exactly one (unit-cost grid).
        for (const n of e.neighbours(a))
          expect(Math.abs(e.distance(n, c) - e.distance(a, c))).toBe(1);
      }),
    );
  });
});
