/**
 * Warehouse rover: a random walk on a grid floor plan with walls. The rover reads obsDim
 * radio beacons placed at random points of the floor; each reading is the beacon's signal
 * strength exp(−‖x − b‖² / 2ℓ²) at the cell centre x (straight-line distance, walls do not
 * attenuate), plus noise. True state: the cell as (row, col).
 */
import type { DataConfig } from '../../config/types.ts';
import type { Rng } from '../../numeric/random.ts';
import type { Episode } from '../episode.ts';
import { createMazeEnvironment } from '../maze/maze-environment.ts';
import { LAYOUTS, parseMazeLayout } from '../maze/maze-layouts.ts';
import type { MazeLayout } from '../maze/maze-layouts.ts';
import type { DataSourceImpl, SourceData } from '../source.ts';

/** Probability of keeping the previous heading when that move is open (common practice: a
 * correlated random walk covers corridors faster than a memoryless one). */
const KEEP_HEADING = 0.6;

/** Beacon signal strengths of every cell: [cells, beacons] (walls included, unused). */
export function beaconSignals(layout: MazeLayout, beacons: number, rng: Rng): Float64Array {
  const { width, height } = layout;
  const pos = new Float64Array(beacons * 2); // [beacons, (row, col)]
  for (let k = 0; k < beacons; k++) {
    pos[2 * k] = rng.next() * height;
    pos[2 * k + 1] = rng.next() * width;
  }
  const ell = Math.max(width, height) / 4;
  const out = new Float64Array(width * height * beacons);
  for (let c = 0; c < width * height; c++) {
    const r = Math.floor(c / width) + 0.5;
    const q = (c % width) + 0.5;
    for (let k = 0; k < beacons; k++) {
      const d2 = (r - pos[2 * k]!) ** 2 + (q - pos[2 * k + 1]!) ** 2;
      out[c * beacons + k] = Math.exp(-d2 / (2 * ell * ell));
    }
  }
  return out;
}

/** One correlated random walk of `steps` cells from a uniformly drawn free cell. */
export function walkRover(
  env: { freeCells: number[]; step: (cell: number, action: number) => number },
  steps: number,
  rng: Rng,
): Int32Array {
  const cells = new Int32Array(steps);
  let cell = env.freeCells[rng.int(env.freeCells.length)]!;
  let heading = rng.int(4);
  for (let t = 0; t < steps; t++) {
    cells[t] = cell;
    const open = [0, 1, 2, 3].filter((a) => env.step(cell, a) !== cell);
    if (open.length === 0) continue;
    if (!(open.includes(heading) && rng.next() < KEEP_HEADING))
      heading = open[rng.int(open.length)]!;
    cell = env.step(cell, heading);
  }
  return cells;
}

function produce(config: DataConfig, rng: Rng): SourceData {
  const layout = parseMazeLayout(LAYOUTS[config.layout]);
  const p = config.obsDim;
  const signals = beaconSignals(layout, p, rng.fork('beacons'));
  const observe = (cell: number): Float32Array =>
    Float32Array.from(signals.subarray(cell * p, (cell + 1) * p));
  const maze = createMazeEnvironment(layout, observe);
  const walkRng = rng.fork('episodes');
  const episodes: Episode[] = [];
  const freeCells = maze.freeCells ?? [];
  const step = maze.step ?? ((c: number) => c);
  for (let e = 0; e < config.episodes; e++) {
    const cells = walkRover({ freeCells, step }, config.steps, walkRng);
    const obs = new Float32Array(config.steps * p);
    const state = new Float32Array(config.steps * 2);
    for (let t = 0; t < config.steps; t++) {
      const c = cells[t]!;
      for (let k = 0; k < p; k++)
        obs[t * p + k] = signals[c * p + k]! + config.noise * walkRng.normal();
      state[2 * t] = Math.floor(c / layout.width);
      state[2 * t + 1] = c % layout.width;
    }
    episodes.push({ obs, steps: config.steps, obsDim: p, state, stateDim: 2 });
  }
  return {
    name: 'rover-maze',
    description: `warehouse rover on the '${config.layout}' floor (${layout.height}×${layout.width}), ${p} beacons`,
    obsDim: p,
    stateDim: 2,
    episodes,
    maze,
  };
}

/** The rover-maze source. */
export const roverMaze: DataSourceImpl = {
  summary: 'random walk of a warehouse rover in a grid with walls, beacon signal strengths',
  produce,
};
