/**
 * A condition that stops the whole sweep, not just one job: every later job would hit it
 * too. The runner starts no new job, lets running ones finish, and rethrows it; the CLI
 * prints `code: message` and exits 2. Results already written are kept, and the job that
 * hit it has no result, so running again (after the fix) resumes there.
 */
export type SweepStopCode = 'disk-full';

export class SweepStop extends Error {
  constructor(
    readonly code: SweepStopCode,
    message: string,
  ) {
    super(message);
    this.name = 'SweepStop';
  }
}

/** Error codes (errno names) that mean the file system is out of space or quota. */
export const DISK_FULL_CODES: ReadonlySet<string> = new Set(['ENOSPC', 'EDQUOT']);
