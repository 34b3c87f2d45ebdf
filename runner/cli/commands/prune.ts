/** `midpath prune DIR [--delete]`: lists, or removes, the results of jobs the plan no longer lists. */
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { StoreError } from '../../store/store-error.ts';
import { findLeftovers, removeLeftovers } from '../../store/prune-run.ts';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';

const USAGE = [
  'Usage: midpath prune DIR [--delete]',
  '',
  'Lists the job directories of a results directory that its plan.json no longer lists:',
  'jobs of an earlier version of the experiment, which reports and tables already leave out.',
  'With --delete, removes them (never one that another runner holds) and rebuilds the index.',
  'Exit status: 0 on success, 2 when DIR is not a results directory with a plan.json.',
].join('\n');

function megabytes(bytes: number): string {
  return `${(bytes / 2 ** 20).toFixed(1)} MB`;
}

async function runPrune(args: string[], io: CliIo): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args,
      allowPositionals: true,
      options: { delete: { type: 'boolean', default: false } },
    });
  } catch (error) {
    io.err(`midpath prune: ${(error as Error).message}\n${USAGE}`);
    return EXIT.badInput;
  }
  const [dir, ...extra] = parsed.positionals;
  if (dir === undefined || extra.length > 0) {
    io.err(
      `midpath prune: expected one results directory, got ${parsed.positionals.length}\n${USAGE}`,
    );
    return EXIT.badInput;
  }
  try {
    const full = resolve(io.cwd, dir);
    const leftovers = findLeftovers(full);
    const bytes = leftovers.reduce((sum, l) => sum + l.bytes, 0);
    if (leftovers.length === 0) {
      io.out(`${dir}: every job directory belongs to the current plan; nothing to prune.`);
      return EXIT.ok;
    }
    if (!parsed.values.delete) {
      for (const l of leftovers)
        io.out(`  ${l.id}  ${l.status ?? 'no result'}  ${megabytes(l.bytes)}`);
      io.out(
        `${leftovers.length} job directories (${megabytes(bytes)}) are not in ${dir}/plan.json. Run again with --delete to remove them.`,
      );
      return EXIT.ok;
    }
    const { removed, busy } = await removeLeftovers(full, leftovers);
    io.out(
      `Removed ${removed.length} job directories not in the plan (${megabytes(bytes)} before).`,
    );
    if (busy.length > 0) {
      io.out(`Kept ${busy.length} that another runner holds: ${busy.join(', ')}`);
    }
    return EXIT.ok;
  } catch (error) {
    if (!(error instanceof StoreError)) throw error;
    io.err(`midpath prune: ${error.code}: ${error.message}`);
    return EXIT.badInput;
  }
}

export const pruneCommand: CliCommand = {
  name: 'prune',
  summary: 'list or remove the results of jobs the current plan no longer lists',
  usage: USAGE,
  run: runPrune,
};
