// `midpath run`: the CLI wiring of both engines (local sweep, SLURM submission, and the
// SLURM array task mode). Longer than the usual 300 lines because one command file holds
// all three; the engines themselves live in runner/execute/.
import { randomBytes } from 'node:crypto';
import { availableParallelism, hostname } from 'node:os';
import { join, relative, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { formatConfigErrors } from '../../config/config-error.ts';
import type { ExperimentConfig } from '../../config/types.ts';
import { loadExperiment } from '../../config/load-experiment.ts';
import { createProgressPrinter, describeSummary } from '../../execute/progress-printer.ts';
import type { ProgressPrinter } from '../../execute/progress-printer.ts';
import { runSweep } from '../../execute/run-sweep.ts';
import { SweepControl } from '../../execute/sweep-control.ts';
import type { SweepSummary } from '../../execute/sweep-events.ts';
import { HANDLERS_MODULE_ENV } from '../../execute/worker-protocol.ts';
import { expandPlan } from '../../plan/expand-plan.ts';
import type { JobSpec } from '../../plan/job-spec.ts';
import { writeReport } from '../../report/index.ts';
import { indexRunEnd, indexRunStart } from '../../store/run-index.ts';
import { RunLedger } from '../../store/run-ledger.ts';
import { StoreError } from '../../store/store-error.ts';
import { writePlanFile } from '../../store/write-result.ts';
import { readRun } from '../../store/read-run.ts';
import { quoteShell } from '../../execute/slurm/batch-script.ts';
import { readTaskJobs } from '../../execute/slurm/scheduler-view.ts';
import { submitSweep } from '../../execute/slurm/submit-sweep.ts';
import { fileURLToPath } from 'node:url';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';
import { readSourceIn } from './check.ts';

interface RunArgs {
  file: string;
  out: string | undefined;
  workers: number | undefined;
  overrides: string[];
  fresh: boolean;
  slurm: SlurmArgs | undefined;
}

interface SlurmArgs {
  partition: string | undefined;
  time: string | undefined;
  cpusPerTask: number;
  maxParallel: number;
  sbatchArgs: string[];
  dryRun: boolean;
}

/** How many jobs at once, and on how many cores (a SLURM task: the cores it was given). */
interface SweepChoice {
  workers: number | undefined;
  cores?: number;
  fresh: boolean;
}

const USAGE = [
  'Usage: midpath run FILE [--out DIR] [--workers N] [--set path=value]... [--fresh]',
  '       midpath run FILE --engine slurm [--out DIR] [--partition P] [--time HH:MM:SS]',
  '                   [--cpus-per-task N] [--max-parallel K] [--sbatch-arg ARG]... [--dry-run]',
  '',
  'Runs every job of the experiment in worker processes and writes the results directory,',
  'then the report. Jobs with a kept result are skipped, so running again resumes.',
  '  --out DIR           results directory (default results/<name>/ under the working directory)',
  '  --workers N         jobs at once, each in its own process (default: the number of cores)',
  '  --set path=value    override a config value (YAML value, typed by the schema); repeatable',
  '  --fresh             rerun every job, ignoring kept results',
  '  --engine slurm      submit SLURM job arrays instead of running here (see docs/runner.md)',
  '  --partition P, --time HH:MM:SS, --cpus-per-task N (default 1), --max-parallel K,',
  '  --sbatch-arg ARG    SLURM settings of the arrays; --sbatch-arg is repeatable, verbatim',
  '  --dry-run           write the batch scripts without submitting them',
  'Ctrl-C once: start no new job, let running ones finish. Twice: stop them now.',
  'Exit status: 0 all done, 1 some jobs failed or diverged, 2 bad input or unwritable output,',
  '130 interrupted.',
].join('\n');

function wholeNumber(text: string, name: string, min: number, io: CliIo): number | null {
  const value = Number(text);
  if (Number.isInteger(value) && value >= min) return value;
  io.err(
    `midpath run: bad-option: --${name} expects a whole number of at least ${min}, got '${text}'`,
  );
  return null;
}

/** The SLURM options; undefined for the local engine, null after a reported error. */
function parseSlurmArgs(
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

function parseRunArgs(args: string[], io: CliIo): RunArgs | { task: string } | undefined {
  try {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      strict: true,
      options: {
        out: { type: 'string' },
        workers: { type: 'string' },
        set: { type: 'string', multiple: true, default: [] },
        fresh: { type: 'boolean', default: false },
        engine: { type: 'string', default: 'local' },
        partition: { type: 'string' },
        time: { type: 'string' },
        'cpus-per-task': { type: 'string', default: '1' },
        'max-parallel': { type: 'string', default: '0' },
        'sbatch-arg': { type: 'string', multiple: true, default: [] },
        'dry-run': { type: 'boolean', default: false },
        'slurm-task': { type: 'string' },
      },
    });
    if (values['slurm-task'] !== undefined && positionals.length === 0)
      return { task: values['slurm-task'] };
    const slurm = parseSlurmArgs(values, io);
    if (slurm === null) return undefined;
    const workers = values.workers === undefined ? undefined : Number(values.workers);
    if (workers !== undefined && !(Number.isInteger(workers) && workers >= 1)) {
      io.err(
        `midpath run: bad-option: --workers expects a whole number of at least 1, got '${values.workers}'`,
      );
      return undefined;
    }
    if (positionals.length === 1 && positionals[0] !== undefined) {
      return {
        file: positionals[0],
        out: values.out,
        workers,
        overrides: values.set,
        fresh: values.fresh,
        slurm,
      };
    }
    io.err(`midpath run: expected one experiment file, got ${positionals.length}\n${USAGE}`);
  } catch (cause) {
    io.err(`midpath run: ${(cause as Error).message}\n${USAGE}`);
  }
  return undefined;
}

/** Ctrl-C (and SIGTERM, as a cluster sends on cancel): drain first, kill on the second. */
function trapSignals(control: SweepControl, printer: ProgressPrinter): () => void {
  const onSignal = (): void => {
    if (!control.draining) {
      printer.onEvent({ type: 'draining', running: control.running });
      control.drain();
    } else if (!control.killed) {
      printer.onEvent({ type: 'killing', running: control.running });
      control.kill();
    }
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
  return () => {
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
  };
}

function exitStatusOf(summary: SweepSummary): number {
  if (summary.interrupted) return EXIT.interrupted;
  return summary.failed + summary.diverged > 0 ? EXIT.findings : EXIT.ok;
}

async function sweep(
  config: ExperimentConfig,
  jobs: JobSpec[],
  out: string,
  args: SweepChoice,
  io: CliIo,
): Promise<SweepSummary> {
  const runId = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomBytes(3).toString('hex')}`;
  const ledger = new RunLedger(out, {
    runId,
    onWarning: (m) => io.err(`midpath run: warning: ${m}`),
  });
  const db = ledger.database();
  const printer = createProgressPrinter({
    // The bar redraws in place, so on a terminal text goes out without an added newline.
    write: io.isTty ? (t) => void process.stdout.write(t) : (t) => io.out(t.replace(/\n$/, '')),
    isTty: io.isTty,
    color: io.isTty && !io.env.NO_COLOR,
  });
  const control = new SweepControl();
  const untrap = trapSignals(control, printer);
  const handlers = io.env[HANDLERS_MODULE_ENV];
  let outcome = 'error';
  try {
    if (db)
      indexRunStart(db, {
        runId,
        experiment: config.name,
        startedAt: new Date().toISOString(),
        hostname: hostname(),
        pid: process.pid,
        workers: args.workers ?? availableParallelism(),
      });
    const summary = await runSweep(jobs, {
      ledger,
      ...(args.workers === undefined ? {} : { workers: args.workers }),
      ...(args.cores === undefined ? {} : { cores: args.cores }),
      fresh: args.fresh,
      retries: config.run.retries,
      jobsPerWorker: config.run.jobsPerWorker,
      timeLimitMs: (kind) => config.run.timeout[kind] * 60_000,
      control,
      onEvent: (event) => printer.onEvent(event),
      env: handlers === undefined ? {} : { [HANDLERS_MODULE_ENV]: handlers },
    });
    outcome = summary.interrupted
      ? 'interrupted'
      : summary.failed + summary.diverged > 0
        ? 'failures'
        : 'complete';
    return summary;
  } finally {
    untrap();
    printer.stop();
    if (db) indexRunEnd(db, runId, outcome);
    ledger.close();
  }
}

async function report(out: string, io: CliIo): Promise<void> {
  try {
    const path = await writeReport(out);
    io.out(`Report: ${relative(io.cwd, path) || path}`);
  } catch (error) {
    io.err(
      `midpath run: the results are kept, but the report could not be written: ${(error as Error).message}`,
    );
  }
}

/** `midpath run FILE`: runs an experiment's jobs into a results directory, resumably. */
export const runCommand: CliCommand = {
  name: 'run',
  summary: 'run every job of an experiment in parallel workers, resuming what is done',
  usage: USAGE,
  async run(args, io) {
    const parsed = parseRunArgs(args, io);
    if (!parsed) return EXIT.badInput;
    if ('task' in parsed) return runSlurmTask(parsed.task, io);
    const loaded = await loadExperiment(parsed.file, { cwd: io.cwd, overrides: parsed.overrides });
    if (!loaded.ok) {
      io.err(formatConfigErrors(loaded.errors, readSourceIn(io.cwd, parsed.overrides)));
      return EXIT.badInput;
    }
    const jobs = expandPlan(loaded.config, loaded.baseDir);
    const out = resolve(io.cwd, parsed.out ?? join('results', loaded.config.name));
    let summary: SweepSummary;
    try {
      writePlanFile(out, {
        experiment: loaded.config.name,
        createdAt: new Date().toISOString(),
        config: loaded.config,
        jobs,
      });
      if (parsed.slurm) return submitToSlurm(loaded.config, jobs, out, parsed.slurm, io);
      summary = await sweep(loaded.config, jobs, out, parsed, io);
    } catch (error) {
      if (!(error instanceof StoreError)) throw error;
      io.err(`midpath run: ${error.code}: ${error.message}`);
      return EXIT.badInput;
    }
    io.out(describeSummary(summary));
    io.out(`Results: ${relative(io.cwd, out) || '.'}`);
    if (!summary.interrupted) await report(out, io);
    return exitStatusOf(summary);
  },
};

/** How array tasks start this Midpath: the same Node and the same checkout, absolute paths. */
function midpathCommand(): string {
  const bin = fileURLToPath(new URL('../../../bin/midpath.mjs', import.meta.url));
  return `${quoteShell(process.execPath)} ${quoteShell(bin)}`;
}

/** `--engine slurm`: submits the jobs without a kept result as SLURM arrays and returns. */
function submitToSlurm(
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
async function runSlurmTask(argument: string, io: CliIo): Promise<number> {
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
  const summary = await sweep(config, jobs, task.dir, { workers: 1, cores, fresh: false }, io);
  io.out(describeSummary(summary));
  return exitStatusOf(summary);
}
