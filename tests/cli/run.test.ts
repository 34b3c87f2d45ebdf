import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import type { PlanFile } from '../../runner/store/result.ts';
import { readRun } from '../../runner/store/read-run.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { fakeHandlersPath, readJournal, tempRun } from '../helpers/fake-sweep.ts';

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
