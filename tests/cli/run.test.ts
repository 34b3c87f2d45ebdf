import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import type { PlanFile } from '../../runner/store/result.ts';
import { readRun } from '../../runner/store/read-run.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { fakeHandlersPath, readJournal, tempRun } from '../fixtures/execute/fake-sweep.ts';

const experiment = fileURLToPath(new URL('../fixtures/execute/tiny-sweep.yaml', import.meta.url));

describe('midpath run (end to end, fake handlers)', () => {
  it('runs the plan into the results directory, writes the report, and resumes on a second run', async () => {
    const { dir, journal } = tempRun();
    const io = bufferIo(join(dir, '..'));
    io.env = { MIDPATH_HANDLERS_MODULE: fakeHandlersPath, MIDPATH_FAKE_JOURNAL: journal };
    // The journal variable reaches workers through the process environment.
    process.env.MIDPATH_FAKE_JOURNAL = journal;
    try {
      expect(await main(['run', experiment, '--out', 'out', '--workers', '2'], io)).toBe(0);
      const plan = JSON.parse(readFileSync(join(dir, 'plan.json'), 'utf8')) as PlanFile;
      expect(plan.experiment).toBe('tiny-sweep');
      expect(plan.jobs.map((j) => j.kind)).toEqual([
        'train',
        'train',
        'train',
        'evaluate',
        'evaluate',
        'evaluate',
      ]);
      const { results } = await readRun(dir);
      expect(results.map((r) => r.id)).toEqual(plan.jobs.map((j) => j.id));
      expect(io.text()).toContain('Finished: 6 done, 0 failed');
      expect(io.text()).toContain('Report: out/report.html');

      const again = bufferIo(join(dir, '..'));
      again.env = io.env;
      expect(await main(['run', experiment, '--out', 'out'], again)).toBe(0);
      expect(again.text()).toContain('6 kept from earlier runs');
      expect([...readJournal(journal).values()]).toEqual(Array(6).fill(1));

      // Changing only evaluation settings reruns only the evaluations, reusing the encoders.
      const evalOnly = bufferIo(join(dir, '..'));
      evalOnly.env = io.env;
      expect(
        await main(['run', experiment, '--out', 'out', '--set', 'eval.queries=7'], evalOnly),
      ).toBe(0);
      expect(evalOnly.text()).toContain('3 done, 0 failed, 0 diverged, 3 kept from earlier runs');
      const attempts = readJournal(journal);
      expect(attempts.size).toBe(9);
      const trainIds = plan.jobs.filter((j) => j.kind === 'train').map((j) => j.id);
      expect(trainIds.map((id) => attempts.get(id))).toEqual([1, 1, 1]);
    } finally {
      delete process.env.MIDPATH_FAKE_JOURNAL;
    }
  });

  it('refuses bad options and an unwritable output with exit 2 and a code', async () => {
    const { dir } = tempRun();
    const io = bufferIo();
    expect(await main(['run', experiment, '--workers', '0'], io)).toBe(2);
    expect(io.text()).toContain('bad-option: --workers expects a whole number of at least 1');
    mkdirSync(join(dir, '..'), { recursive: true });
    writeFileSync(dir, 'a file, not a directory');
    const blocked = bufferIo();
    expect(await main(['run', experiment, '--out', join(dir, 'inside')], blocked)).toBe(2);
    expect(blocked.text()).toContain('store-unwritable');
  });
});

describe('midpath run on a full disk', () => {
  it('stops at the first job that finds the disk full, exits 2 naming it, and resumes after', async () => {
    const { dir, journal } = tempRun();
    const failFile = join(dir, '..', 'fail.txt');
    const io = bufferIo(join(dir, '..'));
    io.env = { MIDPATH_HANDLERS_MODULE: fakeHandlersPath };
    process.env.MIDPATH_FAKE_JOURNAL = journal;
    process.env.MIDPATH_FAKE_FAIL_FILE = failFile;
    try {
      mkdirSync(join(dir, '..'), { recursive: true });
      const plan = ['expand', experiment, '--json'];
      const listed = bufferIo(join(dir, '..'));
      expect(await main(plan, listed)).toBe(0);
      const [first] = JSON.parse(listed.stdout.join('')) as { id: string }[];
      writeFileSync(failFile, `${first!.id} disk-full\n`);
      expect(await main(['run', experiment, '--out', 'out', '--workers', '1'], io)).toBe(2);
      expect(io.text()).toMatch(
        new RegExp(
          `midpath run: disk-full: job ${first!.id} ran out of disk space writing to .*ENOSPC`,
        ),
      );
      expect((await readRun(dir)).results).toHaveLength(0);

      writeFileSync(failFile, '');
      const again = bufferIo(join(dir, '..'));
      again.env = io.env;
      expect(await main(['run', experiment, '--out', 'out', '--workers', '1'], again)).toBe(0);
      expect((await readRun(dir)).results).toHaveLength(6);
      expect(readJournal(journal).get(first!.id)).toBe(2);
    } finally {
      delete process.env.MIDPATH_FAKE_JOURNAL;
      delete process.env.MIDPATH_FAKE_FAIL_FILE;
    }
  });
});

describe('midpath run interrupted (a real process and a real SIGINT)', () => {
  it('drains on Ctrl-C, exits 130, keeps what finished, and the next run does the rest', async () => {
    const { spawn } = await import('node:child_process');
    const { dir, journal } = tempRun();
    mkdirSync(join(dir, '..'), { recursive: true });
    const bin = fileURLToPath(new URL('../../bin/midpath.mjs', import.meta.url));
    const env = {
      ...process.env,
      MIDPATH_HANDLERS_MODULE: fakeHandlersPath,
      MIDPATH_FAKE_JOURNAL: journal,
    };
    const child = spawn(
      process.execPath,
      [bin, 'run', experiment, '--out', dir, '--workers', '1'],
      { env },
    );
    let output = '';
    let signalled = false;
    child.stdout.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      if (!signalled && /^done /m.test(output)) {
        signalled = true;
        child.kill('SIGINT');
      }
    });
    const code = await new Promise<number | null>((done) => child.on('close', (c) => done(c)));
    expect(code).toBe(130);
    expect(output).toContain('stopping: no new jobs');
    expect(output).toMatch(/Interrupted: [1-5] done/);
    const kept = (await readRun(dir)).results.length;
    expect(kept).toBeGreaterThanOrEqual(1);
    expect(kept).toBeLessThan(6);

    const io = bufferIo();
    io.env = { MIDPATH_HANDLERS_MODULE: fakeHandlersPath };
    expect(await main(['run', experiment, '--out', dir], io)).toBe(0);
    expect(io.text()).toContain(`${kept} kept from earlier runs`);
    expect((await readRun(dir)).results).toHaveLength(6);
  });
});
