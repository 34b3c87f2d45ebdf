/** `midpath report DIR [--html FILE]` */
import { parseArgs } from 'node:util';
import { resolve } from 'node:path';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';
import { writeReport } from '../../report/index.ts';
import { withReportErrors } from '../with-report-errors.ts';

const usage = [
  'Usage: midpath report DIR [--html FILE]',
  '',
  'Writes the self-contained HTML report of a results directory (default DIR/report.html)',
  'and prints its path. The page needs no network and opens from a file:// URL.',
  '',
  '  --html FILE   where to write the report',
].join('\n');

async function runReport(args: string[], io: CliIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({ args, allowPositionals: true, options: { html: { type: 'string' } } });
  } catch (error) {
    io.err(`error: ${(error as Error).message} (bad-arguments)\n${usage}`);
    return EXIT.badInput;
  }
  const [dir, ...extra] = parsed.positionals;
  if (dir === undefined || extra.length > 0) {
    io.err(
      `error: expected one DIR, got ${JSON.stringify(parsed.positionals)} (bad-arguments)\n${usage}`,
    );
    return EXIT.badInput;
  }
  return withReportErrors(io, async () => {
    const html = parsed.values.html;
    const onNote = (note: string): void => io.err(`note: ${note}`);
    const path = await writeReport(
      resolve(io.cwd, dir),
      html === undefined ? { onNote } : { htmlPath: resolve(io.cwd, html), onNote },
    );
    io.out(path);
    return EXIT.ok;
  });
}

export const reportCommand: CliCommand = {
  name: 'report',
  summary: 'write the self-contained HTML report of a results directory',
  usage,
  run: runReport,
};
