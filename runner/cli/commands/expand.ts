import { parseArgs } from 'node:util';
import { formatConfigErrors } from '../../config/config-error.ts';
import { loadExperiment } from '../../config/load-experiment.ts';
import { expandPlan } from '../../plan/expand-plan.ts';
import type { JobSpec } from '../../plan/job-spec.ts';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';
import { readSourceIn } from './check.ts';

interface ExpandArgs {
  file: string;
  json: boolean;
  overrides: string[];
}

function parseExpandArgs(args: string[], io: CliIo): ExpandArgs | undefined {
  try {
    const { values, positionals } = parseArgs({
      args,
      allowPositionals: true,
      strict: true,
      options: {
        json: { type: 'boolean', default: false },
        set: { type: 'string', multiple: true, default: [] },
      },
    });
    if (positionals.length === 1 && positionals[0] !== undefined) {
      return { file: positionals[0], json: values.json, overrides: values.set };
    }
    io.err(
      `midpath expand: expected one experiment file, got ${positionals.length}\n${expandCommand.usage}`,
    );
  } catch (cause) {
    io.err(`midpath expand: ${(cause as Error).message}\n${expandCommand.usage}`);
  }
  return undefined;
}

function formatCell(value: unknown): string {
  return typeof value === 'string' ? value : JSON.stringify(value);
}

/** Rows of the job listing: id, kind, method, seed, one column per swept path, train id. */
export function tabulateJobs(jobs: readonly JobSpec[]): string[][] {
  const paths = [...new Set(jobs.flatMap((j) => Object.keys(j.setting)))];
  const header = ['id', 'kind', 'method', 'seed', ...paths, 'train job'];
  const rows = jobs.map((job) => [
    job.id,
    job.kind,
    job.method.label,
    String(job.seed),
    ...paths.map((p) => (p in job.setting ? formatCell(job.setting[p]) : '·')),
    job.kind === 'evaluate' ? job.trainId : '',
  ]);
  return [header, ...rows];
}

/** Aligns rows into columns separated by two spaces, for a terminal. */
function alignRows(rows: readonly string[][]): string {
  const widths = rows[0]?.map((_, c) => Math.max(...rows.map((r) => (r[c] ?? '').length))) ?? [];
  return rows
    .map((r) =>
      r
        .map((cell, c) => cell.padEnd(widths[c] ?? 0))
        .join('  ')
        .trimEnd(),
    )
    .join('\n');
}

/** `midpath expand FILE`: lists the jobs an experiment file expands to. */
export const expandCommand: CliCommand = {
  name: 'expand',
  summary: 'list the jobs an experiment file expands to, with their content-hash ids',
  usage: [
    'Usage: midpath expand FILE [--json] [--set path=value]...',
    '',
    'Prints every job of the plan: train jobs, then evaluate jobs naming their train job.',
    'On a terminal: an aligned table; piped: tab-separated rows; --json: a JSON array of job specs.',
    '  --json              print the full job specs as a JSON array',
    '  --set path=value    override a config value (YAML value, typed by the schema); repeatable',
    'Exit status: 0 on success, 2 when the file (or an override) is invalid. Nothing is written.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseExpandArgs(args, io);
    if (!parsed) return EXIT.badInput;
    const result = await loadExperiment(parsed.file, { cwd: io.cwd, overrides: parsed.overrides });
    if (!result.ok) {
      io.err(formatConfigErrors(result.errors, readSourceIn(io.cwd, parsed.overrides)));
      return EXIT.badInput;
    }
    const jobs = expandPlan(result.config, result.baseDir);
    if (parsed.json) {
      io.out(JSON.stringify(jobs, null, 2));
      return EXIT.ok;
    }
    const rows = tabulateJobs(jobs);
    const train = jobs.filter((j) => j.kind === 'train').length;
    if (io.isTty) {
      io.out(alignRows(rows));
      io.out(`\n${jobs.length} jobs: ${train} train, ${jobs.length - train} evaluate`);
    } else {
      io.out(rows.map((r) => r.join('\t')).join('\n'));
    }
    return EXIT.ok;
  },
};
