/**
 * A grid maze as an environment for the planning suite: 4-neighbour moves, walls block,
 * breadth-first-search shortest paths (Moore, 1959, "The shortest path through a maze";
 * every move costs one step, so BFS order is distance order). Distances from a source are
 * computed once and cached.
 */
import type { MazeEnvironment } from '../episode.ts';
import type { MazeLayout } from './maze-layouts.ts';

/** Moves in action order: up, right, down, left. [action] → [dRow, dCol] */
export const MOVES: ReadonlyArray<readonly [number, number]> = [
  [-1, 0],
  [0, 1],
  [1, 0],
  [0, -1],
];

/** Builds the environment; `observe` maps a cell to its noiseless observation. */
export function createMazeEnvironment(
  layout: MazeLayout,
  observe: (cell: number) => Float32Array,
): MazeEnvironment {
  const { width, height, walls } = layout;
  const cache = new Map<number, Int32Array>();
  const isFree = (row: number, col: number): boolean =>
    row >= 0 && row < height && col >= 0 && col < width && walls[row * width + col] === 0;

  const step = (cell: number, action: number): number => {
    const move = MOVES[action];
    if (move === undefined) throw new RangeError(`action must be 0..3, got ${action}`);
    const row = Math.floor(cell / width) + move[0];
    const col = (cell % width) + move[1];
    return isFree(row, col) ? row * width + col : cell;
  };
  const neighbours = (cell: number): number[] => {
    const out: number[] = [];
    for (let a = 0; a < MOVES.length; a++) {
      const next = step(cell, a);
      if (next !== cell) out.push(next);
    }
    return out;
  };
  const distancesFrom = (from: number): Int32Array => {
    const hit = cache.get(from);
    if (hit) return hit;
    const dist = new Int32Array(width * height).fill(-1);
    if (walls[from] !== 0) throw new RangeError(`cell ${from} is a wall`);
    const queue = [from];
    dist[from] = 0;
    for (let head = 0; head < queue.length; head++) {
      const c = queue[head]!;
      for (const nb of neighbours(c)) {
        if (dist[nb] === -1) {
          dist[nb] = dist[c]! + 1;
          queue.push(nb);
        }
      }
    }
    cache.set(from, dist);
    return dist;
  };
  const freeCells: number[] = [];
  for (let c = 0; c < width * height; c++) if (walls[c] === 0) freeCells.push(c);
  return {
    width,
    height,
    walls,
    freeCells,
    neighbours,
    step,
    distance: (from, to) => {
      const d = distancesFrom(from)[to] ?? -1;
      return d < 0 ? Infinity : d;
    },
    observe,
  };
}
