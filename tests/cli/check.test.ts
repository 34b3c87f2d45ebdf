import { execFile } from 'node:child_process';
import { resolve } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { bufferIo } from '../helpers/cli-io.ts';

const run = promisify(execFile);
const root = resolve('.');

describe('midpath check (end to end)', () => {
  it('exits 0 for every shipped experiment file, spawned as a user would', async () => {
    const files = [
      'configs/demo.yaml',
      'configs/overnight-sweep.yaml',
      'configs/planning-study.yaml',
      'configs/encoder-benchmark.yaml',
    ];
    const { stdout } = await run('node', ['bin/midpath.mjs', 'check', ...files], { cwd: root });
    for (const file of files) expect(stdout).toContain(`${file}: ok`);
    expect(stdout).toContain('4 of 4 files valid');
  });

  it('exits 2 and prints every error as path:line:col  code  message, the line and a caret', async () => {
    const io = bufferIo(resolve('tests/fixtures/config'));
    const status = await main(['check', 'many-errors.yaml', 'bad/out-of-range-dim-zero.yaml'], io);
    expect(status).toBe(2);
    const err = io.stderr.join('');
    expect(err).toContain('many-errors.yaml:2:6  out-of-range  expected a whole number ≥ 1');
    expect(err).toContain('many-errors.yaml:4:3  unknown-key  ');
    expect(err).toContain('many-errors.yaml:10:5  empty-axis  ');
    expect(err).toContain('bad/out-of-range-dim-zero.yaml:2:6  out-of-range  ');
    // The source line, then a caret under column 6.
    expect(err).toContain('  2 | dim: 0\n    |      ^\n');
    expect(err).toContain('hint: did you mean `steps`?');
    expect(err).toContain('many-errors.yaml: 5 errors');
  });

  it('refuses a call without files or with an unknown option (exit 2, usage shown)', async () => {
    const none = bufferIo();
    expect(await main(['check'], none)).toBe(2);
    expect(none.stderr.join('')).toContain('Usage: midpath check FILE...');
    const option = bufferIo();
    expect(await main(['check', '--fast', 'configs/demo.yaml'], option)).toBe(2);
  });
});
