/**
 * The few small dense-matrix routines the generators need (row-major Float64Array, n ≤ ~64).
 * Kept beside the generators rather than in numeric/ because only they use them.
 */
import type { Rng } from '../numeric/random.ts';

/** C = A B for A [n, k] and B [k, m]; returns [n, m]. */
export function multiply(
  a: Float64Array,
  b: Float64Array,
  n: number,
  k: number,
  m: number,
): Float64Array {
  const c = new Float64Array(n * m);
  for (let i = 0; i < n; i++) {
    for (let p = 0; p < k; p++) {
      const aip = a[i * k + p]!;
      if (aip === 0) continue;
      for (let j = 0; j < m; j++) c[i * m + j]! += aip * b[p * m + j]!;
    }
  }
  return c;
}

/** Aᵀ for A [n, m]; returns [m, n]. */
export function transpose(a: Float64Array, n: number, m: number): Float64Array {
  const t = new Float64Array(n * m);
  for (let i = 0; i < n; i++) for (let j = 0; j < m; j++) t[j * n + i] = a[i * m + j]!;
  return t;
}

/** Lower Cholesky factor L with A = L Lᵀ of a symmetric positive-definite [n, n] matrix. */
export function cholesky(a: Float64Array, n: number): Float64Array {
  const l = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = a[i * n + j]!;
      for (let p = 0; p < j; p++) sum -= l[i * n + p]! * l[j * n + p]!;
      if (i === j) {
        if (sum <= 0)
          throw new RangeError(`matrix [${n}, ${n}] is not positive definite (pivot ${i}: ${sum})`);
        l[i * n + i] = Math.sqrt(sum);
      } else {
        l[i * n + j] = sum / l[j * n + j]!;
      }
    }
  }
  return l;
}

/** y = L z for lower-triangular L [n, n] and a fresh standard-normal z: a N(0, L Lᵀ) draw. */
export function sampleCorrelated(l: Float64Array, n: number, rng: Rng): Float64Array {
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) z[i] = rng.normal();
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let p = 0; p <= i; p++) s += l[i * n + p]! * z[p]!;
    y[i] = s;
  }
  return y;
}

/** A random orthogonal [n, n] matrix: Gram–Schmidt on Gaussian columns (common practice). */
export function randomOrthogonal(n: number, rng: Rng): Float64Array {
  const cols: Float64Array[] = [];
  while (cols.length < n) {
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = rng.normal();
    for (const u of cols) {
      let dot = 0;
      for (let i = 0; i < n; i++) dot += u[i]! * v[i]!;
      for (let i = 0; i < n; i++) v[i]! -= dot * u[i]!;
    }
    const norm = Math.hypot(...v);
    if (norm < 1e-8) continue; // a degenerate draw; draw again
    for (let i = 0; i < n; i++) v[i]! /= norm;
    cols.push(v);
  }
  const o = new Float64Array(n * n);
  cols.forEach((u, j) => u.forEach((x, i) => (o[i * n + j] = x)));
  return o;
}

/**
 * Solves the discrete Lyapunov equation P = F P Fᵀ + Q for a stable F [n, n] by the doubling
 * (Smith) iteration P ← P + A P Aᵀ, A ← A² (Smith, 1968, "Matrix equation XA + BX = C",
 * SIAM J. Appl. Math. 16(1)): after k rounds P = Σ_{j<2^k} F^j Q F^{jᵀ}.
 */
export function solveDiscreteLyapunov(f: Float64Array, q: Float64Array, n: number): Float64Array {
  const p = Float64Array.from(q);
  let a: Float64Array = Float64Array.from(f);
  for (let round = 0; round < 64; round++) {
    const apa = multiply(multiply(a, p, n, n, n), transpose(a, n, n), n, n, n);
    let change = 0;
    let size = 0;
    for (let i = 0; i < n * n; i++) {
      change = Math.max(change, Math.abs(apa[i]!));
      size = Math.max(size, Math.abs(p[i]!));
      p[i]! += apa[i]!;
    }
    if (change <= 1e-15 * size) break;
    a = multiply(a, a, n, n, n);
  }
  // Symmetrise away rounding so Cholesky sees an exactly symmetric matrix.
  const sym = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) sym[i * n + j] = 0.5 * (p[i * n + j]! + p[j * n + i]!);
  return sym;
}
