import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { formatDuration } from '../../execute/progress-printer.ts';
import { readSchedulerView } from '../../execute/slurm/scheduler-view.ts';
import { readSubmissions } from '../../execute/slurm/slurm-manifest.ts';
import type { ExternalView, RunStatus } from '../../store/run-status.ts';
import { readRunStatus } from '../../store/run-status.ts';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';

const USAGE = [
  'Usage: midpath status DIR [--json]',
  '',
  'Says where a results directory stands: jobs done, running, failed, diverged and pending,',
  "each failure's reason, and the time to finish estimated from the measured cost of the",
  'finished jobs of each kind. Safe to use while a run writes to the directory. For a run',
  'submitted with --engine slurm, also asks SLURM (squeue, scontrol) about jobs without a result.',
  '  --json    print the status as one JSON object',
  'Exit status: 0 nothing failed or diverged, 1 some did, 2 DIR is not a results directory.',
].join('\n');

function parseStatusArgs(args: string[], io: CliIo): { dir: string; json: boolean } | undefined {
  try {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      strict: true,
      options: { json: { type: 'boolean', default: false } },
    });
    if (positionals.length === 1 && positionals[0] !== undefined)
      return { dir: positionals[0], json: values.json };
    io.err(`midpath status: expected one results directory, got ${positionals.length}\n${USAGE}`);
  } catch (cause) {
    io.err(`midpath status: ${(cause as Error).message}\n${USAGE}`);
  }
  return undefined;
}

/** The status as lines of text for a person. */
export function formatStatus(status: RunStatus, dir: string): string {
  const { counts } = status;
  const lines = [
    `${status.experiment ?? '(no plan.json)'} — ${dir}`,
    `${status.total} jobs: ${counts.done} done, ${counts.running} running, ${counts.failed} failed, ${counts.diverged} diverged, ${counts.pending} pending`,
  ];
  if (status.earlierResults > 0) {
    lines.push(
      `${status.earlierResults} result(s) of jobs that plan.json no longer lists (an earlier version of the experiment) are not counted`,
    );
  }
  for (const [kind, cost] of Object.entries(status.costs)) {
    const mean =
      cost.meanSeconds === null ? 'not yet measured' : `${formatDuration(cost.meanSeconds)} each`;
    lines.push(`  ${kind.padEnd(8)} ${cost.remaining} to do, ${mean}`);
  }
  const left = counts.running + counts.pending;
  if (left > 0) {
    const eta =
      status.etaSeconds === null
        ? 'unknown until a job of each kind has finished'
        : formatDuration(status.etaSeconds);
    lines.push(
      `Estimated time to finish: ${eta}${counts.running > 0 ? ` at ${counts.running} jobs at once` : ' (run by one worker)'}`,
    );
  }
  if (status.failures.length > 0) lines.push('', 'Failures:');
  for (const failure of status.failures)
    lines.push(
      `  ${failure.status.padEnd(8)} ${failure.kind.padEnd(8)} ${failure.id}  ${failure.reason}`,
    );
  const problems = status.problems.filter((p) => p.code !== 'store-missing-plan');
  if (problems.length > 0) lines.push('', 'Unreadable files:');
  for (const problem of problems)
    lines.push(`  ${problem.code}  ${problem.file}: ${problem.message}`);
  return lines.join('\n');
}

/** For a directory filled by `--engine slurm`: what SLURM says about jobs without a result. */
function readSlurmView(dir: string): Map<string, ExternalView> {
  const external = new Map<string, ExternalView>();
  if (readSubmissions(dir).length === 0) return external;
  for (const [id, seen] of readSchedulerView(dir)) {
    const without = seen.state.startsWith('COMPLETED') ? ' without writing a result' : '';
    external.set(id, {
      phase: seen.phase,
      reason: `SLURM task ${seen.task} ended ${seen.state}${without}`,
    });
  }
  return external;
}

/** `midpath status DIR`: counts, failures and an ETA for a results directory. */
export const statusCommand: CliCommand = {
  name: 'status',
  summary: 'show how far a run is: done, running, failed, pending, with reasons and an ETA',
  usage: USAGE,
  async run(args, io) {
    const parsed = parseStatusArgs(args, io);
    if (!parsed) return EXIT.badInput;
    const dir = resolve(io.cwd, parsed.dir);
    if (!existsSync(dir)) {
      io.err(
        `midpath status: store-not-a-run: ${parsed.dir}: no such directory; give the --out directory of a \`midpath run\``,
      );
      return EXIT.badInput;
    }
    const status = await readRunStatus(dir, readSlurmView(dir));
    if (status.total === 0 && status.experiment === null) {
      io.err(
        `midpath status: store-not-a-run: ${parsed.dir}: no plan.json and no results; give the --out directory of a \`midpath run\``,
      );
      return EXIT.badInput;
    }
    io.out(parsed.json ? JSON.stringify(status, null, 2) : formatStatus(status, parsed.dir));
    return status.counts.failed + status.counts.diverged > 0 ? EXIT.findings : EXIT.ok;
  },
};
