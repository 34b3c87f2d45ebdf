/**
 * Reusing a worker process must not change any result: a real sweep (TF.js and native
 * training, PCA and SFA baselines, five evaluation suites) run with a fresh process
 * per job and with every job in one process gives identical metrics, bit for bit.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { readRun } from '../../runner/store/read-run.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { tempRun } from '../fixtures/execute/fake-sweep.ts';
import { nativeAddonForTests } from '../native/native-required.ts';

const experiment = fileURLToPath(new URL('../fixtures/execute/reuse-check.yaml', import.meta.url));

async function runWith(jobsPerWorker: number): Promise<Awaited<ReturnType<typeof readRun>>> {
  const { dir } = tempRun();
  const io = bufferIo(join(dir, '..'));
  const args = ['run', experiment, '--out', 'out', '--workers', '1'];
  const code = await main([...args, '--set', `run.jobsPerWorker=${jobsPerWorker}`], io);
  expect(code, io.text()).toBe(0);
  return readRun(dir);
}

describe('worker reuse on real jobs', () => {
  it('gives the same metrics with a fresh process per job as with one process for all', async () => {
    const fresh = await runWith(1);
    const shared = await runWith(1000);
    expect(fresh.results).toHaveLength(12);
    expect(new Set(fresh.results.map((r) => r.provenance.worker?.job))).toEqual(new Set([1]));
    // One process ran everything, in plan order: positions 1..12.
    const positions = shared.results.map((r) => r.provenance.worker?.job ?? 0);
    expect([...positions].sort((a, b) => a - b)).toEqual(
      Array.from({ length: 12 }, (_, i) => i + 1),
    );
    expect(new Set(shared.results.map((r) => r.provenance.worker?.pid)).size).toBe(1);
    const metricsOf = (run: typeof fresh): Map<string, unknown> =>
      new Map(run.results.map((r) => [r.id, r.metrics]));
    const a = metricsOf(fresh);
    const b = metricsOf(shared);
    expect([...b.keys()].sort()).toEqual([...a.keys()].sort());
    for (const [id, metrics] of a) expect(b.get(id), id).toEqual(metrics);
    expect(fresh.results.every((r) => r.status === 'done')).toBe(true);
    for (const r of fresh.results.filter((x) => x.kind === 'evaluate')) {
      expect(r.metrics.length, r.id).toBeGreaterThan(10);
    }
    // Both engines really ran (the auto rows use native where the addon is built).
    const engines = new Set(fresh.results.map((r) => r.info.engine));
    expect(engines.has('tfjs')).toBe(true);
    expect(engines.has('native')).toBe(nativeAddonForTests() !== undefined);
  }, 240_000);
});
