import type { CliCommand } from '../command.ts';
import { checkCommand } from './check.ts';
import { compareCommand } from './compare.ts';
import { expandCommand } from './expand.ts';
import { inspectCommand } from './inspect.ts';
import { reportCommand } from './report.ts';
import { runCommand } from './run.ts';
import { statusCommand } from './status.ts';
import { tableCommand } from './table.ts';
import { pruneCommand } from './prune.ts';

/**
 * The command map: adding a command means adding one file under `commands/` and one entry
 * here. Kept in the order `midpath --help` prints them (the order of a working day).
 */
export const commands: CliCommand[] = [
  checkCommand,
  inspectCommand,
  expandCommand,
  runCommand,
  statusCommand,
  reportCommand,
  tableCommand,
  compareCommand,
  pruneCommand,
];
