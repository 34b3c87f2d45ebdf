/**
 * Results of jobs the current plan no longer lists (the experiment changed since they ran)
 * stay on disk but are left out of the report, `table` and `compare`, so a mean never mixes
 * seeds run under two versions of an experiment.
 */
import { readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { loadRun } from '../../runner/report/load-run.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { shrunkPlanRunForTest } from './fixture-run.ts';

describe('results of an earlier plan', () => {
  it('are left out of the aggregation, counted, and every summary rests on the planned seeds only', async () => {
    const { dir, dropped: droppedIds } = shrunkPlanRunForTest();
    const dropped = droppedIds.length;
    const run = await loadRun(dir);
    expect(dropped).toBeGreaterThan(0);
    expect(run.earlierResults).toBe(dropped);
    expect(run.results.some((r) => r.spec.seed === 2)).toBe(false);
    for (const summary of run.summaries) expect(summary.seeds).not.toContain(2);
  });

  it('are all shown when there is no plan.json to tell', async () => {
    const { dir } = shrunkPlanRunForTest();
    rmSync(join(dir, 'plan.json'));
    const run = await loadRun(dir);
    expect(run.earlierResults).toBe(0);
    expect(run.results.some((r) => r.spec.seed === 2)).toBe(true);
  });

  it('are named in a note by table, compare, status and the HTML report', async () => {
    const { dir, dropped: droppedIds } = shrunkPlanRunForTest();
    const dropped = droppedIds.length;
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
    expect(report.stderr.join('')).toContain(`${dropped} results of jobs that plan.json`);
    const html = readFileSync(join(dir, 'report.html'), 'utf8');
    expect(html).toContain(`${dropped} result(s) of jobs that the current plan no longer lists`);
  });
});
