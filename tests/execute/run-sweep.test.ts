import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readRun } from '../../runner/store/read-run.ts';
import { fakePlan } from '../fixtures/execute/fake-plan.ts';
import { readJournal, runFakeSweep, tempRun } from '../fixtures/execute/fake-sweep.ts';

describe('runSweep with fake handlers', () => {
  it('runs every job once in workers, evaluations after their train job, then resumes without rerunning', async () => {
    const { dir, journal } = tempRun();
    const jobs = fakePlan(3);
    const first = await runFakeSweep(dir, journal, jobs);
    expect(first.summary).toMatchObject({ total: 6, stored: 0, done: 6, failed: 0, unfinished: 0 });
    const { results, problems } = await readRun(dir);
    expect(problems.filter((p) => p.code !== 'store-missing-plan')).toEqual([]);
    expect(results.map((r) => r.id).sort()).toEqual(jobs.map((j) => j.id).sort());
    // Each evaluation starts only after its train job finished.
    const order = first.events.flatMap((e) =>
      e.type === 'started' || e.type === 'finished' ? [`${e.type}:${e.spec.id}`] : [],
    );
    for (const job of jobs) {
      if (job.kind !== 'evaluate') continue;
      expect(order.indexOf(`started:${job.id}`)).toBeGreaterThan(
        order.indexOf(`finished:${job.trainId}`),
      );
    }
    const train = results.find((r) => r.kind === 'train');
    expect(train?.artifacts).toEqual(['artifacts/weights.txt']);
    expect(train?.provenance.backend).toBe('fake (test handler)');
    expect(train?.provenance.peakRssBytes).toBeGreaterThan(0);
    expect(existsSync(join(dir, 'jobs', train?.id ?? '', 'log.txt'))).toBe(true);

    const second = await runFakeSweep(dir, journal, jobs);
    expect(second.summary).toMatchObject({ total: 6, stored: 6, done: 0 });
    expect([...readJournal(journal).values()]).toEqual(Array(6).fill(1));
    // No lock or temporary file left behind.
    for (const id of readdirSync(join(dir, 'jobs'))) {
      expect(readdirSync(join(dir, 'jobs', id)).filter((f) => f.startsWith('.'))).toEqual([]);
    }
  });
});
