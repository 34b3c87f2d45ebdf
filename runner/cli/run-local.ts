/**
 * The local execution engine of `midpath run`: the sweep on this machine's cores with a
 * progress display, Ctrl-C handling and the run's row in the index (runner/execute/ does
 * the work). The SLURM array task runs its share of the jobs through the same `sweep`.
 */
import { randomBytes } from 'node:crypto';
import { availableParallelism, hostname } from 'node:os';
import { relative } from 'node:path';
import type { ExperimentConfig } from '../config/types.ts';
import { createProgressPrinter } from '../execute/progress-printer.ts';
import type { ProgressPrinter } from '../execute/progress-printer.ts';
import { runSweep } from '../execute/run-sweep.ts';
import { SweepControl } from '../execute/sweep-control.ts';
import type { SweepSummary } from '../execute/sweep-events.ts';
import { HANDLERS_MODULE_ENV } from '../execute/worker-protocol.ts';
import type { JobSpec } from '../plan/job-spec.ts';
import { writeReport } from '../report/index.ts';
import { indexRunEnd, indexRunStart } from '../store/run-index.ts';
import { RunLedger } from '../store/run-ledger.ts';
import { EXIT, type CliIo } from './command.ts';

/** How many jobs at once, and on how many cores (a SLURM task: the cores it was given). */
export interface SweepChoice {
  workers: number | undefined;
  cores?: number;
  fresh: boolean;
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

export function exitStatusOf(summary: SweepSummary): number {
  if (summary.interrupted) return EXIT.interrupted;
  return summary.failed + summary.diverged > 0 ? EXIT.findings : EXIT.ok;
}

export async function sweep(
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

export async function report(out: string, io: CliIo): Promise<void> {
  try {
    const path = await writeReport(out, {
      onNote: (note) => io.err(`note: ${note} (\`midpath prune\` lists them)`),
    });
    io.out(`Report: ${relative(io.cwd, path) || path}`);
  } catch (error) {
    io.err(
      `midpath run: the results are kept, but the report could not be written: ${(error as Error).message}`,
    );
  }
}
