import type { CliIo } from '../../runner/cli/command.ts';

/** A CliIo that records what a command prints, for assertions. */
export function bufferIo(cwd = process.cwd()): CliIo & {
  stdout: string[];
  stderr: string[];
  text(): string;
} {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return {
    stdout,
    stderr,
    text: () => stdout.join('') + stderr.join(''),
    out: (t) => stdout.push(t.endsWith('\n') ? t : `${t}\n`),
    err: (t) => stderr.push(t.endsWith('\n') ? t : `${t}\n`),
    isTty: false,
    cwd,
    env: {},
  };
}
