/** Builds the fixture run once per test file in a fresh temporary directory. */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { writeFixtureRun, type FixtureOptions } from '../fixtures/results/build-run.ts';

/** Writes a fixture run into a new temporary directory; `cleanup` removes it. */
export function makeFixtureRun(options: FixtureOptions = {}): { dir: string; cleanup: () => void } {
  const dir = mkdtempSync(join(tmpdir(), 'midpath-report-'));
  writeFixtureRun(dir, options);
  return { dir, cleanup: () => rmSync(dir, { recursive: true, force: true }) };
}
