/**
 * The one controller every planning arm uses, so arms differ only in their targets: from
 * the current cell, step to the neighbouring cell whose observation's encoding is nearest
 * the current target encoding. A target is done when the agent stands on the cell it decodes
 * to, or after its share of the step budget; the last target is the goal.
 */
import type { MazeEnvironment } from '../../data/episode.ts';

export interface CellCodes {
  dim: number;
  /** cell → row of `codes` */
  row: Map<number, number>;
  /** [cells, dim] encodings of each free cell's noiseless observation. */
  codes: Float64Array;
}

export interface Rollout {
  success: boolean;
  steps: number;
}

/** Nearest free cell to each target encoding: targets [count, dim] → cells. */
export function decodeCells(cells: CellCodes, targets: Float64Array, count: number): number[] {
  const out: number[] = [];
  for (let q = 0; q < count; q++) {
    let best = -1;
    let bestDistance = Infinity;
    for (const [cell, r] of cells.row) {
      const d = distance(cells.codes, r, targets, q, cells.dim);
      if (d < bestDistance) [best, bestDistance] = [cell, d];
    }
    out.push(best);
  }
  return out;
}

/**
 * Rolls the greedy controller out from `start` over `targets` ([count, dim]; the caller puts
 * the goal's encoding last) for at most `budget` steps; success means standing on `goal`.
 */
export function rollOut(
  maze: MazeEnvironment,
  cells: CellCodes,
  start: number,
  goal: number,
  targets: Float64Array,
  budget: number,
): Rollout {
  const count = targets.length / cells.dim;
  const targetCells = decodeCells(cells, targets, count);
  const patience = Math.ceil(budget / count);
  let cell = start;
  let k = 0;
  let onTarget = 0;
  for (let steps = 0; steps < budget; steps++) {
    if (cell === goal) return { success: true, steps };
    while (k < count - 1 && (cell === targetCells[k] || onTarget >= patience)) {
      k++;
      onTarget = 0;
    }
    let best = cell;
    let bestDistance = Infinity;
    for (const nb of maze.neighbours(cell)) {
      const d = distance(cells.codes, cells.row.get(nb)!, targets, k, cells.dim);
      if (d < bestDistance) [best, bestDistance] = [nb, d];
    }
    cell = best;
    onTarget++;
  }
  return { success: cell === goal, steps: budget };
}

function distance(a: Float64Array, i: number, b: Float64Array, j: number, dim: number): number {
  let s = 0;
  for (let k = 0; k < dim; k++) s += (a[i * dim + k]! - b[j * dim + k]!) ** 2;
  return s;
}
