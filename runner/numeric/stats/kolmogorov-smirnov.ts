/**
 * One-sample two-sided Kolmogorov–Smirnov test against a fully specified distribution.
 */
import { logGamma } from './special.ts';

export interface KsResult {
  /** D_n = sup |F_n(x) - F(x)|: also the effect size (a distance between distributions). */
  statistic: number;
  /** Two-sided p-value P(D_n ≥ statistic). */
  p: number;
}

/** Kolmogorov–Smirnov statistic and p-value of `sample` against the distribution function `cdf`. */
export function kolmogorovSmirnov(sample: ArrayLike<number>, cdf: (x: number) => number): KsResult {
  const n = sample.length;
  if (n === 0) return { statistic: NaN, p: NaN };
  const sorted = Float64Array.from(sample).sort();
  let d = 0;
  for (let i = 0; i < n; i++) {
    const f = cdf(sorted[i]!);
    d = Math.max(d, (i + 1) / n - f, f - i / n);
  }
  return { statistic: d, p: kolmogorovPValue(d, n) };
}

/**
 * P(D_n ≥ d). Exact by Marsaglia, Tsang & Wang (2003, "Evaluating Kolmogorov's
 * distribution", J. Stat. Software 8(18)) while the matrix stays small; beyond that
 * (p-values below ~1e-6 or n·d large) Kolmogorov's limiting series with Stephens' (1970)
 * finite-n scaling λ = (√n + 0.12 + 0.11/√n)·d.
 */
export function kolmogorovPValue(d: number, n: number): number {
  if (!(d > 0)) return 1;
  if (d >= 1) return 0;
  const k = Math.floor(n * d) + 1;
  const m = 2 * k - 1;
  if (n * d * d <= 7.24 && m <= 401) return Math.min(1, Math.max(0, 1 - kolmogorovCdfExact(d, n)));
  const sqrtN = Math.sqrt(n);
  const lambda = (sqrtN + 0.12 + 0.11 / sqrtN) * d;
  let p = 0;
  for (let j = 1; j <= 100; j++) {
    const term = Math.exp(-2 * j * j * lambda * lambda);
    p += (j % 2 === 1 ? 2 : -2) * term;
    if (term < 1e-18) break;
  }
  return Math.min(1, Math.max(0, p));
}

/** P(D_n < d) = n!/nⁿ · (Hⁿ)_kk (Marsaglia, Tsang & Wang 2003, §2). */
function kolmogorovCdfExact(d: number, n: number): number {
  const k = Math.floor(n * d) + 1;
  const m = 2 * k - 1;
  const h = k - n * d;
  const H = new Float64Array(m * m); // [m, m]
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) if (i - j + 1 >= 0) H[i * m + j] = 1;
  }
  for (let i = 0; i < m; i++) {
    H[i * m] = H[i * m]! - h ** (i + 1);
    H[(m - 1) * m + i] = H[(m - 1) * m + i]! - h ** (m - i);
  }
  if (2 * h - 1 > 0) H[(m - 1) * m] = H[(m - 1) * m]! + (2 * h - 1) ** m;
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) {
      const g = i - j + 1;
      if (g > 0) H[i * m + j] = H[i * m + j]! / Math.exp(logGamma(g + 1));
    }
  }
  const { matrix, logScale } = powerScaled(H, m, n);
  const logValue =
    Math.log(matrix[(k - 1) * m + (k - 1)]!) + logScale + logGamma(n + 1) - n * Math.log(n);
  return Math.exp(logValue);
}

/** Aⁿ by repeated squaring, renormalised as it goes: returns B and s with Aⁿ = B·eˢ. */
function powerScaled(
  A: Float64Array,
  m: number,
  n: number,
): { matrix: Float64Array; logScale: number } {
  let result: Float64Array | null = null;
  let resultScale = 0;
  let base = A;
  let baseScale = 0;
  for (let e = n; e > 0; e = Math.floor(e / 2)) {
    if (e % 2 === 1) {
      if (result === null) {
        result = base.slice();
        resultScale = baseScale;
      } else {
        result = multiply(result, base, m);
        resultScale += baseScale;
      }
      resultScale += renormalise(result);
    }
    if (e > 1) {
      base = multiply(base, base, m);
      baseScale = 2 * baseScale + renormalise(base);
    }
  }
  return { matrix: result ?? A, logScale: resultScale };
}

function multiply(a: Float64Array, b: Float64Array, m: number): Float64Array {
  const out = new Float64Array(m * m);
  for (let i = 0; i < m; i++) {
    for (let l = 0; l < m; l++) {
      const ail = a[i * m + l]!;
      if (ail === 0) continue;
      for (let j = 0; j < m; j++) out[i * m + j] = out[i * m + j]! + ail * b[l * m + j]!;
    }
  }
  return out;
}

/** Divides by the largest absolute entry; returns the log of the factor removed. */
function renormalise(a: Float64Array): number {
  let max = 0;
  for (const v of a) max = Math.max(max, Math.abs(v));
  if (max === 0 || !Number.isFinite(max)) return 0;
  for (let i = 0; i < a.length; i++) a[i] = a[i]! / max;
  return Math.log(max);
}
