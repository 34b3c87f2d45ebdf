import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import type { CliIo } from '../../runner/cli/command.ts';

function bufferIo(): CliIo & { stdout: string[]; stderr: string[] } {
  const stdout: string[] = [];
  const stderr: string[] = [];
  return {
    stdout,
    stderr,
    out: (t) => stdout.push(t),
    err: (t) => stderr.push(t),
    isTty: false,
    cwd: process.cwd(),
    env: {},
  };
}

describe('midpath CLI dispatch', () => {
  it('prints help listing every command and exits 0', async () => {
    const io = bufferIo();
    expect(await main(['--help'], io)).toBe(0);
    expect(io.stdout.join('')).toContain('Usage: midpath <command>');
  });

  it('rejects an unknown command with exit 2 and names it', async () => {
    const io = bufferIo();
    expect(await main(['frobnicate'], io)).toBe(2);
    expect(io.stderr.join('')).toContain("unknown command 'frobnicate'");
  });
});
