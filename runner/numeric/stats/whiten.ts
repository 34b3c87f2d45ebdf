/**
 * Whitening of a sample by its own covariance, the common first step of the multivariate
 * normality tests: w_i = L⁻¹ (x_i - x̄) with S = L Lᵀ, so w_i·w_j = (x_i - x̄)ᵀ S⁻¹ (x_j - x̄).
 */

/**
 * Centres `X` [n, d] (row-major), factors its maximum-likelihood covariance S (divisor n,
 * as Mardia 1970 and Henze & Zirkler 1990 use) and returns the whitened rows [n, d].
 * Throws with the shapes when S is singular (e.g. n ≤ d or a constant dimension).
 */
export function whitenSample(X: ArrayLike<number>, n: number, d: number): Float64Array {
  if (X.length !== n * d) {
    throw new RangeError(`expected a ${n}×${d} sample (${n * d} values), got ${X.length}`);
  }
  const Z = new Float64Array(n * d); // [n, d]
  for (let j = 0; j < d; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += X[i * d + j]!;
    const m = s / n;
    for (let i = 0; i < n; i++) Z[i * d + j] = X[i * d + j]! - m;
  }
  const S = new Float64Array(d * d); // [d, d]
  for (let i = 0; i < n; i++) {
    for (let a = 0; a < d; a++) {
      const za = Z[i * d + a]!;
      for (let b = 0; b <= a; b++) S[a * d + b] = S[a * d + b]! + za * Z[i * d + b]!;
    }
  }
  for (let a = 0; a < d; a++) for (let b = 0; b <= a; b++) S[a * d + b] = S[a * d + b]! / n;
  const L = choleskyLower(S, d, n);
  // Forward substitution row by row: L w = z.
  const W = new Float64Array(n * d);
  for (let i = 0; i < n; i++) {
    for (let a = 0; a < d; a++) {
      let v = Z[i * d + a]!;
      for (let b = 0; b < a; b++) v -= L[a * d + b]! * W[i * d + b]!;
      W[i * d + a] = v / L[a * d + a]!;
    }
  }
  return W;
}

// Cholesky–Banachiewicz on the lower triangle of S (common practice).
function choleskyLower(S: Float64Array, d: number, n: number): Float64Array {
  const L = new Float64Array(d * d);
  for (let i = 0; i < d; i++) {
    for (let j = 0; j <= i; j++) {
      let s = S[i * d + j]!;
      for (let k = 0; k < j; k++) s -= L[i * d + k]! * L[j * d + k]!;
      if (i === j) {
        if (!(s > 1e-12 * Math.max(1, Math.abs(S[i * d + i]!)))) {
          throw new RangeError(
            `sample covariance (${d}×${d}, from ${n} rows) is singular at dimension ${i}: ` +
              'need more rows than dimensions and no constant dimension',
          );
        }
        L[i * d + i] = Math.sqrt(s);
      } else {
        L[i * d + j] = s / L[j * d + j]!;
      }
    }
  }
  return L;
}
