/** Builds the fixture run once per test file in a fresh temporary directory. */
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { onTestFinished } from 'vitest';
import type { PlanFile } from '../../runner/store/result.ts';
import { writeFixtureRun, type FixtureOptions } from '../fixtures/results/build-run.ts';

/** Writes a fixture run into a new temporary directory; `cleanup` removes it. */
export function makeFixtureRun(options: FixtureOptions = {}): { dir: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'midpath-report-'));
  writeFixtureRun(dir, options);
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}

/**
 * A fixture run (seeds 0, 1, 2) whose plan.json is then rewritten to list only the jobs of
 * seeds 0 and 1, as after an edit of the experiment: the seed-2 job directories are left
 * over. `planned` are the ids the plan lists, `dropped` the job directories it does not.
 */
export function makeRunWithShrunkPlan(): {
  dir: string;
  planned: string[];
  dropped: string[];
  cleanup: () => void;
} {
  const fixture = makeFixtureRun({ experiment: 'greenhouse', seeds: [0, 1, 2] });
  const path = join(fixture.dir, 'plan.json');
  const plan = JSON.parse(readFileSync(path, 'utf8')) as PlanFile;
  const kept = plan.jobs.filter((job) => job.seed !== 2);
  writeFileSync(path, JSON.stringify({ ...plan, jobs: kept }));
  const planned = kept.map((job) => job.id);
  const onDisk = readdirSync(join(fixture.dir, 'jobs'));
  return { ...fixture, planned, dropped: onDisk.filter((id) => !planned.includes(id)) };
}

/** `makeRunWithShrunkPlan` inside a test, removed when that test finishes. */
export function shrunkPlanRunForTest(): { dir: string; planned: string[]; dropped: string[] } {
  const run = makeRunWithShrunkPlan();
  onTestFinished(run.cleanup);
  return run;
}
