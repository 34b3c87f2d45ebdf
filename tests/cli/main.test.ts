import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { bufferIo } from '../helpers/cli-io.ts';

describe('midpath CLI dispatch', () => {
  it('prints help listing every command and exits 0', async () => {
    const io = bufferIo();
    expect(await main(['--help'], io)).toBe(0);
    expect(io.stdout.join('')).toContain('Usage: midpath <command>');
  });

  it("prints one command's usage for `<command> --help` and exits 0, writing nothing", async () => {
    for (const name of ['run', 'check', 'table']) {
      const io = bufferIo();
      expect(await main([name, 'configs/demo.yaml', '--help'], io)).toBe(0);
      expect(io.stdout.join('')).toContain(`Usage: midpath ${name}`);
      expect(io.stderr.join('')).toBe('');
    }
  });

  it('rejects an unknown command with exit 2 and names it', async () => {
    const io = bufferIo();
    expect(await main(['frobnicate'], io)).toBe(2);
    expect(io.stderr.join('')).toContain("unknown command 'frobnicate'");
  });
});
