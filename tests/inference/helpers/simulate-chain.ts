/**
 * Simulated linear-Gaussian chain ψ_{t+1} = F ψ_t + w, w ~ N(0, Q) (Bishop, PRML §13.3,
 * eq. 13.75), started from its stationary law by a burn-in, for recovery tests.
 */
import type { Mat } from '../../../runner/numeric/matrix.ts';
import { cholesky } from '../../../runner/numeric/linalg/index.ts';
import { createRng } from '../../../runner/numeric/random.ts';

/** Consecutive pairs (from, to), each [count, dim], with an offset `mean` added to every state. */
export function simulatePairs(
  F: Mat,
  Q: Mat,
  count: number,
  seed: number,
  mean?: Float64Array,
): { from: Float64Array; to: Float64Array } {
  const d = F.rows;
  const rng = createRng(seed);
  const l = cholesky(Q);
  let x: Float64Array = new Float64Array(d);
  const step = (): Float64Array => {
    const z = Float64Array.from({ length: d }, () => rng.normal());
    const next = new Float64Array(d);
    for (let i = 0; i < d; i++) {
      let s = 0;
      for (let j = 0; j < d; j++) s += F.data[i * d + j]! * x[j]! + l.data[i * d + j]! * z[j]!;
      next[i] = s;
    }
    return next;
  };
  for (let t = 0; t < 200; t++) x = step();
  const from = new Float64Array(count * d);
  const to = new Float64Array(count * d);
  for (let n = 0; n < count; n++) {
    const next = step();
    for (let i = 0; i < d; i++) {
      from[n * d + i] = x[i]! + (mean?.[i] ?? 0);
      to[n * d + i] = next[i]! + (mean?.[i] ?? 0);
    }
    x = next;
  }
  return { from, to };
}
