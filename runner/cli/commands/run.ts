// `midpath run`: parses the options, loads and plans the experiment, writes plan.json and
// hands the jobs to the execution engine `--engine` names (run-local.ts, run-slurm.ts).
import { join, relative, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { formatConfigErrors } from '../../config/config-error.ts';
import type { ExperimentConfig } from '../../config/types.ts';
import { loadExperiment } from '../../config/load-experiment.ts';
import { describeSummary } from '../../execute/progress-printer.ts';
import { expandPlan } from '../../plan/expand-plan.ts';
import type { JobSpec } from '../../plan/job-spec.ts';
import { StoreError } from '../../store/store-error.ts';
import { SweepStop } from '../../execute/sweep-stop.ts';
import { writePlanFile } from '../../store/write-result.ts';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';
import { exitStatusOf, report, sweep } from '../run-local.ts';
import type { SlurmArgs } from '../run-slurm.ts';
import { parseSlurmArgs, runSlurmTask, submitToSlurm } from '../run-slurm.ts';
import { readSourceIn } from './check.ts';

interface RunArgs {
  file: string;
  out: string | undefined;
  workers: number | undefined;
  overrides: string[];
  fresh: boolean;
  /** The engine's own options (SLURM's), undefined for the local engine. */
  slurm: SlurmArgs | undefined;
}

const USAGE = [
  'Usage: midpath run FILE [--out DIR] [--workers N] [--set path=value]... [--fresh]',
  '       midpath run FILE --engine slurm [--out DIR] [--partition P] [--time HH:MM:SS]',
  '                   [--cpus-per-task N] [--max-parallel K] [--sbatch-arg ARG]... [--dry-run]',
  '',
  'Runs every job of the experiment in worker processes and writes the results directory,',
  'then the report. Jobs with a kept result are skipped, so running again resumes.',
  '  --out DIR           results directory (default results/<name>/ under the working directory)',
  '  --workers N         worker processes, one job each at a time (default: the number of cores)',
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

/** A planned run, as every execution engine receives it (plan.json already written). */
interface PlannedRun {
  config: ExperimentConfig;
  jobs: JobSpec[];
  out: string;
  args: RunArgs;
}

/** The local engine: runs the sweep here, then prints the summary and writes the report. */
async function runHere(run: PlannedRun, io: CliIo): Promise<number> {
  const summary = await sweep(run.config, run.jobs, run.out, run.args, io);
  io.out(describeSummary(summary));
  io.out(`Results: ${relative(io.cwd, run.out) || '.'}`);
  if (!summary.interrupted) await report(run.out, io);
  return exitStatusOf(summary);
}

/** Execution engines by the name `--engine` takes. */
const ENGINES: Record<'local' | 'slurm', (run: PlannedRun, io: CliIo) => Promise<number>> = {
  local: runHere,
  slurm: (run, io) =>
    Promise.resolve(submitToSlurm(run.config, run.jobs, run.out, run.args.slurm!, io)),
};

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
    const engine = ENGINES[parsed.slurm ? 'slurm' : 'local'];
    try {
      writePlanFile(out, {
        experiment: loaded.config.name,
        createdAt: new Date().toISOString(),
        config: loaded.config,
        jobs,
      });
      return await engine({ config: loaded.config, jobs, out, args: parsed }, io);
    } catch (error) {
      if (!(error instanceof StoreError || error instanceof SweepStop)) throw error;
      io.err(`midpath run: ${error.code}: ${error.message}`);
      return EXIT.badInput;
    }
  },
};
