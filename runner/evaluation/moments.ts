/**
 * Small moment and error helpers shared by the suites (row-major batches).
 */

/** Mean vector and tr Cov of `count` rows of `x` ([count, dim]), covariance with divisor count - 1. */
export function traceCovariance(x: ArrayLike<number>, count: number, dim: number): number {
  if (count < 2) return NaN;
  let total = 0;
  for (let j = 0; j < dim; j++) {
    let s = 0;
    for (let i = 0; i < count; i++) s += x[i * dim + j]!;
    const m = s / count;
    let v = 0;
    for (let i = 0; i < count; i++) v += (x[i * dim + j]! - m) ** 2;
    total += v / (count - 1);
  }
  return total;
}

/** Sample covariance [dim, dim] and mean [dim] of `count` rows (divisor count - 1). */
export function sampleCovariance(
  x: ArrayLike<number>,
  count: number,
  dim: number,
): { mean: Float64Array; cov: Float64Array } {
  const mean = new Float64Array(dim);
  for (let i = 0; i < count; i++)
    for (let j = 0; j < dim; j++) mean[j] = mean[j]! + x[i * dim + j]!;
  for (let j = 0; j < dim; j++) mean[j] = mean[j]! / count;
  const cov = new Float64Array(dim * dim);
  for (let i = 0; i < count; i++) {
    for (let a = 0; a < dim; a++) {
      const za = x[i * dim + a]! - mean[a]!;
      for (let b = 0; b <= a; b++)
        cov[a * dim + b] = cov[a * dim + b]! + za * (x[i * dim + b]! - mean[b]!);
    }
  }
  for (let a = 0; a < dim; a++) {
    for (let b = 0; b <= a; b++) {
      const v = cov[a * dim + b]! / (count - 1);
      cov[a * dim + b] = v;
      cov[b * dim + a] = v;
    }
  }
  return { mean, cov };
}

/** Squared Euclidean error of each row: [count]. */
export function rowSquaredErrors(
  predicted: ArrayLike<number>,
  truth: ArrayLike<number>,
  count: number,
  dim: number,
): Float64Array {
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    let s = 0;
    for (let j = 0; j < dim; j++) s += (predicted[i * dim + j]! - truth[i * dim + j]!) ** 2;
    out[i] = s;
  }
  return out;
}

/** Mean of squared row errors divided by `spread` (NMSE, MATH.md §4); NaN for no rows. */
export function normalisedError(
  predicted: ArrayLike<number>,
  truth: ArrayLike<number>,
  count: number,
  dim: number,
  spread: number,
): number {
  if (count === 0) return NaN;
  const errors = rowSquaredErrors(predicted, truth, count, dim);
  let s = 0;
  for (const e of errors) s += e;
  return s / count / spread;
}

/** Pools every row of every episode into one [total, dim] array. */
export function poolRows(
  parts: readonly { data: ArrayLike<number>; rows: number }[],
  dim: number,
): {
  data: Float64Array;
  rows: number;
} {
  const rows = parts.reduce((s, p) => s + p.rows, 0);
  const data = new Float64Array(rows * dim);
  let offset = 0;
  for (const p of parts) {
    for (let i = 0; i < p.rows * dim; i++) data[offset + i] = p.data[i]!;
    offset += p.rows * dim;
  }
  return { data, rows };
}
