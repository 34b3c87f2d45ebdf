/**
 * CONTRACT — the dense matrix every numerical module passes around: row-major Float64Array.
 * Kept deliberately tiny so hot loops index `data` directly; ml-matrix is used where its
 * general routines serve, converted at the boundary.
 */
export interface Mat {
  rows: number;
  cols: number;
  /** [rows, cols] row-major */
  data: Float64Array;
}

/** A rows×cols matrix of zeros. */
export function zeros(rows: number, cols: number): Mat {
  return { rows, cols, data: new Float64Array(rows * cols) };
}

/** The n×n identity scaled by `scale`. */
export function identity(n: number, scale = 1): Mat {
  const m = zeros(n, n);
  for (let i = 0; i < n; i++) m.data[i * n + i] = scale;
  return m;
}

/** Wraps an existing row-major array; throws with the shapes when the length disagrees. */
export function fromArray(rows: number, cols: number, data: ArrayLike<number>): Mat {
  if (data.length !== rows * cols) {
    throw new RangeError(`expected ${rows}×${cols} = ${rows * cols} values, got ${data.length}`);
  }
  return { rows, cols, data: Float64Array.from(data) };
}
