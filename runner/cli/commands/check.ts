import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { formatConfigErrors, type ReadSource } from '../../config/config-error.ts';
import { countJobs } from '../../config/count-jobs.ts';
import { loadExperiment } from '../../config/load-experiment.ts';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';

/** Reads source excerpts for error output relative to the command's working directory. */
export function readSourceIn(cwd: string, overrides: readonly string[] = []): ReadSource {
  return (file) => {
    if (file === '--set') return overrides.join('\n');
    try {
      return readFileSync(resolve(cwd, file), 'utf8');
    } catch {
      return undefined;
    }
  };
}

function parseCheckArgs(args: string[], io: CliIo): string[] | undefined {
  try {
    const { positionals } = parseArgs({ args, allowPositionals: true, options: {}, strict: true });
    if (positionals.length > 0) return positionals;
    io.err(`midpath check: expected at least one experiment file, got none\n${checkCommand.usage}`);
  } catch (cause) {
    io.err(`midpath check: ${(cause as Error).message}\n${checkCommand.usage}`);
  }
  return undefined;
}

/** `midpath check FILE...`: validates experiment files without running or writing anything. */
export const checkCommand: CliCommand = {
  name: 'check',
  summary: 'validate experiment files and print every error with its line and column',
  usage: [
    'Usage: midpath check FILE...',
    '',
    'Validates each experiment file (YAML, its `extends` bases and the sweep) and prints',
    'every error as `file:line:col  code  message` with the source line and a caret.',
    'Exit status: 0 when every file is valid, 2 when any is not. Nothing is written.',
  ].join('\n'),
  async run(args, io) {
    const files = parseCheckArgs(args, io);
    if (!files) return EXIT.badInput;
    let failed = 0;
    for (const file of files) {
      const result = await loadExperiment(file, { cwd: io.cwd });
      if (result.ok) {
        const count = countJobs(result.config);
        io.out(
          `${file}: ok — ${count.total} jobs (${count.train} train, ${count.evaluate} evaluate)`,
        );
        continue;
      }
      failed += 1;
      io.err(formatConfigErrors(result.errors, readSourceIn(io.cwd)));
      const n = result.errors.length;
      io.err(`${file}: ${n} error${n === 1 ? '' : 's'}\n`);
    }
    if (files.length > 1) io.out(`${files.length - failed} of ${files.length} files valid`);
    return failed === 0 ? EXIT.ok : EXIT.badInput;
  },
};
