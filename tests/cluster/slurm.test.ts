/**
 * Integration test of the SLURM engine against a real one-node cluster on localhost
 * (tests/cluster/start-cluster.sh; CI starts it). Skipped when no cluster answers.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { loadExperiment } from '../../runner/config/load-experiment.ts';
import { expandPlan } from '../../runner/plan/expand-plan.ts';
import { readRun } from '../../runner/store/read-run.ts';
import type { RunStatus } from '../../runner/store/run-status.ts';
import { bufferIo } from '../helpers/cli-io.ts';
import { fakeHandlersPath, readJournal, tempRun } from '../fixtures/execute/fake-sweep.ts';

const experiment = fileURLToPath(new URL('../fixtures/execute/tiny-sweep.yaml', import.meta.url));
const clusterUp = (spawnSync('scontrol', ['ping'], { encoding: 'utf8' }).stdout ?? '').includes(
  'UP',
);

async function statusOf(dir: string): Promise<RunStatus> {
  const io = bufferIo();
  await main(['status', dir, '--json'], io);
  return JSON.parse(io.stdout.join('')) as RunStatus;
}

async function waitForSlurm(dir: string): Promise<RunStatus> {
  const end = Date.now() + 180_000;
  for (;;) {
    const status = await statusOf(dir);
    if (status.counts.running + status.counts.pending === 0) return status;
    if (Date.now() > end) throw new Error(`SLURM did not finish: ${JSON.stringify(status.counts)}`);
    await new Promise((wake) => setTimeout(wake, 1000));
  }
}

async function metricsOf(dir: string): Promise<Map<string, number[]>> {
  const { results } = await readRun(dir);
  return new Map(results.map((r) => [r.id, r.metrics.map((m) => m.value)]));
}

// CI sets MIDPATH_REQUIRE_CLUSTER=1 after starting the cluster: a cluster that did not come
// up must fail the run there, not skip silently.
describe.runIf(process.env.MIDPATH_REQUIRE_CLUSTER === '1')('SLURM cluster required by CI', () => {
  it('answers scontrol ping (started by tests/cluster/start-cluster.sh)', () => {
    expect(clusterUp).toBe(true);
  });
});

describe.skipIf(!clusterUp)('SLURM engine on a one-node cluster', () => {
  const saved = { ...process.env };
  afterAll(() => {
    process.env = saved;
  });

  it('runs the sweep as arrays, names a failure, resubmits only it, and matches the local engine', async () => {
    const local = tempRun();
    const slurm = tempRun();
    const failFile = join(slurm.dir, '..', 'fail.txt');
    const loaded = await loadExperiment(experiment);
    if (!loaded.ok) throw new Error('fixture does not load');
    const jobs = expandPlan(loaded.config, loaded.baseDir);
    const failing = jobs.find((j) => j.kind === 'evaluate');
    if (!failing) throw new Error('fixture has no evaluation');
    // Tasks inherit the submitting environment (sbatch --export=ALL is SLURM's default).
    Object.assign(process.env, {
      MIDPATH_FAKE_JOURNAL: slurm.journal,
      MIDPATH_FAKE_FAIL_FILE: failFile,
    });
    writeFileSync(failFile, failing.id);
    const env = { MIDPATH_HANDLERS_MODULE: fakeHandlersPath };

    const submit = bufferIo();
    submit.env = env;
    expect(await main(['run', experiment, '--engine', 'slurm', '--out', slurm.dir], submit)).toBe(
      0,
    );
    expect(submit.text()).toMatch(/train +3 jobs in 3 array tasks: SLURM job \d+/);
    const first = await waitForSlurm(slurm.dir);
    expect(first.counts).toMatchObject({ done: 5, failed: 1 });
    expect(first.failures).toEqual([
      expect.objectContaining({
        id: failing.id,
        reason: expect.stringContaining('the job threw') as unknown,
      }),
    ]);

    writeFileSync(failFile, '');
    const again = bufferIo();
    again.env = env;
    expect(await main(['run', experiment, '--engine', 'slurm', '--out', slurm.dir], again)).toBe(0);
    expect(again.text()).toContain('6 jobs: 5 kept');
    const record = JSON.parse(
      readFileSync(join(slurm.dir, 'slurm', 'submission-2.json'), 'utf8'),
    ) as {
      arrays: { kind: string; tasks: string[][] }[];
    };
    expect(record.arrays.map((a) => [a.kind, a.tasks.flat()])).toEqual([
      ['evaluate', [failing.id]],
    ]);
    expect((await waitForSlurm(slurm.dir)).counts).toMatchObject({ done: 6, failed: 0 });
    const attempts = readJournal(slurm.journal);
    expect(jobs.map((j) => attempts.get(j.id))).toEqual(
      jobs.map((j) => (j.id === failing.id ? 2 : 1)),
    );

    process.env.MIDPATH_FAKE_FAIL_FILE = '';
    const localIo = bufferIo();
    localIo.env = env;
    expect(await main(['run', experiment, '--out', local.dir, '--workers', '2'], localIo)).toBe(0);
    expect(await metricsOf(slurm.dir)).toEqual(await metricsOf(local.dir));
  }, 300_000);
});
