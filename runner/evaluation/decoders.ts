/**
 * Decoders from representation space to the true state (MATH.md §4): a ridge probe and
 * nearest-neighbour lookup in a bank of encoded training observations. Both are fitted on
 * training episodes only.
 */
import { fitRidgeProbe, knnDecode } from '../inference/index.ts';
import type { EncodedEpisode, StateDecoders } from './context.ts';
import { poolRows, traceCovariance } from './moments.ts';
import { taskRng } from './tasks.ts';

/** Most bank rows kept for nearest-neighbour decoding (a seeded subsample beyond this). */
export const BANK_LIMIT = 4000;

/** Decoders when every episode knows its state and the state has a spread; else undefined. */
export function buildStateDecoders(
  train: readonly EncodedEpisode[],
  test: readonly EncodedEpisode[],
  dim: number,
  stateDim: number,
  options: { ridge: number; seed: number },
): StateDecoders | undefined {
  const all = [...train, ...test];
  if (stateDim < 1 || train.length === 0 || all.some((e) => e.state === undefined))
    return undefined;
  const codes = poolRows(
    train.map((e) => ({ data: e.codes, rows: e.steps })),
    dim,
  );
  const states = poolRows(
    train.map((e) => ({ data: e.state!, rows: e.steps })),
    stateDim,
  );
  const testStates = poolRows(
    test.map((e) => ({ data: e.state!, rows: e.steps })),
    stateDim,
  );
  const spread = traceCovariance(testStates.data, testStates.rows, stateDim);
  if (!(spread > 0) || codes.rows < 2) return undefined;
  // λ scales with the number of rows so the penalty's weight does not shrink with more data.
  const probe = fitRidgeProbe(
    codes.data,
    states.data,
    codes.rows,
    dim,
    stateDim,
    options.ridge * codes.rows,
  );
  const bank = subsampleRows(codes.data, states.data, codes.rows, dim, stateDim, options.seed);
  return {
    stateDim,
    spread,
    probe: (x, count) => probe.predict(x, count),
    nearest: (x, count) => {
      const index = knnDecode(bank.codes, bank.rows, x, count, dim, 1);
      const out = new Float64Array(count * stateDim);
      for (let i = 0; i < count; i++)
        out.set(
          bank.states.subarray(index[i]! * stateDim, (index[i]! + 1) * stateDim),
          i * stateDim,
        );
      return out;
    },
  };
}

function subsampleRows(
  codes: Float64Array,
  states: Float64Array,
  rows: number,
  dim: number,
  stateDim: number,
  seed: number,
): { codes: Float64Array; states: Float64Array; rows: number } {
  if (rows <= BANK_LIMIT) return { codes, states, rows };
  // Partial Fisher–Yates shuffle (Knuth, TAOCP vol. 2, Algorithm P) for a uniform subset.
  const rng = taskRng(seed, 'decoder-bank');
  const index = Int32Array.from({ length: rows }, (_, i) => i);
  for (let i = 0; i < BANK_LIMIT; i++) {
    const j = i + rng.int(rows - i);
    [index[i], index[j]] = [index[j]!, index[i]!];
  }
  const outCodes = new Float64Array(BANK_LIMIT * dim);
  const outStates = new Float64Array(BANK_LIMIT * stateDim);
  for (let i = 0; i < BANK_LIMIT; i++) {
    const r = index[i]!;
    outCodes.set(codes.subarray(r * dim, (r + 1) * dim), i * dim);
    outStates.set(states.subarray(r * stateDim, (r + 1) * stateDim), i * stateDim);
  }
  return { codes: outCodes, states: outStates, rows: BANK_LIMIT };
}
