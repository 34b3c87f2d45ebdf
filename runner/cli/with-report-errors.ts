import type { CliIo } from './command.ts';
import { EXIT } from './command.ts';
import { describeFailure } from '../report/report-error.ts';

/**
 * Runs a report-stage command body; a known report or store error is printed with its code
 * and becomes exit 2 (bad input), anything else is a bug and propagates.
 */
export async function withReportErrors(io: CliIo, action: () => Promise<number>): Promise<number> {
  try {
    return await action();
  } catch (error) {
    const text = describeFailure(error);
    if (text === null) throw error;
    io.err(text);
    return EXIT.badInput;
  }
}
