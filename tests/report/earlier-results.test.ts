/**
 * Results of jobs the current plan no longer lists (the experiment changed since they ran)
 * stay on disk but are left out of the report, `table` and `compare`, so a mean never mixes
 * seeds run under two versions of an experiment.
 */
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { loadRun } from '../../runner/report/load-run.ts';
import type { PlanFile } from '../../runner/store/result.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { makeFixtureRun } from './fixture-run.ts';

let cleanup = (): void => undefined;
afterEach(() => cleanup());

/** A fixture run whose plan.json is rewritten to list only the jobs of seeds 0 and 1. */
function runWithShrunkPlan(): { dir: string; dropped: number } {
  const fixture = makeFixtureRun({ experiment: 'greenhouse', seeds: [0, 1, 2] });
  cleanup = fixture.cleanup;
  const path = join(fixture.dir, 'plan.json');
  const plan = JSON.parse(readFileSync(path, 'utf8')) as PlanFile;
  const kept = plan.jobs.filter((job) => job.seed !== 2);
  writeFileSync(path, JSON.stringify({ ...plan, jobs: kept }));
  return { dir: fixture.dir, dropped: plan.jobs.length - kept.length };
}

describe('results of an earlier plan', () => {
  it('are left out of the aggregation, counted, and every summary rests on the planned seeds only', async () => {
    const { dir, dropped } = runWithShrunkPlan();
    const run = await loadRun(dir);
    expect(dropped).toBeGreaterThan(0);
    expect(run.earlierResults).toBe(dropped);
    expect(run.results.some((r) => r.spec.seed === 2)).toBe(false);
    for (const summary of run.summaries) expect(summary.seeds).not.toContain(2);
  });

  it('are all shown when there is no plan.json to tell', async () => {
    const { dir } = runWithShrunkPlan();
    rmSync(join(dir, 'plan.json'));
    const run = await loadRun(dir);
    expect(run.earlierResults).toBe(0);
    expect(run.results.some((r) => r.spec.seed === 2)).toBe(true);
  });

  it('are named in a note by table, compare, status and the HTML report', async () => {
    const { dir, dropped } = runWithShrunkPlan();
    const table = bufferIo(dir);
    expect(await main(['table', dir, '--format', 'csv'], table)).toBe(0);
    expect(table.stderr.join('')).toContain(
      `note: ${dir}: ${dropped} results of jobs that plan.json no longer lists`,
    );
    const compare = bufferIo(dir);
    await main(['compare', dir, dir], compare);
    expect(compare.stderr.join('')).toContain(`${dropped} results of jobs that plan.json`);
    const status = bufferIo(dir);
    await main(['status', dir], status);
    expect(status.stdout.join('')).toContain(
      `${dropped} result(s) of jobs that plan.json no longer lists`,
    );
    const report = bufferIo(dir);
    expect(await main(['report', dir], report)).toBe(0);
    const html = readFileSync(join(dir, 'report.html'), 'utf8');
    expect(html).toContain(`${dropped} result(s) of jobs that the current plan no longer lists`);
  });
});
