/**
 * What the scheduler says about each job of a results directory, for `midpath status`:
 * the job's task in its latest submission, and that task's state. The result file stays
 * the proof of success; this only explains jobs that have none.
 */
import { readFileSync } from 'node:fs';
import { dirname } from 'node:path';
import type { TaskPhase } from './scheduler-states.ts';
import { phaseOf, readTaskStates } from './scheduler-states.ts';
import type { SlurmSubmission } from './slurm-manifest.ts';
import { readSubmissions } from './slurm-manifest.ts';

export interface SchedulerJobView {
  phase: TaskPhase;
  /** SLURM's state name, e.g. TIMEOUT. */
  state: string;
  /** `<array>_<task>` */
  task: string;
}

/** Job id → its latest task's state; empty when nothing was submitted or SLURM is unreachable. */
export function readSchedulerView(dir: string): Map<string, SchedulerJobView> {
  const arrays = readSubmissions(dir).flatMap((s) => s.arrays);
  const states = readTaskStates(arrays.flatMap((a) => (a.arrayJobId ? [a.arrayJobId] : [])));
  const view = new Map<string, SchedulerJobView>();
  for (const array of arrays) {
    if (!array.arrayJobId) continue;
    array.tasks.forEach((ids, index) => {
      const task = `${array.arrayJobId}_${index}`;
      const state = states.get(task);
      if (state) for (const id of ids) view.set(id, { phase: phaseOf(state), state, task });
    });
  }
  return view;
}

/**
 * The jobs of one array task, from a `--slurm-task RECORD#ARRAY` argument and the task index
 * SLURM sets in SLURM_ARRAY_TASK_ID. The results directory is the record's grandparent.
 */
export function readTaskJobs(
  argument: string,
  env: NodeJS.ProcessEnv,
): { dir: string; ids: string[] } {
  const at = argument.lastIndexOf('#');
  const path = at > 0 ? argument.slice(0, at) : argument;
  const arrayIndex = Number(at > 0 ? argument.slice(at + 1) : '0');
  const taskIndex = Number(env.SLURM_ARRAY_TASK_ID ?? 'NaN');
  const record = JSON.parse(readFileSync(path, 'utf8')) as SlurmSubmission;
  const ids = record.arrays[arrayIndex]?.tasks[taskIndex];
  if (!ids) {
    throw new Error(
      `expected array ${arrayIndex} task ${taskIndex} in ${path}, got none; run this only as a SLURM array task (SLURM_ARRAY_TASK_ID set)`,
    );
  }
  return { dir: dirname(dirname(path)), ids };
}
