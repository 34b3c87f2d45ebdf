import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { bufferIo } from '../helpers/cli-io.ts';

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
