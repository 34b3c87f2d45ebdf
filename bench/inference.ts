/**
 * Throughput of the closed-form inference stage, printed as a table with ratios against
 * references in the same run: bridge queries/s (batched, one-by-one, dense (Td)×(Td)
 * reference, and numpy when `python3 -c 'import numpy'` works), forecast queries/s, exact
 * kNN decoding on a 100,000 × 64 bank, and the Float64Array kernels against ml-matrix.
 *
 *   npx tsx bench/inference.ts           full run (about a minute on one core)
 *   npx tsx bench/inference.ts --quick   smoke run with small sizes
 */
import { spawnSync } from 'node:child_process';
import { cpus, loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { CholeskyDecomposition, Matrix, inverse } from 'ml-matrix';
import {
  criticTransition,
  forecast,
  forecastBatch,
  knnDecode,
  prepareBridge,
  solveBridge,
  type TransitionModel,
} from '../runner/inference/index.ts';
import { solveBridgeDense } from '../runner/inference/dense-bridge.ts';
import { cholesky, inverseSpd, multiplyTransB } from '../runner/numeric/linalg/index.ts';
import type { Mat } from '../runner/numeric/matrix.ts';
import { createRng } from '../runner/numeric/random.ts';

const quick = process.argv.includes('--quick');
const rounds = quick ? 2 : 5;
const roundSeconds = quick ? 0.03 : 0.2;
const warmUpSeconds = 0.3;
const rows: string[][] = [];

/**
 * CPU seconds per call of `fn`: the best of several rounds, each running `fn` until
 * `roundSeconds` of CPU time have passed. CPU time, not wall-clock: on a shared machine the
 * wall clock mostly measures the neighbours, and every path timed here (ours, and numpy's
 * pinned to one thread) runs on one thread. The best round is the usual estimator when
 * the noise only ever adds time (common practice; numpy's timeit advises the same).
 */
function timePerCall(fn: () => unknown): number {
  let best = Infinity;
  // Round 0 is a warm-up for the JIT and is not counted.
  for (let round = 0; round <= rounds; round++) {
    let calls = 0;
    let elapsed = 0;
    const t0 = process.cpuUsage();
    const budget = round === 0 ? warmUpSeconds : roundSeconds;
    while (elapsed < budget || calls < 2) {
      fn();
      calls++;
      const used = process.cpuUsage(t0);
      elapsed = (used.user + used.system) / 1e6;
    }
    if (round > 0) best = Math.min(best, elapsed / calls);
  }
  return best;
}

const fmt = (x: number): string =>
  x >= 100 ? x.toFixed(0) : x >= 1 ? x.toFixed(1) : x.toPrecision(2);
const row = (what: string, rate: number, unit: string, ratio: string): void => {
  rows.push([what, fmt(rate), unit, ratio]);
};

function randomMatrix(rows_: number, cols: number, seed: number, scale: number): Mat {
  const rng = createRng(seed);
  return {
    rows: rows_,
    cols,
    data: Float64Array.from({ length: rows_ * cols }, () => scale * rng.normal()),
  };
}

interface BridgeCase {
  model: TransitionModel;
  T: number;
  starts: Float64Array; // [queries, d]
  goals: Float64Array; // [queries, d]
  queries: number;
  label: string;
}

function benchBridge(): void {
  const d = 32;
  const T = 16;
  const queries = quick ? 64 : 1000;
  const c = 4;
  // A critic matrix near the stationarity condition A Aᵀ ≈ (1 + 1/c) I (MATH.md §2).
  const model = criticTransition(randomMatrix(d, d, 1, Math.sqrt((1 + 1 / c) / d)), c);
  const starts = randomMatrix(queries, d, 2, 1).data;
  const goals = randomMatrix(queries, d, 3, 1).data;
  const bc: BridgeCase = { model, T, starts, goals, queries, label: `bridge d=${d} T=${T}` };

  const batched =
    queries / timePerCall(() => prepareBridge(model, T).solve(starts, goals, queries));
  row(
    `${bc.label}: batched, factor once + ${queries} queries`,
    batched,
    'queries/s',
    '1 (reference)',
  );
  const solver = prepareBridge(model, T);
  const solveOnly = queries / timePerCall(() => solver.solve(starts, goals, queries));
  row(
    `${bc.label}: batched, solve only (factor reused)`,
    solveOnly,
    'queries/s',
    ratio(solveOnly, batched),
  );
  benchOneByOne(bc, batched);
  const dense = queries / timePerCall(() => solveBridgeDense(model, starts, goals, queries, T));
  row(
    `${bc.label}: dense (Td)×(Td) Cholesky, stacked RHS`,
    dense,
    'queries/s',
    ratio(dense, batched),
  );
  benchNumpy(bc, batched);
}

/** Queries answered one call each: with a fresh factorisation, and on a prepared solver. */
function benchOneByOne(bc: BridgeCase, batched: number): void {
  const { model, T, starts, goals, label } = bc;
  const d = model.dim;
  const few = Math.min(bc.queries, quick ? 8 : 40);
  const start = (q: number): Float64Array => starts.subarray(q * d, (q + 1) * d);
  const goal = (q: number): Float64Array => goals.subarray(q * d, (q + 1) * d);
  const fresh =
    few /
    timePerCall(() => {
      for (let q = 0; q < few; q++) solveBridge(model, start(q), goal(q), 1, T);
    });
  row(
    `${label}: one-by-one solveBridge (factor per query)`,
    fresh,
    'queries/s',
    ratio(fresh, batched),
  );
  const solver = prepareBridge(model, T);
  const prepared =
    few /
    timePerCall(() => {
      for (let q = 0; q < few; q++) solver.solve(start(q), goal(q), 1);
    });
  row(
    `${label}: one-by-one solve on a prepared solver`,
    prepared,
    'queries/s',
    ratio(prepared, batched),
  );
}

function ratio(rate: number, reference: number): string {
  return `${(rate / reference).toPrecision(3)}×`;
}

/** The same batch through bench/peers/bridge_numpy.py, when python3 has numpy. */
function benchNumpy(bc: BridgeCase, ours: number): void {
  const { model, T, starts, goals, queries, label } = bc;
  const probe = spawnSync('python3', ['-c', 'import numpy'], { encoding: 'utf8' });
  if (probe.status !== 0) {
    rows.push([
      `${label}: numpy`,
      '—',
      'skipped',
      'python3 has no numpy (apt-get install python3-numpy)',
    ]);
    return;
  }
  const post = prepareBridge(model, T).solve(starts, goals, queries);
  const job = {
    d: model.dim,
    T,
    queries,
    F: Array.from(model.F.data),
    Q: Array.from(model.Q.data),
    starts: Array.from(starts),
    goals: Array.from(goals),
    means: Array.from(post.means),
    covariances: post.covariances.flatMap((m) => Array.from(m.data)),
    repeats: rounds,
  };
  const script = fileURLToPath(new URL('./peers/bridge_numpy.py', import.meta.url));
  // One BLAS thread, like ours; the script reports its own CPU time (time.process_time).
  const oneThread = { OPENBLAS_NUM_THREADS: '1', OMP_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
  const run = spawnSync('python3', [script], {
    input: JSON.stringify(job),
    encoding: 'utf8',
    maxBuffer: 1 << 26,
    env: { ...process.env, ...oneThread },
  });
  if (run.status !== 0) {
    rows.push([`${label}: numpy`, '—', 'failed', run.stderr.trim().split('\n').pop() ?? '']);
    return;
  }
  const out = JSON.parse(run.stdout) as {
    seconds: number;
    maxMeanDiff: number;
    maxCovDiff: number;
    numpy: string;
  };
  const rate = queries / out.seconds;
  const note = `${ratio(rate, ours)} (ours ${ratio(ours, rate)} numpy)`;
  row(`${label}: numpy ${out.numpy} dense solve, stacked RHS, 1 thread`, rate, 'queries/s', note);
  const agreement = `max |Δmean| ${out.maxMeanDiff.toExponential(1)}, max |Δcov| ${out.maxCovDiff.toExponential(1)}`;
  rows.push(['  agreement with numpy', '', '', agreement]);
}

function benchForecast(): void {
  const d = 32;
  const n = 8;
  const count = quick ? 200 : 10_000;
  const model = criticTransition(randomMatrix(d, d, 4, Math.sqrt(1.25 / d)), 4);
  const starts = randomMatrix(count, d, 5, 1).data;
  const batch = timePerCall(() => forecastBatch(model, starts, count, n));
  row(
    `forecast d=${d} n=${n}: batched (${count} starts)`,
    count / batch,
    'queries/s',
    '1 (reference)',
  );
  const few = quick ? 10 : 100;
  const single = timePerCall(() => {
    for (let q = 0; q < few; q++) forecast(model, starts.subarray(q * d, (q + 1) * d), n);
  });
  row(
    `forecast d=${d} n=${n}: one-by-one`,
    few / single,
    'queries/s',
    ratio(few / single, count / batch),
  );
}

function benchKnn(): void {
  const bankCount = 100_000;
  const dim = 64;
  const queryCount = quick ? 16 : 256;
  const k = 5;
  const rng = createRng(6);
  const bank = Float32Array.from({ length: bankCount * dim }, () => rng.normal());
  const queries = Float64Array.from({ length: queryCount * dim }, () => rng.normal());
  const seconds = timePerCall(() => knnDecode(bank, bankCount, queries, queryCount, dim, k));
  row(
    `kNN decode, bank ${bankCount}×${dim} (Float32), k=${k}`,
    queryCount / seconds,
    'queries/s',
    `${fmt((queryCount * bankCount) / seconds / 1e6)} M distances/s`,
  );
}

function benchKernels(): void {
  const n = 64;
  const b = randomMatrix(n, n, 7, 1);
  const spd = multiplyTransB(b, b);
  for (let i = 0; i < n; i++) spd.data[i * n + i] = spd.data[i * n + i]! + n;
  const ml = new Matrix(
    Array.from({ length: n }, (_, i) => Array.from(spd.data.subarray(i * n, (i + 1) * n))),
  );
  const ours = timePerCall(() => cholesky(spd));
  const theirs = timePerCall(() => new CholeskyDecomposition(ml).lowerTriangularMatrix);
  row(
    `Cholesky ${n}×${n}: Float64Array kernel`,
    1 / ours,
    'factorisations/s',
    `${ratio(theirs, ours)} faster than ml-matrix`,
  );
  const oursInv = timePerCall(() => inverseSpd(spd));
  const theirsInv = timePerCall(() => inverse(ml));
  row(
    `SPD inverse ${n}×${n}: Cholesky kernel`,
    1 / oursInv,
    'inverses/s',
    `${ratio(theirsInv, oursInv)} faster than ml-matrix`,
  );
}

function printTable(): void {
  const header = ['measurement', 'rate', 'unit', 'ratio / note'];
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (r: string[]): string =>
    r.map((cell, i) => (i === 1 ? cell.padStart(widths[i]!) : cell.padEnd(widths[i]!))).join('  ');
  console.log(line(header));
  console.log(widths.map((w) => '-'.repeat(w)).join('  '));
  for (const r of rows) console.log(line(r));
}

console.log(
  `Midpath inference bench${quick ? ' (--quick)' : ''}: node ${process.version}, one thread; ` +
    `rates from CPU time (load average ${loadavg()[0]!.toFixed(1)} on ${cpus().length} cores)`,
);
benchBridge();
benchForecast();
benchKnn();
benchKernels();
printTable();
