import { describe, expect, it } from 'vitest';
import type { Dataset, Episode, MazeEnvironment } from '../../runner/data/episode.ts';
import { createMazeEnvironment } from '../../runner/data/maze/maze-environment.ts';
import { buildContext } from '../../runner/evaluation/build-context.ts';
import { rollOut, type CellCodes } from '../../runner/evaluation/planning/greedy-controller.ts';
import { drawPlanningTasks } from '../../runner/evaluation/planning/planning-tasks.ts';
import {
  encodeCells,
  planningArms,
  runPlanningSuite,
} from '../../runner/evaluation/suites/planning.ts';
import { taskRng } from '../../runner/evaluation/tasks.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { evalConfig, identityRepresentation } from './fixtures.ts';

/** A maze from text ('#' wall) observed as the cell's (row, col) coordinates. */
function coordinateMaze(text: string): MazeEnvironment {
  const lines = text.trim().split('\n');
  const width = lines[0]!.length;
  const walls = Uint8Array.from(lines.join('').split(''), (ch) => (ch === '#' ? 1 : 0));
  return createMazeEnvironment({ width, height: lines.length, walls }, (cell) =>
    Float32Array.from([Math.floor(cell / width), cell % width]),
  );
}

function mazeDataset(maze: MazeEnvironment): Dataset {
  const rng = createRng(1);
  const free = maze.freeCells!;
  const episode = (): Episode => {
    let cell = free[rng.int(free.length)]!;
    const obs = new Float32Array(40 * 2);
    for (let t = 0; t < 40; t++) {
      obs.set(maze.observe(cell), t * 2);
      const nb = maze.neighbours(cell);
      cell = nb[rng.int(nb.length)]!;
    }
    return { obs, steps: 40, obsDim: 2, state: obs, stateDim: 2 };
  };
  const eps = Array.from({ length: 6 }, episode);
  return {
    name: 'test-maze',
    description: '',
    obsDim: 2,
    stateDim: 2,
    train: eps,
    val: [],
    test: eps,
    maze,
  };
}

const OPEN_ROOM = `
#########
#.......#
#.......#
#.......#
#.......#
#.......#
#########`;

const DIVIDED_ROOM = `
#######
#.....#
#####.#
#.....#
#######`;

describe('planning', () => {
  it('reaches every goal along a shortest path in an open room when ψ is the position', () => {
    // In a grid without obstacles every move that lowers the Euclidean distance to the goal
    // lowers the Manhattan distance by one, so greedy descent follows a shortest path
    // (grid geometry). The oracle arm's targets lie on a shortest path and do the same.
    const maze = coordinateMaze(OPEN_ROOM);
    const config = evalConfig({
      suites: ['planning'],
      transitions: ['critic'],
      planning: { tasks: 12, budget: 3 },
    });
    const context = buildContext(
      identityRepresentation(2, { a: Math.SQRT2, c: 1 }),
      mazeDataset(maze),
      {
        config,
        discount: 0.8,
        scale: 1,
      },
    );
    const { metrics } = runPlanningSuite(context);
    for (const name of ['planning_success_straight', 'planning_success_oracle']) {
      const rows = metrics.filter((m) => m.metric === name);
      expect(rows.length).toBe(3);
      for (const r of rows) expect(r.value).toBe(1);
    }
    for (const r of metrics.filter((m) => m.metric === 'planning_length_ratio_straight'))
      expect(r.value).toBe(1);
    expect(
      metrics.filter((m) => m.metric === 'planning_success' && m.source === 'critic').length,
    ).toBe(3);
  });

  it('follows bridge waypoints that become straight-line interpolation as c grows', () => {
    // MATH.md §3: with A = √(1+1/c) I and c → ∞ the bridge mean is linear interpolation
    // between start and goal; in an open room those targets lie on the segment, inside the
    // box spanned by start and goal, so every trial succeeds, including T ≥ 2 waypoints.
    const maze = coordinateMaze(OPEN_ROOM);
    const config = evalConfig({
      suites: ['planning'],
      transitions: ['critic'],
      planning: { tasks: 12, budget: 3 },
    });
    const c = 1e6;
    const rep = identityRepresentation(2, { a: Math.sqrt(1 + 1 / c), c });
    const context = buildContext(rep, mazeDataset(maze), { config, discount: 0.8, scale: 1 });
    const rows = runPlanningSuite(context).metrics.filter((m) => m.metric === 'planning_success');
    expect(rows.map((r) => r.level)).toContain('8-10'); // shortest ≥ 8 → T = 2 waypoints
    for (const r of rows) expect(r.value).toBe(1);
  });

  it('hands the controller T waypoint targets then the goal, for every arm', () => {
    // Row 1, col 1 → row 5, col 7 (shortest 10) with T = 2: bridge targets at c → ∞ are the
    // interpolation points 1/3 and 2/3 of the way (MATH.md §3); the oracle's lie on a
    // shortest path at steps round(10/3) = 3 and round(20/3) = 7.
    const maze = coordinateMaze(OPEN_ROOM);
    const c = 1e9;
    const rep = identityRepresentation(2, { a: Math.sqrt(1 + 1 / c), c });
    const config = evalConfig({ suites: ['planning'], transitions: ['critic'] });
    const context = buildContext(rep, mazeDataset(maze), { config, discount: 0.8, scale: 1 });
    const arms = planningArms(context, maze, encodeCells(context, maze));
    expect(arms.map((a) => a.name)).toEqual(['straight', 'waypoints', 'interpolated', 'oracle']);
    const task = { start: 1 * 9 + 1, goal: 5 * 9 + 7, shortest: 10, bin: '8-10' };
    expect(Array.from(arms[0]!.targets(task, 2))).toEqual([5, 7]);
    const expected = [1 + 4 / 3, 1 + 2, 1 + 8 / 3, 1 + 4, 5, 7];
    for (const arm of [arms[1]!, arms[2]!]) {
      const targets = Array.from(arm.targets(task, 2));
      expect(targets.length).toBe(6);
      targets.forEach((v, i) => expect(v).toBeCloseTo(expected[i]!, 4));
    }
    const oracle = Array.from(arms[3]!.targets(task, 2));
    expect(oracle.length).toBe(6);
    const [r1, c1, r2, c2] = oracle;
    expect(Math.abs(r1! - 1) + Math.abs(c1! - 1)).toBe(3);
    expect(Math.abs(r2! - 1) + Math.abs(c2! - 1)).toBe(7);
  });

  it('stratifies tasks into equal distance bins whose labels hold their shortest paths', () => {
    const maze = coordinateMaze(OPEN_ROOM);
    const tasks = drawPlanningTasks(maze, 30, taskRng(0, 'planning'));
    expect(tasks.length).toBe(30);
    const bins = new Map<string, number>();
    for (const t of tasks) {
      const [lo, hi] = t.bin.split('-').map(Number);
      expect(t.shortest).toBe(maze.distance(t.start, t.goal));
      expect(t.shortest).toBeGreaterThanOrEqual(lo!);
      expect(t.shortest).toBeLessThanOrEqual(hi!);
      bins.set(t.bin, (bins.get(t.bin) ?? 0) + 1);
    }
    expect([...bins.values()]).toEqual([10, 10, 10]);
    // Diameter of a 5×7 open room: 4 + 6 = 10 steps corner to corner.
    expect(tasks.some((t) => t.bin.endsWith('-10'))).toBe(true);
  });

  it('the greedy controller is stuck behind a wall without waypoints and gets through with them', () => {
    const maze = coordinateMaze(DIVIDED_ROOM);
    const width = 7;
    const free = maze.freeCells!;
    const cells: CellCodes = {
      dim: 2,
      row: new Map(free.map((c, i) => [c, i])),
      codes: Float64Array.from(free.flatMap((c) => [Math.floor(c / width), c % width])),
    };
    const start = 3 * width + 1;
    const goal = 1 * width + 1;
    expect(maze.distance(start, goal)).toBe(10);
    const straight = rollOut(maze, cells, start, goal, Float64Array.from([1, 1]), 30);
    expect(straight.success).toBe(false);
    // Waypoints (3, 4) and (1, 4) on the shortest path, then the goal.
    const guided = rollOut(maze, cells, start, goal, Float64Array.from([3, 4, 1, 4, 1, 1]), 30);
    expect(guided).toEqual({ success: true, steps: 10 });
  });
});
