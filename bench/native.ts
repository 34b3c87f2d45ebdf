/**
 * Native engine benchmark. The reference step — MLP 64→256→256→16 (ReLU), batch 256, distance
 * critic with learned A, symmetric InfoNCE, penalty regulariser, clipping, Adam — timed side
 * by side in one run for: the native engine on every sgemm variant the CPU runs, the TF.js
 * engine (wasm backend), and PyTorch on one thread (bench/peers/torch_step.py) when a Python
 * with torch is found. Rounds alternate the order of the contenders (forward, then reversed)
 * and each figure is the best round, which damps interference on a shared machine. Beside
 * each native rate: the achieved GFLOP/s of the whole step and the same kernel's own sgemm
 * rate on a 512×256·256×256 product (the step's largest shape).
 *
 *   npx tsx bench/native.ts              # ROUNDS=3, STEPS=200 (native/torch), TF.js 20
 *   MIDPATH_PYTHON=/usr/bin/python3 npx tsx bench/native.ts
 *   npx tsx bench/native.ts --demo       # the demo's training jobs on 2 workers, tfjs vs native
 *
 * PyTorch runs with OMP_NUM_THREADS=OPENBLAS_NUM_THREADS=1; the table names the BLAS library
 * it actually mapped and the OpenBLAS core type.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadExperiment } from '../runner/config/load-experiment.ts';
import { runSweep } from '../runner/execute/run-sweep.ts';
import { expandPlan } from '../runner/plan/expand-plan.ts';
import type { JobSpec } from '../runner/plan/job-spec.ts';
import { readRun } from '../runner/store/read-run.ts';
import { RunLedger } from '../runner/store/run-ledger.ts';
import type { EngineOptions, StepEngine } from '../runner/training/engine.ts';
import { selectBackend } from '../runner/encoders/backend.ts';
import { initDenseParams } from '../runner/encoders/dense-layout.ts';
import { createRng } from '../runner/numeric/random.ts';
import { createNativeEngine } from '../runner/training/native-engine.ts';
import { loadNativeAddon, type NativeAddon } from '../runner/training/native-loader.ts';
import { createTfjsEngine } from '../runner/training/tfjs-engine.ts';
import { BATCH, DIM, OBS, WIDTHS, referenceOptions, referenceTrain } from './reference-step.ts';

const ROUNDS = Number(process.env.ROUNDS ?? 3);
const STEPS = Number(process.env.STEPS ?? 200);
const TFJS_STEPS = Number(process.env.TFJS_STEPS ?? 20);
const options: EngineOptions = referenceOptions(referenceTrain('auto', 100));

/** Floating-point operations of one step (2 per multiply–add; products only). */
function stepFlops(): number {
  const sizes = [OBS, ...WIDTHS, DIM];
  const rows = 2 * BATCH; // x and y through the shared encoder
  let forward = 0;
  let inputGrads = 0;
  for (let l = 0; l + 1 < sizes.length; l++) {
    forward += 2 * rows * sizes[l]! * sizes[l + 1]!;
    if (l > 0) inputGrads += 2 * rows * sizes[l]! * sizes[l + 1]!;
  }
  const weightGrads = forward;
  // critic: u = ψx Aᵀ, L = u ψyᵀ; backward: G ψy, Gᵀ u, du A, duᵀ ψx
  const critic = 2 * BATCH * DIM * DIM * 3 + 2 * BATCH * BATCH * DIM * 3;
  return forward + weightGrads + inputGrads + critic;
}

interface Contender {
  name: string;
  run(): Promise<number>; // steps per second of one round
}

function makeBatches(count: number): { x: Float32Array; y: Float32Array }[] {
  const rng = createRng(7);
  return Array.from({ length: count }, () => ({
    x: Float32Array.from({ length: BATCH * OBS }, () => rng.normal()),
    y: Float32Array.from({ length: BATCH * OBS }, () => rng.normal()),
  }));
}

const batches = makeBatches(8);

async function timeEngine(engine: StepEngine, steps: number): Promise<number> {
  engine.init(initDenseParams(options.encoder, OBS, DIM, 'distance', createRng(0)));
  for (let i = 0; i < 3; i++) engine.step(batches[i % 8]!.x, batches[i % 8]!.y, BATCH);
  const t0 = performance.now();
  for (let i = 0; i < steps; i++) engine.step(batches[i % 8]!.x, batches[i % 8]!.y, BATCH);
  const rate = (steps * 1000) / (performance.now() - t0);
  await Promise.resolve();
  return rate;
}

/** GFLOP/s of the kernel on [512, 256] × [256, 256] (the hidden layer's forward product). */
function sgemmRate(addon: NativeAddon, kernel: Parameters<NativeAddon['sgemm']>[0]): number {
  const m = 512,
    n = 256,
    k = 256;
  const rng = createRng(3);
  const a = Float32Array.from({ length: m * k }, () => rng.normal());
  const b = Float32Array.from({ length: k * n }, () => rng.normal());
  const c = new Float32Array(m * n);
  let best = 0;
  for (let r = 0; r < 3; r++) {
    const reps = 40;
    const t0 = performance.now();
    for (let i = 0; i < reps; i++)
      addon.sgemm(kernel, false, false, m, n, k, 1, a, k, b, n, 0, c, n);
    best = Math.max(best, (2 * m * n * k * reps) / ((performance.now() - t0) / 1000) / 1e9);
  }
  return best;
}

interface TorchResult {
  stepsPerSecond: number;
  torch: string;
  blas: string[];
  coretype: string;
  matmulGflops: number;
}

function findTorchPython(): string | undefined {
  const candidates = [process.env.MIDPATH_PYTHON, '/usr/bin/python3', 'python3'].filter(
    (c): c is string => c !== undefined,
  );
  return candidates.find(
    (py) => spawnSync(py, ['-c', 'import torch'], { encoding: 'utf8' }).status === 0,
  );
}

/**
 * OpenBLAS core type: SkylakeX (its AVX-512 sgemm) when the CPU has AVX-512, so PyTorch gets
 * the best BLAS path this machine offers; BENCH_OPENBLAS_CORETYPE overrides. (A machine-wide
 * OPENBLAS_CORETYPE is deliberately not inherited: it may pin an older path.)
 */
function openblasCore(kernels: string[]): string | undefined {
  return (
    process.env.BENCH_OPENBLAS_CORETYPE ?? (kernels.includes('avx512') ? 'SkylakeX' : undefined)
  );
}

function runTorch(python: string, coretype: string | undefined): TorchResult | undefined {
  const script = fileURLToPath(new URL('./peers/torch_step.py', import.meta.url));
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    OMP_NUM_THREADS: '1',
    OPENBLAS_NUM_THREADS: '1',
  };
  delete env.OPENBLAS_CORETYPE;
  if (coretype !== undefined) env.OPENBLAS_CORETYPE = coretype;
  const run = spawnSync(python, [script, String(STEPS), String(BATCH)], { encoding: 'utf8', env });
  if (run.status !== 0) return undefined;
  return JSON.parse(run.stdout.trim().split('\n').pop()!) as TorchResult;
}

async function main(): Promise<void> {
  const status = loadNativeAddon();
  const contenders: Contender[] = [];
  const peaks = new Map<string, number>(); // best sgemm GFLOP/s per kernel
  const kernels = status.ok ? status.addon.kernels().supported : [];
  for (const kernel of kernels) {
    contenders.push({
      name: `native ${kernel}`,
      run: async () => {
        const engine = await createNativeEngine(options, kernel);
        const rate = await timeEngine(engine, STEPS);
        engine.dispose();
        // The kernel's own rate, measured in the same round so both see the same load.
        const addon = (status as { addon: NativeAddon }).addon;
        peaks.set(kernel, Math.max(peaks.get(kernel) ?? 0, sgemmRate(addon, kernel)));
        return rate;
      },
    });
  }
  const backend = await selectBackend('wasm');
  contenders.push({
    name: `tfjs ${backend.name}${backend.simd ? '-simd' : ''}`,
    run: async () => {
      const engine = await createTfjsEngine(options);
      const rate = await timeEngine(engine, TFJS_STEPS);
      engine.dispose();
      return rate;
    },
  });
  const python = findTorchPython();
  let torchInfo: TorchResult | undefined;
  if (python !== undefined) {
    contenders.push({
      name: 'pytorch 1 thread',
      run: () => {
        torchInfo = runTorch(python, openblasCore(kernels)) ?? torchInfo;
        return Promise.resolve(torchInfo?.stepsPerSecond ?? Number.NaN);
      },
    });
  }
  const best = new Map<string, number>();
  for (let r = 0; r < ROUNDS; r++) {
    const order = r % 2 === 0 ? contenders : [...contenders].reverse();
    for (const c of order) best.set(c.name, Math.max(best.get(c.name) ?? 0, await c.run()));
  }
  printTable(contenders, best, peaks, torchInfo);
  if (!status.ok) console.log(`native: ${status.why}`);
  if (python === undefined) console.log('pytorch: no Python with torch found (set MIDPATH_PYTHON)');
}

function printTable(
  contenders: Contender[],
  best: Map<string, number>,
  peaks: Map<string, number>,
  torch: TorchResult | undefined,
): void {
  const flops = stepFlops();
  const torchRate = best.get('pytorch 1 thread'); // the best round, like every other figure
  console.log(
    `reference step: MLP ${OBS}→${WIDTHS.join('→')}→${DIM}, batch ${BATCH}, learned A, Adam; ${(flops / 1e6).toFixed(1)} MFLOP/step; best of ${ROUNDS} alternating rounds`,
  );
  console.log(
    '| engine | steps/s | ms/step | × pytorch | step GFLOP/s | sgemm GFLOP/s (512×256×256) | step / sgemm |',
  );
  console.log('|---|---:|---:|---:|---:|---:|---:|');
  for (const c of contenders) {
    const rate = best.get(c.name) ?? Number.NaN;
    const gflops = (rate * flops) / 1e9;
    const kernel = c.name.startsWith('native ') ? c.name.slice(7) : undefined;
    const peak =
      kernel !== undefined
        ? (peaks.get(kernel) ?? Number.NaN)
        : torch !== undefined && c.name.startsWith('pytorch')
          ? torch.matmulGflops
          : Number.NaN;
    const ratio = torchRate !== undefined ? (rate / torchRate).toFixed(2) : 'n/a';
    const fmt = (v: number, d: number): string => (Number.isFinite(v) ? v.toFixed(d) : 'n/a');
    console.log(
      `| ${c.name} | ${fmt(rate, 1)} | ${fmt(1000 / rate, 2)} | ${ratio} | ${fmt(gflops, 1)} | ${fmt(peak, 1)} | ${Number.isFinite(peak) ? `${((100 * gflops) / peak).toFixed(0)} %` : 'n/a'} |`,
    );
  }
  if (torch !== undefined) {
    console.log(
      `pytorch ${torch.torch}, BLAS: ${torch.blas.join(', ') || 'built-in'}, OPENBLAS_CORETYPE=${torch.coretype || 'unset'}; its sgemm column is a 512³ product`,
    );
  }
}

interface DemoRun {
  label: string;
  engine: 'tfjs' | 'native';
  jobsPerWorker: number;
}

interface DemoTotals {
  /** Wall seconds of the whole sweep of training jobs, worker start-ups included. */
  sweepSeconds: number;
  /** Σ wall seconds of the contrastive train jobs (each from request to result). */
  contrastiveSeconds: number;
  /** Σ seconds inside their training loops (steps / steps per second). */
  loopSeconds: number;
  jobs: number;
  engines: string[];
}

const DEMO_ROUNDS = Number(process.env.ROUNDS ?? 2);

/** The demo's training jobs with `train.engine` set, as `midpath run --set` would. */
async function demoTrainJobs(engine: 'tfjs' | 'native'): Promise<JobSpec[]> {
  const demo = fileURLToPath(new URL('../configs/demo.yaml', import.meta.url));
  const loaded = await loadExperiment(demo, { overrides: [`train.engine=${engine}`] });
  if (!loaded.ok) throw new Error(JSON.stringify(loaded.errors));
  return expandPlan(loaded.config, loaded.baseDir).filter((job) => job.kind === 'train');
}

/** Runs the demo's training jobs on 2 workers (like `midpath run --workers 2`); sums the results. */
async function runDemo(run: DemoRun): Promise<DemoTotals> {
  const jobs = await demoTrainJobs(run.engine);
  const out = mkdtempSync(join(tmpdir(), `midpath-demo-${run.engine}-`));
  const ledger = new RunLedger(out, { runId: `bench-${run.label}` });
  const t0 = performance.now();
  const summary = await runSweep(jobs, {
    ledger,
    workers: 2,
    cores: 2,
    fresh: true,
    retries: 0,
    jobsPerWorker: run.jobsPerWorker,
    timeLimitMs: () => 3_600_000,
  });
  const sweepSeconds = (performance.now() - t0) / 1000;
  ledger.close();
  if (summary.done !== jobs.length) {
    throw new Error(`demo training with ${run.label}: ${JSON.stringify(summary)} (see ${out})`);
  }
  const totals: DemoTotals = {
    sweepSeconds,
    contrastiveSeconds: 0,
    loopSeconds: 0,
    jobs: 0,
    engines: [],
  };
  for (const result of (await readRun(out)).results) {
    if (result.spec.kind !== 'train' || result.spec.method.name !== 'contrastive') continue;
    totals.contrastiveSeconds += result.provenance.wallSeconds;
    const { steps, stepsPerSecond, engine, kernel } = result.info;
    if (typeof steps === 'number' && typeof stepsPerSecond === 'number' && stepsPerSecond > 0) {
      totals.loopSeconds += steps / stepsPerSecond;
    }
    totals.jobs += 1;
    const named = (value: unknown): string => (typeof value === 'string' ? value : '');
    const label = `${named(engine) || '?'} ${named(kernel)}`.trim();
    if (!totals.engines.includes(label)) totals.engines.push(label);
  }
  rmSync(out, { recursive: true, force: true });
  return totals;
}

/** Median wall seconds of starting node with the tsx loader on an empty script (a worker's floor). */
function measureNodeStart(times = 5): number {
  const seconds: number[] = [];
  for (let i = 0; i < times; i++) {
    const t0 = performance.now();
    spawnSync(process.execPath, ['--import', 'tsx', '-e', '0'], { encoding: 'utf8' });
    seconds.push((performance.now() - t0) / 1000);
  }
  seconds.sort((a, b) => a - b);
  return seconds[Math.floor(seconds.length / 2)]!;
}

/**
 * The demo's training jobs (contrastive on both engines plus the pca/sfa/raw baselines) as
 * one sweep on 2 workers: TF.js alone against native, both with the default worker reuse,
 * and native with a fresh process per job (run.jobsPerWorker = 1) to show what reuse buys.
 * Rounds alternate the order; each figure is the best round.
 */
async function benchDemo(): Promise<void> {
  const runs: DemoRun[] = [
    { label: 'tfjs', engine: 'tfjs', jobsPerWorker: 20 },
    { label: 'native', engine: 'native', jobsPerWorker: 20 },
    { label: 'native, fresh process per job', engine: 'native', jobsPerWorker: 1 },
  ];
  const best = new Map<string, DemoTotals>();
  for (let round = 0; round < DEMO_ROUNDS; round++) {
    const order = round % 2 === 0 ? runs : [...runs].reverse();
    for (const run of order) {
      const totals = await runDemo(run);
      const seen = best.get(run.label);
      if (!seen || totals.sweepSeconds < seen.sweepSeconds) best.set(run.label, totals);
    }
  }
  const start = measureNodeStart();
  const tfjs = best.get('tfjs')!;
  console.log(
    `demo training jobs (configs/demo.yaml, train jobs only), 2 workers, best of ${DEMO_ROUNDS} alternating rounds, load ${loadavg()[0]!.toFixed(1)}`,
  );
  console.log(
    '| engine | jobs per worker | sweep seconds | vs tfjs | contrastive jobs | Σ their seconds | Σ loop seconds | mean job outside loop |',
  );
  console.log('|---|---:|---:|---:|---:|---:|---:|---:|');
  for (const run of runs) {
    const t = best.get(run.label)!;
    const outside = (t.contrastiveSeconds - t.loopSeconds) / Math.max(1, t.jobs);
    console.log(
      `| ${run.label} (${t.engines.join(', ')}) | ${run.jobsPerWorker} | ${t.sweepSeconds.toFixed(1)} | ${(tfjs.sweepSeconds / t.sweepSeconds).toFixed(1)}× | ${t.jobs} | ${t.contrastiveSeconds.toFixed(1)} | ${t.loopSeconds.toFixed(1)} | ${outside.toFixed(2)} s |`,
    );
  }
  const native = best.get('native')!;
  console.log(
    `sweep of the demo's training jobs: native is ${(tfjs.sweepSeconds / native.sweepSeconds).toFixed(1)}× faster than TF.js alone (target ≥ 5×)`,
  );
  console.log(
    `node + tsx start-up on an empty script (what a fresh worker costs, median of 5): ${start.toFixed(2)} s`,
  );
}

if (process.argv.includes('--demo')) await benchDemo();
else await main();
