import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { writeFixtureRun } from '../fixtures/results/build-run.ts';
import { bufferIo } from '../helpers/cli-io.ts';

let root = '';
const dir = (name: string): string => join(root, name);
beforeAll(() => {
  root = mkdtempSync(join(tmpdir(), 'midpath-compare-'));
  writeFixtureRun(dir('base'));
  writeFixtureRun(dir('same'));
  // A deliberately worse encoder: every error of 'contrastive' 30 % larger.
  writeFixtureRun(dir('worse'), { contrastiveErrorFactor: 1.3 });
  // Seeded noise of ±1 %: well within the 5 % tolerance.
  writeFixtureRun(dir('noisy'), { jitter: 0.01, jitterSeed: 7 });
  writeFixtureRun(dir('other-seeds'), { seeds: [10, 11, 12] });
}, 60_000);
afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('midpath compare', () => {
  it('exits 0 for identical runs', async () => {
    const io = bufferIo();
    expect(await main(['compare', dir('base'), dir('same')], io)).toBe(0);
    expect(io.stdout.join('')).toContain('| regressed | 0 |');
  });

  it('exits 1 for a deliberately worse encoder and names the metric', async () => {
    const io = bufferIo();
    expect(await main(['compare', dir('base'), dir('worse')], io)).toBe(1);
    const text = io.stdout.join('');
    expect(text).toContain('### Regressions');
    expect(text).toMatch(/\| dim=4 \| contrastive \| forecast\\_nmse \| fitted \| 1 \|/);
  });

  it('exits 0 for noise within tolerance', async () => {
    const io = bufferIo();
    expect(await main(['compare', dir('base'), dir('noisy')], io)).toBe(0);
  });

  it('exits 0 for the worse encoder when the tolerance is wider than the change', async () => {
    const io = bufferIo();
    expect(await main(['compare', dir('base'), dir('worse'), '--tolerance', '50%'], io)).toBe(0);
  });

  it('prints JSON with --json, with Welch tests when the seeds differ', async () => {
    const io = bufferIo();
    const status = await main(['compare', dir('base'), dir('other-seeds'), '--json'], io);
    const parsed = JSON.parse(io.stdout.join('')) as {
      counts: { regressed: number };
      rows: { test: string }[];
    };
    const tests = new Set(parsed.rows.map((r) => r.test));
    expect(tests.has('welch')).toBe(true);
    expect(tests.has('paired')).toBe(false);
    expect(status).toBe(parsed.counts.regressed > 0 ? 1 : 0);
  });

  it('rejects a bad tolerance with exit 2 and code bad-tolerance', async () => {
    const io = bufferIo();
    expect(await main(['compare', dir('base'), dir('same'), '--tolerance', 'x'], io)).toBe(2);
    expect(io.stderr.join('')).toContain('(bad-tolerance)');
  });

  it('rejects a directory without results with exit 2 and code no-results', async () => {
    const io = bufferIo();
    expect(await main(['compare', dir('base'), dir('missing')], io)).toBe(2);
    expect(io.stderr.join('')).toContain('(no-results)');
  });
});
