/**
 * Scores of observations under a Gaussian prediction N(μ, Σ) (MATH.md §4, calibration):
 * the squared Mahalanobis distance D² = (y-μ)ᵀ Σ⁻¹ (y-μ), which follows χ²_d when the
 * prediction is right, and the negative log-likelihood.
 */
import type { Mat } from '../numeric/matrix.ts';
import { cholesky, logDetFromCholesky, solveLowerRowsInPlace } from '../numeric/linalg/index.ts';
import { chiSquareCdf, chiSquareQuantile } from '../numeric/stats/index.ts';

/** Credible levels whose coverage is reported (coverage_50 … coverage_95). */
export const COVERAGE_LEVELS = [50, 80, 90, 95] as const;

export interface GaussianScores {
  /** [count] squared Mahalanobis distances. */
  d2: Float64Array;
  /** log det Σ. */
  logDet: number;
}

/** D² of each row of `truth` against the matching row of `mean` ([count, dim]) under `cov`. */
export function scoreGaussian(
  mean: ArrayLike<number>,
  cov: Mat,
  truth: ArrayLike<number>,
  count: number,
): GaussianScores {
  const dim = cov.rows;
  const l = cholesky(cov, 'predictive covariance');
  const r = new Float64Array(count * dim); // [count, dim] residuals, then whitened in place
  for (let i = 0; i < count * dim; i++) r[i] = truth[i]! - mean[i]!;
  solveLowerRowsInPlace(l.data, dim, r, count);
  const d2 = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    let s = 0;
    for (let j = 0; j < dim; j++) s += r[i * dim + j]! ** 2;
    d2[i] = s;
  }
  return { d2, logDet: logDetFromCholesky(l) };
}

/**
 * Coverage of each credible level (fraction of D² ≤ χ²_d quantile), the NLL per dimension
 * ½ (D² + log det Σ + d log 2π) / d averaged over rows, and a 10-bin histogram of the
 * probability integral transform F_χ²(D²) (flat when calibrated), across several score sets.
 */
export function summariseScores(
  scores: readonly GaussianScores[],
  dim: number,
): {
  coverage: Record<(typeof COVERAGE_LEVELS)[number], number>;
  nll: number;
  pit: number[];
  n: number;
} {
  const thresholds = COVERAGE_LEVELS.map((level) => chiSquareQuantile(level / 100, dim));
  const hits = COVERAGE_LEVELS.map(() => 0);
  const pit = new Array<number>(10).fill(0);
  let nll = 0;
  let n = 0;
  for (const s of scores) {
    for (const d2 of s.d2) {
      thresholds.forEach((q, i) => {
        if (d2 <= q) hits[i]! += 1;
      });
      pit[Math.min(9, Math.floor(10 * chiSquareCdf(d2, dim)))]! += 1;
      nll += (0.5 * (d2 + s.logDet + dim * Math.log(2 * Math.PI))) / dim;
      n++;
    }
  }
  const coverage = { 50: hits[0]! / n, 80: hits[1]! / n, 90: hits[2]! / n, 95: hits[3]! / n };
  return { coverage, nll: nll / n, pit: pit.map((c) => c / n), n };
}
