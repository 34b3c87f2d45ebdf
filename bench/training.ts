/**
 * Training-step benchmark. Prints steps/s of the reference step — MLP 64→256→256→16 (ReLU),
 * batch 256, distance critic with learned A, symmetric InfoNCE, penalty regulariser, Adam,
 * clipping — inside the real training loop (runTrainingLoop: batch sampling included), on
 * every TF.js backend that loads here, with TF.js's default gradients and with the
 * explicit-transpose custom gradients; the native engine when it is registered; achieved
 * GFLOP/s against the wasm matmul peak; and, side by side, the same step in PyTorch on CPU
 * (bench/peers/torch_step.py) as a ratio. Each figure is the best of `ROUNDS` rounds, which
 * damps interference from other processes on a shared machine.
 *
 *   npx tsx bench/training.ts            # ROUNDS=3 by default
 */
import { spawnSync } from 'node:child_process';
import * as path from 'node:path';
import * as tf from '@tensorflow/tfjs';
import type { DataConfig, TrainConfig } from '../runner/config/types.ts';
import { loadDataset } from '../runner/data/load-dataset.ts';
import { listBackends, selectBackend } from '../runner/encoders/backend.ts';
import { initDenseParams } from '../runner/encoders/dense-layout.ts';
import { setFastMatMul } from '../runner/encoders/fast-matmul.ts';
import { createRng } from '../runner/numeric/random.ts';
import {
  createEngine,
  getEngineFactory,
  type EngineName,
  type EngineOptions,
} from '../runner/training/engine.ts';
import { loadEngines } from '../runner/training/engines.ts';
import { PairSampler } from '../runner/training/pair-sampler.ts';
import { runTrainingLoop } from '../runner/training/train-loop.ts';
import { BATCH, DIM, OBS, WIDTHS, referenceOptions, referenceTrain } from './reference-step.ts';

const ROUNDS = Number(process.env.ROUNDS ?? 3);

/** Multiply–adds of one step: two encoder passes forward, twice that backward (dX and dW). */
function stepFlops(): number {
  const sizes = [OBS, ...WIDTHS, DIM];
  let macs = 0;
  for (let i = 0; i + 1 < sizes.length; i++) macs += sizes[i]! * sizes[i + 1]!;
  const encoderForward = 2 * BATCH * macs; // x and y sides
  const critic = BATCH * DIM * DIM + BATCH * BATCH * DIM; // u = ψx Aᵀ, u ψyᵀ
  return 2 * 3 * (encoderForward + critic); // forward + two backward products, 2 flops per MAC
}

const train: TrainConfig = referenceTrain('tfjs');

async function measureLoop(
  engineName: EngineName,
  samplers: { train: PairSampler; val: PairSampler },
  steps: number,
): Promise<number> {
  const options: EngineOptions = referenceOptions(train);

  const engine = await createEngine(engineName, options);
  engine.init(initDenseParams(options.encoder, OBS, DIM, 'distance', createRng(0).fork('init')));
  const hooks = { log: () => undefined, signal: new AbortController().signal };
  await runTrainingLoop(engine, { ...train, steps: 3 }, samplers, createRng(1), hooks); // warm-up
  let best = 0;
  for (let r = 0; r < ROUNDS; r++) {
    const result = await runTrainingLoop(
      engine,
      { ...train, steps, logEvery: steps },
      samplers,
      createRng(2 + r),
      hooks,
    );
    best = Math.max(best, result.stepsPerSecond);
  }
  engine.dispose();
  return best;
}

/** GFLOP/s of a 256³ product on the current backend, untransposed and with transposeA. */
function matmulPeak(): { plain: number; transposed: number } {
  const a = tf.randomNormal<tf.Rank.R2>([256, 256]);
  const time = (ta: boolean, reps: number): number => {
    tf.matMul(a, a, ta, false).dispose();
    let best = Infinity;
    for (let r = 0; r < ROUNDS; r++) {
      const t0 = performance.now();
      for (let i = 0; i < reps; i++) {
        const c = tf.matMul(a, a, ta, false);
        c.dataSync();
        c.dispose();
      }
      best = Math.min(best, (performance.now() - t0) / reps);
    }
    return (2 * 256 ** 3) / (best * 1e6);
  };
  const out = { plain: time(false, 40), transposed: time(true, 5) };
  a.dispose();
  return out;
}

function runTorch(steps: number): Record<string, unknown> | string {
  const script = path.join(import.meta.dirname, 'peers', 'torch_step.py');
  const env = {
    ...process.env,
    OPENBLAS_CORETYPE: 'SkylakeX',
    OPENBLAS_NUM_THREADS: '1',
    OMP_NUM_THREADS: '1',
    MKL_NUM_THREADS: '1',
  };
  for (const python of ['python3', '/usr/bin/python3']) {
    if (spawnSync(python, ['-c', 'import torch'], { env }).status !== 0) continue;
    let best: Record<string, unknown> | undefined;
    for (let r = 0; r < ROUNDS; r++) {
      const run = spawnSync(python, [script, String(steps)], { env, encoding: 'utf8' });
      if (run.status !== 0) return `torch peer failed: ${run.stderr.slice(-300)}`;
      const parsed = JSON.parse(run.stdout.trim().split('\n').pop()!) as Record<string, unknown>;
      if (best === undefined || Number(parsed.stepsPerSecond) > Number(best.stepsPerSecond))
        best = parsed;
    }
    return { ...best!, python };
  }
  return 'no python3 with torch (apt-get install python3-torch libopenblas0-pthread)';
}

async function main(): Promise<void> {
  const data: DataConfig = {
    source: 'linear-gaussian',
    seed: 0,
    episodes: 40,
    steps: 64,
    obsDim: OBS,
    noise: 0.05,
    stateDim: 8,
    map: 'smooth',
    layout: 'open-hall',
    image: 16,
    dt: 0,
    split: { train: 0.8, val: 0.1, test: 0.1 },
    standardise: true,
  };
  const dataset = await loadDataset(data, '.');
  const samplers = {
    train: new PairSampler(dataset.train, 0.9),
    val: new PairSampler(dataset.val, 0.9),
  };
  await loadEngines();
  const { rows, peak } = await measureEngines(samplers);
  printTable(rows, peak, runTorch(200));
}

interface Row {
  engine: string;
  grads: string;
  sps: number;
}

/** Every TF.js backend with default and custom gradients, then the native engine if built. */
async function measureEngines(samplers: {
  train: PairSampler;
  val: PairSampler;
}): Promise<{ rows: Row[]; peak: { plain: number; transposed: number } }> {
  const rows: Row[] = [];
  let peak = { plain: 0, transposed: 0 };
  for (const backend of await listBackends()) {
    await selectBackend(backend);
    if (backend === 'wasm') peak = matmulPeak();
    for (const custom of [false, true]) {
      setFastMatMul(custom);
      const steps = backend === 'cpu' ? 4 : custom ? 40 : 12;
      rows.push({
        engine: `tfjs ${backend}`,
        grads: custom ? 'custom (explicit transpose)' : 'TF.js default',
        sps: await measureLoop('tfjs', samplers, steps),
      });
    }
  }
  setFastMatMul(true);
  if (getEngineFactory('native') !== undefined) {
    rows.push({
      engine: 'native',
      grads: 'hand-written',
      sps: await measureLoop('native', samplers, 200),
    });
  }
  return { rows, peak };
}

function printTable(
  rows: Row[],
  peak: { plain: number; transposed: number },
  torch: Record<string, unknown> | string,
): void {
  const flops = stepFlops();
  const torchSps = typeof torch === 'string' ? undefined : Number(torch.stepsPerSecond);
  console.log(
    `\nReference step: MLP ${OBS}→${WIDTHS.join('→')}→${DIM}, batch ${BATCH}, learned A, symmetric InfoNCE, Adam; ${(flops / 1e6).toFixed(0)} MFLOP/step; best of ${ROUNDS}`,
  );
  console.log(
    `wasm matmul 256³: ${peak.plain.toFixed(1)} GFLOP/s untransposed, ${peak.transposed.toFixed(1)} GFLOP/s with transposeA\n`,
  );
  console.log('| engine | gradients | steps/s | GFLOP/s | % wasm peak | × PyTorch |');
  console.log('|---|---|---:|---:|---:|---:|');
  for (const r of rows) {
    const gf = (r.sps * flops) / 1e9;
    const ratio = torchSps === undefined ? 'n/a' : (r.sps / torchSps).toFixed(3);
    const ofPeak = peak.plain > 0 ? ((100 * gf) / peak.plain).toFixed(0) : 'n/a';
    console.log(
      `| ${r.engine} | ${r.grads} | ${r.sps.toFixed(2)} | ${gf.toFixed(2)} | ${ofPeak} | ${ratio} |`,
    );
  }
  if (typeof torch === 'string') {
    console.log(`\nPyTorch: ${torch}`);
    return;
  }
  const tgf = ((torchSps ?? 0) * flops) / 1e9;
  console.log(
    `| PyTorch ${String(torch.torch)} CPU | autograd | ${(torchSps ?? 0).toFixed(2)} | ${tgf.toFixed(2)} | | 1.000 |`,
  );
  console.log(
    `\nPyTorch peer: ${String(torch.python)}, ${String(torch.threads)} thread, OPENBLAS_CORETYPE=${String(torch.coretype)}, matmul 512³ ${Number(torch.matmulGflops).toFixed(1)} GFLOP/s`,
  );
  console.log(
    `BLAS loaded: ${(torch.blas as string[]).join(', ') || 'none found in /proc/self/maps'}`,
  );
  console.log(
    'Next limit of the TF.js step: per-op dispatch (~300 kernels/step) and the wasm matmul itself (one thread, no fused backward); see docs/training.md.',
  );
}

await main();
