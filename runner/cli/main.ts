import { readFileSync } from 'node:fs';
import type { CliIo } from './command.ts';
import { EXIT } from './command.ts';
import { commands } from './commands/index.ts';

/** The package version, read once from package.json. */
export function readVersion(): string {
  const raw = readFileSync(new URL('../../package.json', import.meta.url), 'utf8');
  return (JSON.parse(raw) as { version: string }).version;
}

function helpText(): string {
  const width = Math.max(...commands.map((c) => c.name.length), 4);
  const lines = commands.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`);
  return [
    'midpath — sweeps of temporal contrastive encoders with closed-form forecasts and bridges',
    '',
    'Usage: midpath <command> [options]',
    '',
    'Commands:',
    ...lines,
    '',
    'Run `midpath help <command>` for the options of one command.',
  ].join('\n');
}

/** Default I/O bound to the real process streams. */
export function processIo(): CliIo {
  return {
    out: (t) => process.stdout.write(t.endsWith('\n') ? t : `${t}\n`),
    err: (t) => process.stderr.write(t.endsWith('\n') ? t : `${t}\n`),
    isTty: Boolean(process.stdout.isTTY),
    cwd: process.cwd(),
    env: process.env,
  };
}

/** Dispatches `argv` (without node and script) to a command; resolves to the exit status. */
export async function main(argv: string[], io: CliIo = processIo()): Promise<number> {
  const [first, ...rest] = argv;
  if (first === undefined || first === '--help' || first === '-h') {
    io.out(helpText());
    return first === undefined ? EXIT.badInput : EXIT.ok;
  }
  if (first === '--version' || first === '-v') {
    io.out(readVersion());
    return EXIT.ok;
  }
  if (first === 'help') {
    const target = commands.find((c) => c.name === rest[0]);
    io.out(target ? target.usage : helpText());
    return target || rest[0] === undefined ? EXIT.ok : EXIT.badInput;
  }
  const command = commands.find((c) => c.name === first);
  if (!command) {
    io.err(
      `midpath: unknown command '${first}'. Known commands: ${commands.map((c) => c.name).join(', ')}.`,
    );
    return EXIT.badInput;
  }
  // `midpath run --help` means `midpath help run`, wherever the flag stands before a `--`.
  const options = rest.includes('--') ? rest.slice(0, rest.indexOf('--')) : rest;
  if (options.includes('--help') || options.includes('-h')) {
    io.out(command.usage);
    return EXIT.ok;
  }
  return command.run(rest, io);
}
