/** The small interface every `midpath` sub-command implements (one file per command). */
export interface CliCommand {
  /** The word typed after `midpath`. */
  name: string;
  /** One line for `midpath --help`. */
  summary: string;
  /** Usage line(s) shown by `midpath help NAME` and on a usage error. */
  usage: string;
  /** Runs the command; resolves to the process exit status (0 ok, 1 findings, 2 bad input). */
  run(args: string[], io: CliIo): Promise<number>;
}

/** Where a command writes; tests pass buffers instead of the real streams. */
export interface CliIo {
  out: (text: string) => void;
  err: (text: string) => void;
  /** True when stdout is a terminal (tables and progress bars), false for pipes and logs. */
  isTty: boolean;
  /** Working directory used to resolve relative paths. */
  cwd: string;
  env: NodeJS.ProcessEnv;
}

/** Exit statuses shared by every command. */
export const EXIT = { ok: 0, findings: 1, badInput: 2, interrupted: 130 } as const;
