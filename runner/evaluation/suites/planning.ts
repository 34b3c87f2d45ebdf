/**
 * Planning suite (maze datasets): can the representation guide an agent from a start cell to
 * a goal cell? One task list (stratified by shortest-path distance, eval seed only) and one
 * greedy controller for every arm; arms differ only in the targets they hand the controller:
 *   straight      the goal's encoding alone;
 *   waypoints     bridge means between start and goal encodings (per transition source);
 *   interpolated  encodings of observations interpolated linearly between start and goal;
 *   oracle        encodings of cells on a true shortest path.
 * Reported per distance bin: success within budget × shortest steps (a rate: Wilson
 * intervals apply, n = tasks) and path length over the shortest, over successful runs.
 * Waypoints are spaced one per WAYPOINT_SPACING cells of the shortest path (a modelling choice).
 */
import type { MazeEnvironment } from '../../data/episode.ts';
import { prepareBridge } from '../../inference/index.ts';
import type { MetricRow } from '../metric.ts';
import { metricRow, type EvalContext, type SuiteOutput } from '../context.ts';
import { rollOut, type CellCodes } from '../planning/greedy-controller.ts';
import {
  drawPlanningTasks,
  freeCellsOf,
  shortestPath,
  type PlanningTask,
} from '../planning/planning-tasks.ts';
import { taskRng } from '../tasks.ts';

/** Cells of shortest path per waypoint. */
export const WAYPOINT_SPACING = 4;

/** One planning arm: its name, the transition source (bridges only) and its targets. */
export type Arm = {
  name: string;
  source: string;
  targets: (task: PlanningTask, T: number) => Float64Array;
};

/** Runs the planning suite; datasets without a maze yield nothing but a note. */
export function runPlanningSuite(context: EvalContext): SuiteOutput {
  const maze = context.dataset.maze;
  if (maze === undefined)
    return { metrics: [], artifacts: { skipped: `${context.dataset.name} has no maze` } };
  const cells = encodeCells(context, maze);
  const tasks = drawPlanningTasks(
    maze,
    context.config.planning.tasks,
    taskRng(context.config.seed, 'planning'),
  );
  const arms = planningArms(context, maze, cells);
  const metrics: MetricRow[] = [];
  const outcomes: {
    arm: string;
    source: string;
    start: number;
    goal: number;
    success: boolean;
    steps: number;
  }[] = [];
  for (const arm of arms) {
    const byBin = new Map<string, { successes: number; ratios: number[]; n: number }>();
    for (const task of tasks) {
      const T = Math.max(1, Math.ceil(task.shortest / WAYPOINT_SPACING) - 1);
      const budget = Math.ceil(context.config.planning.budget * task.shortest);
      const result = rollOut(maze, cells, task.start, task.goal, arm.targets(task, T), budget);
      const bin = byBin.get(task.bin) ?? { successes: 0, ratios: [], n: 0 };
      bin.n++;
      if (result.success) {
        bin.successes++;
        bin.ratios.push(result.steps / task.shortest);
      }
      byBin.set(task.bin, bin);
      outcomes.push({
        arm: arm.name,
        source: arm.source,
        start: task.start,
        goal: task.goal,
        ...result,
      });
    }
    const suffix = arm.name === 'waypoints' ? '' : `_${arm.name}`;
    for (const [level, b] of byBin) {
      const ratio =
        b.ratios.length === 0 ? NaN : b.ratios.reduce((s, v) => s + v, 0) / b.ratios.length;
      metrics.push(
        metricRow('planning', `planning_success${suffix}`, level, arm.source, b.successes / b.n, {
          n: b.n,
        }),
      );
      metrics.push(
        metricRow('planning', `planning_length_ratio${suffix}`, level, arm.source, ratio, {
          n: b.ratios.length,
        }),
      );
    }
  }
  return { metrics, artifacts: { tasks, outcomes } };
}

/** Encodings of every free cell's noiseless observation. */
export function encodeCells(context: EvalContext, maze: MazeEnvironment): CellCodes {
  const free = freeCellsOf(maze);
  const obsDim = context.dataset.obsDim;
  const obs = new Float32Array(free.length * obsDim);
  free.forEach((cell, i) => obs.set(maze.observe(cell), i * obsDim));
  const codes = Float64Array.from(context.representation.encode(obs, free.length));
  return { dim: context.dim, row: new Map(free.map((c, i) => [c, i])), codes };
}

/** The arms, in report order: straight, waypoints per source, interpolated, oracle. */
export function planningArms(context: EvalContext, maze: MazeEnvironment, cells: CellCodes): Arm[] {
  const { dim } = context;
  const codeOf = (cell: number): Float64Array => {
    const r = cells.row.get(cell)!;
    return cells.codes.subarray(r * dim, (r + 1) * dim);
  };
  // Concatenates target rows (each part [rows, dim]) and the goal's encoding last.
  const withGoal = (parts: ArrayLike<number>[], goal: number): Float64Array => {
    const length = parts.reduce((s, p) => s + p.length, 0);
    const out = new Float64Array(length + dim);
    let offset = 0;
    for (const p of parts) {
      out.set(p, offset);
      offset += p.length;
    }
    out.set(codeOf(goal), offset);
    return out;
  };
  const arms: Arm[] = [
    { name: 'straight', source: '', targets: (task) => withGoal([], task.goal) },
  ];
  for (const source of context.models) {
    arms.push({
      name: 'waypoints',
      source: source.source,
      targets: (task, T) => {
        const { means } = prepareBridge(source.model, T).solve(
          codeOf(task.start),
          codeOf(task.goal),
          1,
        );
        return withGoal([means], task.goal);
      },
    });
  }
  arms.push({
    name: 'interpolated',
    source: '',
    targets: (task, T) => withGoal([interpolatedCodes(context, maze, task, T)], task.goal),
  });
  arms.push({
    name: 'oracle',
    source: '',
    targets: (task, T) => {
      const path = shortestPath(maze, task.start, task.goal);
      const picks = Array.from({ length: T }, (_, k) =>
        codeOf(path[Math.round(((k + 1) * task.shortest) / (T + 1))]!),
      );
      return withGoal(picks, task.goal);
    },
  });
  return arms;
}

/** Encodings of T observations interpolated linearly between start and goal: [T, dim]. */
function interpolatedCodes(
  context: EvalContext,
  maze: MazeEnvironment,
  task: PlanningTask,
  T: number,
): Float32Array {
  const a = maze.observe(task.start);
  const b = maze.observe(task.goal);
  const obs = new Float32Array(T * a.length); // [T, obsDim]
  for (let k = 1; k <= T; k++) {
    const w = k / (T + 1);
    for (let j = 0; j < a.length; j++) obs[(k - 1) * a.length + j] = (1 - w) * a[j]! + w * b[j]!;
  }
  return context.representation.encode(obs, T);
}
