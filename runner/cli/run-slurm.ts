/**
 * The SLURM execution engine of `midpath run`: `--engine slurm` submits the jobs without a
 * kept result as job arrays (runner/execute/slurm/), and `--slurm-task` is what each array
 * task runs on its share of the jobs, through the local engine's sweep.
 */
import { relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { ExperimentConfig } from '../config/types.ts';
import { describeSummary } from '../execute/progress-printer.ts';
import { quoteShell } from '../execute/slurm/batch-script.ts';
import { readTaskJobs } from '../execute/slurm/scheduler-view.ts';
import { submitSweep } from '../execute/slurm/submit-sweep.ts';
import { SweepStop } from '../execute/sweep-stop.ts';
import { HANDLERS_MODULE_ENV } from '../execute/worker-protocol.ts';
import type { JobSpec } from '../plan/job-spec.ts';
import { readRun } from '../store/read-run.ts';
import { RunLedger } from '../store/run-ledger.ts';
import { StoreError } from '../store/store-error.ts';
import { EXIT, type CliIo } from './command.ts';
import { exitStatusOf, sweep } from './run-local.ts';

export interface SlurmArgs {
  partition: string | undefined;
  time: string | undefined;
  cpusPerTask: number;
  maxParallel: number;
  sbatchArgs: string[];
  dryRun: boolean;
}

export function wholeNumber(text: string, name: string, min: number, io: CliIo): number | null {
  const value = Number(text);
  if (Number.isInteger(value) && value >= min) return value;
  io.err(
    `midpath run: bad-option: --${name} expects a whole number of at least ${min}, got '${text}'`,
  );
  return null;
}

/** The SLURM options; undefined for the local engine, null after a reported error. */
export function parseSlurmArgs(
  values: Record<string, string | boolean | string[] | undefined>,
  io: CliIo,
): SlurmArgs | undefined | null {
  const engine = values.engine as string;
  if (engine === 'local') return undefined;
  if (engine !== 'slurm') {
    io.err(`midpath run: bad-option: --engine expects local or slurm, got '${engine}'`);
    return null;
  }
  const time = values.time as string | undefined;
  if (time !== undefined && !/^(\d+-)?\d{1,3}:\d{2}:\d{2}$/.test(time)) {
    io.err(`midpath run: bad-option: --time expects HH:MM:SS (or D-HH:MM:SS), got '${time}'`);
    return null;
  }
  const cpusPerTask = wholeNumber(values['cpus-per-task'] as string, 'cpus-per-task', 1, io);
  const maxParallel = wholeNumber(values['max-parallel'] as string, 'max-parallel', 0, io);
  if (cpusPerTask === null || maxParallel === null) return null;
  const partition = values.partition as string | undefined;
  const sbatchArgs = values['sbatch-arg'] as string[];
  return {
    partition,
    time,
    cpusPerTask,
    maxParallel,
    sbatchArgs,
    dryRun: values['dry-run'] === true,
  };
}

/** How array tasks start this Midpath: the same Node and the same checkout, absolute paths. */
function midpathCommand(): string {
  const bin = fileURLToPath(new URL('../../bin/midpath.mjs', import.meta.url));
  return `${quoteShell(process.execPath)} ${quoteShell(bin)}`;
}

/** `--engine slurm`: submits the jobs without a kept result as SLURM arrays and returns. */
export function submitToSlurm(
  config: ExperimentConfig,
  jobs: JobSpec[],
  out: string,
  o: SlurmArgs,
  io: CliIo,
): number {
  const ledger = new RunLedger(out, { runId: 'slurm-submit' });
  const isKept = (id: string): boolean => {
    const mark = ledger.stored(id);
    return mark !== null && mark.status !== 'failed';
  };
  const handlers = io.env[HANDLERS_MODULE_ENV];
  let outcome;
  try {
    outcome = submitSweep(
      out,
      config.name,
      jobs,
      isKept,
      { timeoutMinutes: config.run.timeout, retries: config.run.retries },
      {
        ...o,
        arrayLimit: 1000,
        midpath: midpathCommand(),
        env: {
          ...process.env,
          ...(handlers === undefined ? {} : { [HANDLERS_MODULE_ENV]: handlers }),
        },
      },
    );
  } catch (error) {
    io.err(`midpath run: slurm-submit-failed: ${(error as Error).message}`);
    return EXIT.badInput;
  }
  const where = relative(io.cwd, out) || '.';
  io.out(
    `${jobs.length} jobs: ${outcome.kept} kept, ${outcome.active} already queued or running in SLURM.`,
  );
  if (!outcome.submission) {
    io.out(`Nothing to submit. Follow with: midpath status ${where}`);
    return EXIT.ok;
  }
  for (const array of outcome.submission.arrays) {
    const count = array.tasks.flat().length;
    const id = array.arrayJobId === null ? 'not submitted' : `SLURM job ${array.arrayJobId}`;
    io.out(
      `${array.kind.padEnd(8)} ${count} jobs in ${array.tasks.length} array tasks: ${id} (${array.script})`,
    );
  }
  if (o.dryRun)
    io.out(['Dry run; submit by hand:', ...outcome.commands.map((c) => `  ${c}`)].join('\n'));
  io.out(`Follow with: midpath status ${where}`);
  return EXIT.ok;
}

/** `--slurm-task RECORD#ARRAY`: what each array task runs, on its share of the jobs. */
export async function runSlurmTask(argument: string, io: CliIo): Promise<number> {
  let task;
  try {
    task = readTaskJobs(argument, io.env);
  } catch (error) {
    io.err(`midpath run: slurm-task: ${(error as Error).message}`);
    return EXIT.badInput;
  }
  const { plan } = await readRun(task.dir);
  if (!plan) {
    io.err(`midpath run: store-missing-plan: ${task.dir}: no readable plan.json for this task`);
    return EXIT.badInput;
  }
  const byId = new Map(plan.jobs.map((job) => [job.id, job]));
  const jobs = task.ids.flatMap((id) => byId.get(id) ?? []);
  const cores = Number(io.env.SLURM_CPUS_PER_TASK ?? 1);
  const config = plan.config as ExperimentConfig; // written by `run` from the resolved config
  let summary;
  try {
    summary = await sweep(config, jobs, task.dir, { workers: 1, cores, fresh: false }, io);
  } catch (error) {
    if (!(error instanceof StoreError || error instanceof SweepStop)) throw error;
    io.err(`midpath run: ${error.code}: ${error.message}`);
    return EXIT.badInput;
  }
  io.out(describeSummary(summary));
  return exitStatusOf(summary);
}
