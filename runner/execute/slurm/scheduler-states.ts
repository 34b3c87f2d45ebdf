/**
 * Asks SLURM what became of array tasks: `squeue` for tasks queued or running, `scontrol show
 * job` for recently finished ones, and the job-completion text file (jobcomp/filetxt) for
 * older ones, since `sacct` needs an accounting database that many clusters lack.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';

/** `<arrayJobId>_<taskId>` → SLURM state name (PENDING, RUNNING, COMPLETED, FAILED, TIMEOUT…). */
export type TaskStates = Map<string, string>;

/** What a SLURM task state means for a job that has no result yet. */
export type TaskPhase = 'queued' | 'running' | 'ended';

/** Classifies a SLURM state name (squeue/scontrol spelling; "CANCELLED by 0" counts as CANCELLED). */
export function phaseOf(state: string): TaskPhase {
  if (
    /^(PENDING|CONFIGURING|REQUEUED|REQUEUE_HOLD|REQUEUE_FED|RESV_DEL_HOLD|SUSPENDED|STOPPED)/.test(
      state,
    )
  )
    return 'queued';
  if (/^(RUNNING|COMPLETING|SIGNALING|STAGE_OUT|RESIZING)/.test(state)) return 'running';
  return 'ended'; // COMPLETED, FAILED, TIMEOUT, CANCELLED, OUT_OF_MEMORY, NODE_FAIL, PREEMPTED…
}

function run(command: string, args: string[]): string | null {
  const out = spawnSync(command, args, { encoding: 'utf8', timeout: 20_000 });
  return out.status === 0 ? out.stdout : null;
}

/** Parses `key=value` words of scontrol/jobcomp lines into task states. */
export function parseKeyValueStates(
  text: string,
  arrays: ReadonlySet<string>,
  into: TaskStates,
): void {
  for (const line of text.split('\n')) {
    const fields = new Map(
      line.split(/\s+/).flatMap((word) => {
        const at = word.indexOf('=');
        return at > 0 ? [[word.slice(0, at), word.slice(at + 1)] as const] : [];
      }),
    );
    const array = fields.get('ArrayJobId');
    const task = fields.get('ArrayTaskId');
    const state = fields.get('JobState');
    if (array && task && state && arrays.has(array) && /^\d+$/.test(task))
      into.set(`${array}_${task}`, state);
  }
}

/** Parses `squeue --array -o %i|%T` lines ("12_3|RUNNING", "12_[4-9]|PENDING"). */
export function parseSqueue(text: string, into: TaskStates): void {
  for (const line of text.split('\n')) {
    const [id, state] = line.trim().split('|');
    if (!id || !state) continue;
    const ranged = /^(\d+)_\[(.+)\]$/.exec(id);
    if (!ranged) {
      into.set(id, state);
      continue;
    }
    for (const part of (ranged[2] ?? '').split('%')[0]?.split(',') ?? []) {
      const [from, to = from] = part.split('-').map(Number);
      for (let t = from ?? 0; t <= (to ?? -1); t += 1) into.set(`${ranged[1]}_${t}`, state);
    }
  }
}

/** The job-completion file named in the cluster's configuration, when it is a text file. */
function jobCompFile(): string | null {
  const config = run('scontrol', ['show', 'config']);
  const type = /^JobCompType\s*=\s*(\S+)/m.exec(config ?? '')?.[1];
  const location = /^JobCompLoc\s*=\s*(\S+)/m.exec(config ?? '')?.[1];
  return type === 'jobcomp/filetxt' && location && existsSync(location) ? location : null;
}

/** States of the tasks of `arrayJobIds`; empty when SLURM cannot be reached. */
export function readTaskStates(arrayJobIds: readonly string[]): TaskStates {
  const states: TaskStates = new Map();
  if (arrayJobIds.length === 0) return states;
  const arrays = new Set(arrayJobIds);
  const file = jobCompFile();
  if (file) parseKeyValueStates(readFileSync(file, 'utf8'), arrays, states);
  for (const id of arrayJobIds) {
    const shown = run('scontrol', ['show', 'job', '-o', id]);
    if (shown) parseKeyValueStates(shown, arrays, states);
  }
  // Queued and running tasks last: they are the freshest word.
  const queued = run('squeue', [
    '--noheader',
    '--array',
    '--format=%i|%T',
    `--jobs=${arrayJobIds.join(',')}`,
  ]);
  if (queued) parseSqueue(queued, states);
  return states;
}

/** Submits a batch script; returns SLURM's job id, or throws with sbatch's own message. */
export function submitBatch(script: string, args: string[], env: NodeJS.ProcessEnv): string {
  const out = spawnSync('sbatch', ['--parsable', ...args, script], {
    encoding: 'utf8',
    env,
    timeout: 60_000,
  });
  if (out.error)
    throw new Error(
      `sbatch could not be started (${out.error.message}); is SLURM installed on this machine?`,
    );
  if (out.status !== 0) throw new Error(`sbatch refused ${script}: ${out.stderr.trim()}`);
  const id = out.stdout.trim().split(';')[0] ?? '';
  if (!/^\d+$/.test(id))
    throw new Error(`sbatch printed no job id for ${script}: ${out.stdout.trim()}`);
  return id;
}
