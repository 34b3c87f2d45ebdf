/**
 * Start–goal pairs for the planning suite, stratified by shortest-path distance so short and
 * long trips weigh equally. Drawn from the evaluation seed and the maze only: one task list
 * for every method and training seed.
 */
import type { MazeEnvironment } from '../../data/episode.ts';
import type { Rng } from '../../numeric/random.ts';

export interface PlanningTask {
  start: number;
  goal: number;
  /** Shortest-path length in steps. */
  shortest: number;
  /** Distance bin label, e.g. "1-6". */
  bin: string;
}

/** Free cells, from the maze's list when it has one. */
export function freeCellsOf(maze: MazeEnvironment): number[] {
  if (maze.freeCells !== undefined) return maze.freeCells;
  const cells: number[] = [];
  for (let c = 0; c < maze.width * maze.height; c++) if (maze.walls[c] === 0) cells.push(c);
  return cells;
}

/**
 * Three equal-width distance bins over 1..D, with D the longest shortest path found by a
 * double breadth-first sweep (farthest cell from a cell, then farthest from that: a lower
 * bound of the diameter, exact on trees; common practice). `count` tasks, split evenly
 * across the bins, by rejection sampling of uniform start–goal pairs.
 */
export function drawPlanningTasks(maze: MazeEnvironment, count: number, rng: Rng): PlanningTask[] {
  const cells = freeCellsOf(maze);
  if (cells.length < 2) return [];
  const farthest = (from: number): [number, number] => {
    let best: [number, number] = [from, 0];
    for (const c of cells) {
      const d = maze.distance(from, c);
      if (Number.isFinite(d) && d > best[1]) best = [c, d];
    }
    return best;
  };
  const diameter = farthest(farthest(cells[0]!)[0])[1];
  if (diameter < 1) return [];
  const binCount = Math.min(3, diameter);
  const edges = Array.from({ length: binCount + 1 }, (_, i) =>
    Math.round(1 + (i * diameter) / binCount),
  );
  edges[binCount] = diameter + 1;
  const labels = edges.slice(0, -1).map((lo, i) => `${lo}-${edges[i + 1]! - 1}`);
  const perBin = labels.map(
    (_, i) => Math.floor(count / binCount) + (i < count % binCount ? 1 : 0),
  );
  const bins: PlanningTask[][] = labels.map(() => []);
  for (
    let attempt = 0;
    attempt < 200 * count && bins.some((b, i) => b.length < perBin[i]!);
    attempt++
  ) {
    const start = cells[rng.int(cells.length)]!;
    const goal = cells[rng.int(cells.length)]!;
    const shortest = maze.distance(start, goal);
    if (start === goal || !Number.isFinite(shortest)) continue;
    const bin = edges.findIndex(
      (lo, i) => i < binCount && shortest >= lo && shortest < edges[i + 1]!,
    );
    if (bin < 0 || bins[bin]!.length >= perBin[bin]!) continue;
    bins[bin]!.push({ start, goal, shortest, bin: labels[bin]! });
  }
  return bins.flat();
}

/** One shortest path start → goal as a list of cells (ties go to the first neighbour listed). */
export function shortestPath(maze: MazeEnvironment, start: number, goal: number): number[] {
  const path = [start];
  let cell = start;
  let d = maze.distance(goal, cell);
  while (d > 0 && Number.isFinite(d)) {
    const next = maze.neighbours(cell).find((nb) => maze.distance(goal, nb) === d - 1);
    if (next === undefined) break;
    path.push(next);
    cell = next;
    d -= 1;
  }
  return path;
}
