/**
 * Regularising a covariance estimate that is singular or badly conditioned: eigenvalues
 * below λ_max / maxCondition are raised to that floor (eigenvalue clipping, a standard
 * repair for noisy covariance estimates; common practice). The caller records the note.
 */
import type { Mat } from '../numeric/matrix.ts';
import { symmetricEigen } from '../numeric/linalg/eigen.ts';

/** Default largest condition number a transition noise covariance may keep. */
export const DEFAULT_MAX_CONDITION = 1e6;

/**
 * Returns `cov` unchanged with `note: null` when its condition number is ≤ maxCondition,
 * else the clipped matrix and a note such as "Q regularised: condition number 3e+9 → 1e+6".
 * `scale` sets the floor when the matrix is (numerically) zero.
 */
export function regulariseCovariance(
  cov: Mat,
  label: string,
  maxCondition: number,
  scale: number,
): { cov: Mat; note: string | null } {
  const n = cov.rows;
  const { values, vectors } = symmetricEigen(cov);
  const top = values[0] ?? 0;
  const bottom = values[n - 1] ?? 0;
  const floor = top > 0 ? top / maxCondition : Math.max(scale, Number.MIN_VALUE) * 1e-8;
  if (bottom >= floor && top > 0) return { cov, note: null };
  const clipped = values.map((v) => Math.max(v, floor));
  const out = new Float64Array(n * n);
  // V diag(λ') Vᵀ, written out so the result is exactly symmetric.
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = 0; k < n; k++)
        s += vectors.data[i * n + k]! * clipped[k]! * vectors.data[j * n + k]!;
      out[i * n + j] = s;
      out[j * n + i] = s;
    }
  }
  const before = bottom > 0 ? fmt(top / bottom) : 'infinite (singular)';
  const after = fmt(Math.max(...clipped) / Math.min(...clipped));
  return {
    cov: { rows: n, cols: n, data: out },
    note: `${label} regularised: condition number ${before} → ${after} (eigenvalues below ${fmt(floor)} raised to it)`,
  };
}

function fmt(x: number): string {
  return x.toExponential(1);
}
