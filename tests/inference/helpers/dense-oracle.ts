/**
 * Independent oracle for the bridge and forecast tests: plain number[][] algebra in mathjs
 * (a general-purpose library that shares no code with runner/numeric/linalg).
 * Joint Gaussian of a linear-Gaussian chain and conditioning by Bishop, Pattern Recognition
 * and Machine Learning (2006), §2.3.1, eqs. 2.81–2.82.
 */
import * as math from 'mathjs';
import type { Mat } from '../../../runner/numeric/matrix.ts';
import { createRng } from '../../../runner/numeric/random.ts';

export type Dense = number[][];

export const mm = (a: Dense, b: Dense): Dense => math.multiply<number[]>(a, b);
export const tr = (a: Dense): Dense => math.transpose(a);
export const inv = (a: Dense): Dense => math.inv(a);
export const add = (a: Dense, b: Dense): Dense => math.add<Dense>(a, b);
export const sub = (a: Dense, b: Dense): Dense => math.subtract<Dense>(a, b);
export const eye = (n: number, s = 1): Dense =>
  Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? s : 0)));
export const toDense = (m: Mat): Dense =>
  Array.from({ length: m.rows }, (_, i) =>
    Array.from(m.data.subarray(i * m.cols, (i + 1) * m.cols)),
  );
export const col = (v: ArrayLike<number>): Dense => Array.from(v, (x) => [x]);
export const eigenvalues = (a: Dense): number[] => (math.eigs(a).values as number[]).slice();

/** Rows `rows` and columns `cols` of `a`. */
export function pick(a: Dense, rows: number[], cols: number[]): Dense {
  return rows.map((r) => cols.map((c) => a[r]![c]!));
}

/** Random d×d matrix with entries N(0, scale²), from the project's seeded generator. */
export function randomMat(d: number, seed: number, scale = 1): Mat {
  const rng = createRng(seed);
  return {
    rows: d,
    cols: d,
    data: Float64Array.from({ length: d * d }, () => scale * rng.normal()),
  };
}

/** Random vector [n] of N(0, 1) draws. */
export function randomVec(n: number, seed: number): Float64Array {
  const rng = createRng(seed);
  return Float64Array.from({ length: n }, () => rng.normal());
}

/**
 * Covariance of the stacked chain (ψ₀, ψ₁, …, ψ_{T+1}) with ψ₀ ~ N(0, P₀) and
 * ψ_{t+1} = F ψ_t + N(0, Q): Σ_{t+1} = F Σ_t Fᵀ + Q and Cov(ψ_t, ψ_s) = F^{t−s} Σ_s for t ≥ s
 * (Bishop eq. 2.115 applied step by step).
 */
export function chainJointCovariance(F: Dense, Q: Dense, P0: Dense, steps: number): Dense {
  const d = F.length;
  const marg: Dense[] = [P0];
  for (let t = 1; t <= steps; t++) marg.push(add(mm(mm(F, marg[t - 1]!), tr(F)), Q));
  const n = (steps + 1) * d;
  const joint: Dense = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let s = 0; s <= steps; s++) {
    let block = marg[s]!; // F^{t−s} Σ_s, starting at t = s
    for (let t = s; t <= steps; t++) {
      for (let i = 0; i < d; i++)
        for (let j = 0; j < d; j++) {
          joint[t * d + i]![s * d + j] = block[i]![j]!;
          joint[s * d + j]![t * d + i] = block[i]![j]!;
        }
      block = mm(F, block);
    }
  }
  return joint;
}

/**
 * Conditional of the zero-mean Gaussian N(0, Σ) on x_b (Bishop eqs. 2.81–2.82):
 * μ_{a|b} = Σ_ab Σ_bb⁻¹ x_b, Σ_{a|b} = Σ_aa − Σ_ab Σ_bb⁻¹ Σ_ba.
 */
export function conditionGaussian(
  joint: Dense,
  a: number[],
  b: number[],
  xb: number[],
): { mean: number[]; cov: Dense } {
  const sab = pick(joint, a, b);
  const gain = mm(sab, inv(pick(joint, b, b)));
  const mean = mm(gain, col(xb)).map((r) => r[0]!);
  const cov = sub(pick(joint, a, a), mm(gain, pick(joint, b, a)));
  return { mean, cov };
}

/** Largest absolute difference between two equally shaped arrays. */
export function maxDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) return Infinity;
  let e = 0;
  for (let i = 0; i < a.length; i++) e = Math.max(e, Math.abs(a[i]! - b[i]!));
  return e;
}
