import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
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
import { EXIT, type CliCommand, type CliIo } from '../command.ts';
import { readSourceIn } from './check.ts';

interface RunArgs {
  file: string;
  out: string | undefined;
  workers: number | undefined;
  overrides: string[];
  fresh: boolean;
}

const USAGE = [
  'Usage: midpath run FILE [--out DIR] [--workers N] [--set path=value]... [--fresh]',
  '',
  'Runs every job of the experiment in worker processes and writes the results directory,',
  'then the report. Jobs with a kept result are skipped, so running again resumes.',
  '  --out DIR           results directory (default results/<name>/ under the working directory)',
  '  --workers N         jobs at once, each in its own process (default: the number of cores)',
  '  --set path=value    override a config value (YAML value, typed by the schema); repeatable',
  '  --fresh             rerun every job, ignoring kept results',
  'Ctrl-C once: start no new job, let running ones finish. Twice: stop them now.',
  'Exit status: 0 all done, 1 some jobs failed or diverged, 2 bad input or unwritable output,',
  '130 interrupted.',
].join('\n');

function parseRunArgs(args: string[], io: CliIo): RunArgs | undefined {
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
      },
    });
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
  args: RunArgs,
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
        workers: args.workers ?? 0,
      });
    const summary = await runSweep(jobs, {
      ledger,
      ...(args.workers === undefined ? {} : { workers: args.workers }),
      fresh: args.fresh,
      retries: config.run.retries,
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
