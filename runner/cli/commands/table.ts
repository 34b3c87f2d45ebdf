/** `midpath table DIR --format csv|markdown|latex|json [--metric NAME]...` */
import { parseArgs } from 'node:util';
import { resolve } from 'node:path';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';
import { renderTable } from '../../report/write-table.ts';
import { withReportErrors } from '../with-report-errors.ts';

const usage = [
  'Usage: midpath table DIR --format csv|markdown|latex|json [--metric NAME]...',
  '',
  'Prints the tidy table of a results directory: one row per setting, method, metric,',
  'source and level with n, mean, std and the 95 % t-interval over seeds (ci_low, ci_high).',
  '',
  '  --format F      csv, markdown, latex (booktabs, best in bold) or json',
  '  --metric NAME   keep only this metric; repeat for several',
].join('\n');

async function runTable(args: string[], io: CliIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args,
      allowPositionals: true,
      options: { format: { type: 'string' }, metric: { type: 'string', multiple: true } },
    });
  } catch (error) {
    io.err(`error: ${(error as Error).message} (bad-arguments)\n${usage}`);
    return EXIT.badInput;
  }
  const [dir, ...extra] = parsed.positionals;
  if (dir === undefined || extra.length > 0 || parsed.values.format === undefined) {
    io.err(
      `error: expected one DIR and --format, got ${JSON.stringify(args)} (bad-arguments)\n${usage}`,
    );
    return EXIT.badInput;
  }
  const format = parsed.values.format;
  return withReportErrors(io, async () => {
    io.out(
      await renderTable(resolve(io.cwd, dir), {
        format,
        metrics: parsed.values.metric ?? [],
        onNote: (note) => io.err(`note: ${note}`),
      }),
    );
    return EXIT.ok;
  });
}

export const tableCommand: CliCommand = {
  name: 'table',
  summary: 'tidy tables of a run for papers and scripts (csv, markdown, latex, json)',
  usage,
  run: runTable,
};
