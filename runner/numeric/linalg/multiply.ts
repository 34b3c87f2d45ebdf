/**
 * Dense products on row-major matrices: A B, Aᵀ B and A Bᵀ. Every product is reduced to
 * one kernel, A Bᵀ in dot-product form over contiguous rows with 2×2 register blocking;
 * the other layouts transpose an operand first (O(n²) against the O(n³) product).
 */
import type { Mat } from '../matrix.ts';
import { NumericError } from './errors.ts';

function checkInner(op: string, a: number, b: number, sa: string, sb: string): void {
  if (a !== b) {
    throw new NumericError(
      'shape-mismatch',
      `${op}: expected matching inner dimensions, got ${sa} and ${sb}`,
    );
  }
}

const shape = (m: Mat): string => `${m.rows}×${m.cols}`;

/**
 * out[r, c] = Σ_k a[r, k] b[k, c] for raw arrays a [r, n], b [n, c]; `out` [r, c] is
 * overwritten. B is transposed once (n·c moves) so the product runs in dot-product form.
 */
export function multiplyInto(
  a: Float64Array,
  b: Float64Array,
  out: Float64Array,
  r: number,
  n: number,
  c: number,
): void {
  const bT = new Float64Array(n * c); // [c, n]
  for (let k = 0; k < n; k++) for (let j = 0; j < c; j++) bT[j * n + k] = b[k * c + j]!;
  multiplyTransBInto(a, bT, out, r, n, c);
}

/**
 * out[r, c] = Σ_k a[r, k] b[c, k] for a [r, n], b [c, n]; `out` is overwritten.
 * Register-blocked 4×2: eight dot products share each group of six loads (eight
 * accumulators fit the sixteen floating-point registers of x86-64 and arm64 with room
 * for the operands), instead of two loads per multiply-add.
 */
export function multiplyTransBInto(
  a: Float64Array,
  b: Float64Array,
  out: Float64Array,
  r: number,
  n: number,
  c: number,
): void {
  let i = 0;
  for (; i + 3 < r; i += 4) {
    const a0 = i * n;
    const a1 = a0 + n;
    const a2 = a1 + n;
    const a3 = a2 + n;
    let j = 0;
    for (; j + 1 < c; j += 2) {
      const b0 = j * n;
      const b1 = b0 + n;
      let s00 = 0;
      let s01 = 0;
      let s10 = 0;
      let s11 = 0;
      let s20 = 0;
      let s21 = 0;
      let s30 = 0;
      let s31 = 0;
      for (let k = 0; k < n; k++) {
        const y0 = b[b0 + k]!;
        const y1 = b[b1 + k]!;
        const x0 = a[a0 + k]!;
        const x1 = a[a1 + k]!;
        const x2 = a[a2 + k]!;
        const x3 = a[a3 + k]!;
        s00 += x0 * y0;
        s01 += x0 * y1;
        s10 += x1 * y0;
        s11 += x1 * y1;
        s20 += x2 * y0;
        s21 += x2 * y1;
        s30 += x3 * y0;
        s31 += x3 * y1;
      }
      const o = i * c + j;
      out[o] = s00;
      out[o + 1] = s01;
      out[o + c] = s10;
      out[o + c + 1] = s11;
      out[o + 2 * c] = s20;
      out[o + 2 * c + 1] = s21;
      out[o + 3 * c] = s30;
      out[o + 3 * c + 1] = s31;
    }
    for (; j < c; j++) {
      for (let u = 0; u < 4; u++) out[(i + u) * c + j] = dot(a, a0 + u * n, b, j * n, n);
    }
  }
  for (; i < r; i++) for (let j = 0; j < c; j++) out[i * c + j] = dot(a, i * n, b, j * n, n);
}

function dot(a: Float64Array, oa: number, b: Float64Array, ob: number, n: number): number {
  let s = 0;
  for (let k = 0; k < n; k++) s += a[oa + k]! * b[ob + k]!;
  return s;
}

/** A B. */
export function multiply(a: Mat, b: Mat): Mat {
  checkInner('multiply', a.cols, b.rows, shape(a), shape(b));
  const out = new Float64Array(a.rows * b.cols);
  multiplyInto(a.data, b.data, out, a.rows, a.cols, b.cols);
  return { rows: a.rows, cols: b.cols, data: out };
}

/** Aᵀ B (both operands transposed once, then the blocked dot-product kernel). */
export function multiplyTransA(a: Mat, b: Mat): Mat {
  checkInner('multiplyTransA', a.rows, b.rows, `(${shape(a)})ᵀ`, shape(b));
  const at = transpose(a);
  const bt = transpose(b);
  const out = new Float64Array(a.cols * b.cols);
  multiplyTransBInto(at.data, bt.data, out, a.cols, a.rows, b.cols);
  return { rows: a.cols, cols: b.cols, data: out };
}

/** A Bᵀ. */
export function multiplyTransB(a: Mat, b: Mat): Mat {
  checkInner('multiplyTransB', a.cols, b.cols, shape(a), `(${shape(b)})ᵀ`);
  const out = new Float64Array(a.rows * b.rows);
  multiplyTransBInto(a.data, b.data, out, a.rows, a.cols, b.rows);
  return { rows: a.rows, cols: b.rows, data: out };
}

/** Aᵀ. */
export function transpose(a: Mat): Mat {
  const out = new Float64Array(a.rows * a.cols);
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < a.cols; j++) out[j * a.rows + i] = a.data[i * a.cols + j]!;
  }
  return { rows: a.cols, cols: a.rows, data: out };
}

/** α A + β B (same shapes). */
export function addScaled(a: Mat, alpha: number, b: Mat, beta: number): Mat {
  if (a.rows !== b.rows || a.cols !== b.cols) {
    throw new NumericError(
      'shape-mismatch',
      `addScaled: expected equal shapes, got ${shape(a)} and ${shape(b)}`,
    );
  }
  const out = new Float64Array(a.data.length);
  for (let i = 0; i < out.length; i++) out[i] = alpha * a.data[i]! + beta * b.data[i]!;
  return { rows: a.rows, cols: a.cols, data: out };
}

/** (A + Aᵀ)/2 in place, to remove the rounding asymmetry of products that are symmetric in exact arithmetic. */
export function symmetrizeInPlace(a: Mat): Mat {
  const n = a.rows;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const v = 0.5 * (a.data[i * n + j]! + a.data[j * n + i]!);
      a.data[i * n + j] = v;
      a.data[j * n + i] = v;
    }
  }
  return a;
}
