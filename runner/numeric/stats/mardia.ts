/**
 * Mardia's (1970) multivariate skewness and kurtosis ("Measures of multivariate skewness
 * and kurtosis with applications", Biometrika 57(3), eqs. 2.5, 2.6, 2.23, 2.24 with §3).
 */
import { chiSquareTail } from './chi-square.ts';
import { normalCdf } from './normal.ts';
import { whitenSample } from './whiten.ts';

export interface MardiaResult {
  /** b_{1,d} = n⁻² Σ_ij g_ij³; 0 under normality (an effect size). */
  skewness: number;
  /** b_{2,d} = n⁻¹ Σ_i g_ii²; d(d+2) under normality. */
  kurtosis: number;
  /** n·b₁/6 ~ χ² with d(d+1)(d+2)/6 df (asymptotic). */
  pSkew: number;
  /** (b₂ - d(d+2)) / √(8d(d+2)/n) ~ N(0, 1), two-sided (asymptotic). */
  pKurt: number;
}

/** Mardia's tests on `X` [n, d] row-major, g_ij = (x_i - x̄)ᵀ S⁻¹ (x_j - x̄), S with divisor n. */
export function mardia(X: ArrayLike<number>, n: number, d: number): MardiaResult {
  const W = whitenSample(X, n, d); // [n, d]
  let sumCubes = 0;
  let sumSquares = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let g = 0;
      for (let a = 0; a < d; a++) g += W[i * d + a]! * W[j * d + a]!;
      if (i === j) {
        sumCubes += g * g * g;
        sumSquares += g * g;
      } else {
        sumCubes += 2 * g * g * g;
      }
    }
  }
  const skewness = sumCubes / (n * n);
  const kurtosis = sumSquares / n;
  const dfSkew = (d * (d + 1) * (d + 2)) / 6;
  const z = (kurtosis - d * (d + 2)) / Math.sqrt((8 * d * (d + 2)) / n);
  return {
    skewness,
    kurtosis,
    pSkew: chiSquareTail((n * skewness) / 6, dfSkew),
    pKurt: 2 * normalCdf(-Math.abs(z)),
  };
}
