/**
 * Runner benchmark, printed as a table with each figure beside its reference:
 *  1. parallel efficiency — throughput of 2 workers over 1 on a sweep of equal CPU-bound
 *     jobs (fake handlers spinning for a fixed time; target ≥ 1.8×, ideal 2×);
 *  2. worker reuse — instant jobs with a fresh process each against reused workers;
 *  3. runner overhead on a 10,000-job plan, jobs themselves excluded: expanding the plan,
 *     the resume scan of a finished run (runSweep with every result kept), reading the run,
 *     writing results (atomic, fsync) with their index rows, and rebuilding the index
 *     (target well under 1 s for expand, resume scan and index rebuild).
 * Needs at least 2 idle cores for part 1 to mean anything; the table prints the load.
 *
 *   npx tsx bench/runner.ts           full run (about a minute on an idle machine)
 *   npx tsx bench/runner.ts --quick   1,000 jobs and shorter spins
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadExperiment } from '../runner/config/load-experiment.ts';
import { runSweep } from '../runner/execute/run-sweep.ts';
import { expandPlan } from '../runner/plan/expand-plan.ts';
import type { JobSpec } from '../runner/plan/job-spec.ts';
import { readRun } from '../runner/store/read-run.ts';
import { rebuildIndex } from '../runner/store/run-index.ts';
import { RunLedger } from '../runner/store/run-ledger.ts';
import { fakeTrainSpec } from '../tests/fixtures/execute/fake-plan.ts';

const quick = process.argv.includes('--quick');
const JOBS = quick ? 1000 : 10_000;
const SPIN_MS = quick ? 1500 : 4000;
const SPIN_JOBS = quick ? 4 : 8;
const REUSE_JOBS = quick ? 20 : 40;
const handlers = fileURLToPath(
  new URL('../tests/fixtures/execute/fake-handlers.ts', import.meta.url),
);
const rows: string[][] = [];
const root = mkdtempSync(join(tmpdir(), 'midpath-bench-'));

function seconds(start: number): number {
  return (performance.now() - start) / 1000;
}

/** CPU seconds of this process since `start` (process.cpuUsage); robust on a shared machine. */
function cpuSeconds(start: NodeJS.CpuUsage): number {
  const used = process.cpuUsage(start);
  return (used.user + used.system) / 1e6;
}

/** Runs `step`, returning wall and CPU seconds. */
async function measure(step: () => unknown): Promise<{ wall: number; cpu: number }> {
  const cpu = process.cpuUsage();
  const start = performance.now();
  await step();
  return { wall: seconds(start), cpu: cpuSeconds(cpu) };
}

async function timeSweep(
  jobs: JobSpec[],
  workers: number,
  dir: string,
  jobsPerWorker = 20,
): Promise<number> {
  const ledger = new RunLedger(dir, { runId: `bench-${workers}` });
  const start = performance.now();
  await runSweep(jobs, {
    ledger,
    workers,
    cores: workers,
    fresh: true,
    retries: 0,
    jobsPerWorker,
    timeLimitMs: () => 600_000,
    env: { MIDPATH_HANDLERS_MODULE: handlers },
  });
  ledger.close();
  return seconds(start);
}

async function benchParallel(): Promise<void> {
  const jobs = Array.from({ length: SPIN_JOBS }, (_, i) => fakeTrainSpec(i, 'spin', SPIN_MS));
  const one = await timeSweep(jobs, 1, join(root, 'w1'));
  const two = await timeSweep(jobs, 2, join(root, 'w2'));
  const speedup = one / two;
  rows.push([
    `${SPIN_JOBS} jobs × ${SPIN_MS / 1000} s CPU, 1 worker`,
    `${one.toFixed(2)} s`,
    `${(SPIN_JOBS / one).toFixed(3)} jobs/s`,
    'reference',
  ]);
  rows.push([
    `same, 2 workers`,
    `${two.toFixed(2)} s`,
    `${(SPIN_JOBS / two).toFixed(3)} jobs/s`,
    `${speedup.toFixed(2)}× (target ≥ 1.80×, ideal 2.00×)`,
  ]);
}

/** Instant jobs on 2 workers: a fresh process per job against reused workers (the default). */
async function benchReuse(): Promise<void> {
  const jobs = Array.from({ length: REUSE_JOBS }, (_, i) => fakeTrainSpec(1000 + i));
  const fresh = await timeSweep(jobs, 2, join(root, 'fresh'), 1);
  const reused = await timeSweep(jobs, 2, join(root, 'reused'), 20);
  rows.push([
    `${REUSE_JOBS} instant jobs, 2 workers, fresh process each`,
    `${fresh.toFixed(2)} s`,
    `${(REUSE_JOBS / fresh).toFixed(2)} jobs/s`,
    'reference',
  ]);
  rows.push([
    `same, workers reused (run.jobsPerWorker 20)`,
    `${reused.toFixed(2)} s`,
    `${(REUSE_JOBS / reused).toFixed(2)} jobs/s`,
    `${(fresh / reused).toFixed(2)}× faster; ${((1000 * (fresh - reused) * 2) / REUSE_JOBS).toFixed(0)} ms saved per job`,
  ]);
}

/** Loads the overhead experiment: `count` / 2 seeds of one method, a train and an evaluation each. */
async function loadOverheadExperiment(count: number): Promise<() => JobSpec[]> {
  const file = join(root, 'overhead.yaml');
  writeFileSync(file, `name: overhead\nmethods: [contrastive]\nsweep:\n  seeds: ${count / 2}\n`);
  const loaded = await loadExperiment(file);
  if (!loaded.ok) throw new Error(JSON.stringify(loaded.errors));
  const { config, baseDir } = loaded;
  return () => expandPlan(config, baseDir);
}

function overheadRow(
  step: string,
  t: { wall: number; cpu: number },
  count: number,
  target?: number,
): void {
  const verdict =
    target === undefined ? '' : `${(t.wall / target).toFixed(2)} of the ${target} s target`;
  const perJob = `${((t.wall / count) * 1e6).toFixed(1)} µs/job`;
  rows.push([step, `${t.wall.toFixed(3)} s (CPU ${t.cpu.toFixed(3)} s)`, perJob, verdict]);
}

async function benchOverhead(): Promise<void> {
  let jobs: JobSpec[] = [];
  const expand = await loadOverheadExperiment(JOBS);
  overheadRow(`expand ${JOBS} jobs`, await measure(() => (jobs = expand())), JOBS, 1);
  const dir = join(root, 'overhead');
  const ledger = new RunLedger(dir, { runId: 'bench-overhead' });
  const provenance = {
    midpathVersion: '0',
    gitCommit: null,
    nodeVersion: process.version,
    backend: 'bench',
    seed: 0,
    startedAt: new Date().toISOString(),
    wallSeconds: 1,
    peakRssBytes: 0,
    hostname: 'bench',
  };
  const writes = await measure(async () => {
    for (const spec of jobs) {
      const metrics = [
        {
          suite: 'forecast',
          metric: 'forecast_nmse',
          level: 1,
          source: 'fitted',
          value: spec.seed,
        },
      ];
      await ledger.record({ spec, status: 'done', metrics, info: {}, provenance });
    }
  });
  overheadRow('write result.json (fsync) + index row', writes, jobs.length);
  const scan = await measure(() =>
    runSweep(jobs, { ledger, fresh: false, retries: 0, timeLimitMs: () => 1 }),
  );
  overheadRow('resume scan (all kept, nothing to run)', scan, jobs.length, 1);
  ledger.close();
  overheadRow('readRun (plan + every result.json)', await measure(() => readRun(dir)), jobs.length);
  overheadRow(
    'rebuild index.sqlite from result files',
    await measure(() => rebuildIndex(dir)),
    jobs.length,
    1,
  );
}

function printTable(): void {
  const header = ['step', 'time', 'rate', 'against reference'];
  const all = [header, ...rows];
  const widths = header.map((_, c) => Math.max(...all.map((r) => (r[c] ?? '').length)));
  for (const row of all)
    console.log(
      row
        .map((cell, c) => cell.padEnd(widths[c] ?? 0))
        .join('  ')
        .trimEnd(),
    );
}

console.log(
  `runner benchmark: ${availableParallelism()} cores, load average ${loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}${quick ? ' (quick)' : ''}`,
);
try {
  await benchParallel();
  await benchReuse();
  await benchOverhead();
  printTable();
} finally {
  rmSync(root, { recursive: true, force: true });
}
