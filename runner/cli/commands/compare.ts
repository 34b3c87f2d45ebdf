/** `midpath compare BASE_DIR CANDIDATE_DIR [--json] [--tolerance X]` */
import { parseArgs } from 'node:util';
import { basename, resolve } from 'node:path';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';
import {
  compareRuns,
  DEFAULT_COMPARE,
  formatComparison,
  parseTolerance,
} from '../../report/compare/index.ts';
import { withReportErrors } from '../with-report-errors.ts';

const usage = [
  'Usage: midpath compare BASE_DIR CANDIDATE_DIR [--json] [--tolerance X]',
  '',
  'Compares every metric two runs share. A regression is a change in the worse direction',
  'beyond the tolerance that is also significant (paired t-test on shared seeds, else',
  "Welch; Holm's adjustment). Exits 1 when anything regressed, 0 otherwise.",
  '',
  '  --tolerance X   practical tolerance, relative: 0.05 or 5% (default 0.05)',
  '  --json          print the comparison as JSON instead of Markdown',
].join('\n');

async function runCompare(args: string[], io: CliIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args,
      allowPositionals: true,
      options: { json: { type: 'boolean' }, tolerance: { type: 'string' } },
    });
  } catch (error) {
    io.err(`error: ${(error as Error).message} (bad-arguments)\n${usage}`);
    return EXIT.badInput;
  }
  const [base, candidate, ...extra] = parsed.positionals;
  if (base === undefined || candidate === undefined || extra.length > 0) {
    io.err(
      `error: expected BASE_DIR and CANDIDATE_DIR, got ${JSON.stringify(parsed.positionals)} (bad-arguments)\n${usage}`,
    );
    return EXIT.badInput;
  }
  return withReportErrors(io, async () => {
    const tolerance =
      parsed.values.tolerance === undefined
        ? DEFAULT_COMPARE.tolerance
        : parseTolerance(parsed.values.tolerance);
    const comparison = await compareRuns(
      resolve(io.cwd, base),
      resolve(io.cwd, candidate),
      { ...DEFAULT_COMPARE, tolerance },
      (note) => io.err(`note: ${note}`),
    );
    io.out(
      parsed.values.json === true
        ? JSON.stringify(comparison, null, 2)
        : formatComparison(
            comparison,
            basename(resolve(io.cwd, base)),
            basename(resolve(io.cwd, candidate)),
          ),
    );
    return comparison.counts.regressed > 0 ? EXIT.findings : EXIT.ok;
  });
}

export const compareCommand: CliCommand = {
  name: 'compare',
  summary: 'regression gate: does a candidate run do worse than a base run?',
  usage,
  run: runCompare,
};
