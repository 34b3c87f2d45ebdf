/** `midpath prune`: removes exactly the job directories the current plan does not list. */
import { existsSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { readRun } from '../../runner/store/read-run.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { shrunkPlanRunForTest } from '../report/fixture-run.ts';

describe('midpath prune', () => {
  it('lists the leftovers without touching them, then removes exactly them with --delete', async () => {
    const { dir, planned, dropped } = shrunkPlanRunForTest();
    expect(dropped.length).toBeGreaterThan(0);
    const listed = bufferIo(dir);
    expect(await main(['prune', dir], listed)).toBe(0);
    for (const id of dropped) expect(listed.stdout.join('')).toContain(id);
    expect(listed.stdout.join('')).toContain(`${dropped.length} job directories`);
    expect(readdirSync(join(dir, 'jobs'))).toHaveLength(planned.length + dropped.length);

    const plannedOnDisk = readdirSync(join(dir, 'jobs')).filter((id) => planned.includes(id));
    expect(plannedOnDisk.length).toBeGreaterThan(0);
    const removed = bufferIo(dir);
    expect(await main(['prune', dir, '--delete'], removed)).toBe(0);
    expect(readdirSync(join(dir, 'jobs')).sort()).toEqual(plannedOnDisk.sort());
    for (const id of dropped) expect(existsSync(join(dir, 'jobs', id))).toBe(false);
    const { results } = await readRun(dir);
    expect(results.every((r) => planned.includes(r.id))).toBe(true);
  });

  it('keeps a leftover that a live runner holds locked', async () => {
    const { dir, dropped } = shrunkPlanRunForTest();
    const held = dropped[0]!;
    const owner = { pid: process.pid, hostname: hostname(), runId: 'other', createdAt: '' };
    writeFileSync(join(dir, 'jobs', held, '.lock'), JSON.stringify(owner));
    const io = bufferIo(dir);
    expect(await main(['prune', dir, '--delete'], io)).toBe(0);
    expect(io.stdout.join('')).toContain(`Kept 1 that another runner holds: ${held}`);
    expect(existsSync(join(dir, 'jobs', held, 'result.json'))).toBe(true);
  });

  it('refuses a directory without plan.json, removing nothing', async () => {
    const { dir } = shrunkPlanRunForTest();
    rmSync(join(dir, 'plan.json'));
    const before = readdirSync(join(dir, 'jobs')).length;
    const io = bufferIo(dir);
    expect(await main(['prune', dir, '--delete'], io)).toBe(2);
    expect(io.stderr.join('')).toContain('store-missing-plan');
    expect(readdirSync(join(dir, 'jobs'))).toHaveLength(before);
  });
});
