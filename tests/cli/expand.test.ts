import { execFile } from 'node:child_process';
import { resolve } from 'node:path';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import type { JobSpec } from '../../runner/plan/job-spec.ts';
import { bufferIo } from '../helpers/cli-io.ts';

const run = promisify(execFile);

describe('midpath expand (end to end)', () => {
  it('--json prints a valid JSON array listing every job of the demo', async () => {
    const { stdout } = await run(
      'node',
      ['bin/midpath.mjs', 'expand', 'configs/demo.yaml', '--json'],
      {
        cwd: resolve('.'),
        maxBuffer: 64 * 1024 * 1024,
      },
    );
    const jobs = JSON.parse(stdout) as JobSpec[];
    expect(jobs).toHaveLength(44);
    expect(jobs.filter((j) => j.kind === 'train')).toHaveLength(22);
    expect(jobs[0]).toMatchObject({
      kind: 'train',
      experiment: 'demo',
      baseDir: resolve('configs'),
    });
  });

  it('prints an aligned table on a terminal and tab-separated rows into a pipe', async () => {
    const tty = { ...bufferIo(), isTty: true };
    const stdout: string[] = [];
    tty.out = (t) => stdout.push(t);
    expect(await main(['expand', 'configs/demo.yaml'], tty)).toBe(0);
    const table = stdout.join('\n');
    expect(table).toMatch(/^id\s+kind\s+method\s+seed\s+data\s+dim\s+train job/);
    expect(table).toContain('44 jobs: 22 train, 22 evaluate');
    const pipe = bufferIo();
    expect(await main(['expand', 'configs/demo.yaml'], pipe)).toBe(0);
    const rows = pipe.stdout.join('').trim().split('\n');
    expect(rows).toHaveLength(45);
    expect(rows[0]?.split('\t')).toEqual([
      'id',
      'kind',
      'method',
      'seed',
      'data',
      'dim',
      'train job',
    ]);
  });

  it('applies --set overrides and reports their errors against --set with the override shown', async () => {
    const ok = bufferIo();
    expect(
      await main(
        [
          'expand',
          'configs/demo.yaml',
          '--json',
          '--set',
          'sweep.seeds=1',
          '--set',
          'methods=[pca]',
        ],
        ok,
      ),
    ).toBe(0);
    expect(JSON.parse(ok.stdout.join('')) as unknown[]).toHaveLength(8);
    const bad = bufferIo();
    expect(
      await main(
        ['expand', 'configs/demo.yaml', '--set', 'dim=4', '--set', 'train.discount=2'],
        bad,
      ),
    ).toBe(2);
    expect(bad.stderr.join('')).toContain(
      '--set:2:16  out-of-range  expected a number > 0 and < 1, got 2\n  2 | train.discount=2\n',
    );
  });
});
