import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { makeFixtureRun } from '../report/fixture-run.ts';

let dir = '';
let cleanup = (): void => {};
beforeAll(() => {
  ({ dir, cleanup } = makeFixtureRun());
});
afterAll(() => cleanup());

describe('midpath report', () => {
  it('writes the report and prints its path', async () => {
    const io = bufferIo();
    expect(await main(['report', dir], io)).toBe(0);
    expect(io.stdout.join('').trim()).toBe(join(dir, 'report.html'));
    expect(existsSync(join(dir, 'report.html'))).toBe(true);
  });

  it('writes to --html FILE, relative to the working directory', async () => {
    const io = bufferIo(dir);
    expect(await main(['report', '.', '--html', 'out/r.html'], io)).toBe(0);
    expect(existsSync(join(dir, 'out', 'r.html'))).toBe(true);
  });

  it('rejects a directory without results with exit 2 and code no-results', async () => {
    const io = bufferIo();
    expect(await main(['report', join(dir, 'absent')], io)).toBe(2);
    expect(io.stderr.join('')).toContain('(no-results)');
  });

  it('rejects extra arguments with a usage message', async () => {
    const io = bufferIo();
    expect(await main(['report', dir, 'another'], io)).toBe(2);
    expect(io.stderr.join('')).toContain('Usage: midpath report');
  });
});
