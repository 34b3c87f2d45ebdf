/**
 * REFERENCE ONLY (tests and bench/inference.ts): the bridge of MATH.md §3 by assembling the
 * full (Td)×(Td) precision Λ and solving it densely, O((Td)³) per factorisation. The
 * production path is bridge.ts; this exists to check it and to time it against.
 */
import type { BridgePosterior, TransitionModel } from './api.ts';
import type { Mat } from '../numeric/matrix.ts';
import { cholesky } from '../numeric/linalg/cholesky.ts';
import { multiplyTransA } from '../numeric/linalg/multiply.ts';
import { inverseFromCholesky, solveWithCholesky } from '../numeric/linalg/spd.ts';

/** The dense block-tridiagonal precision Λ [(Td), (Td)] and Q⁻¹F [d, d] of MATH.md §3. */
export function assembleBridgePrecision(
  model: TransitionModel,
  T: number,
): { precision: Mat; qInvF: Mat } {
  const d = model.dim;
  const n = T * d;
  const qInv = inverseFromCholesky(cholesky(model.Q, 'Q'));
  const qInvF = { rows: d, cols: d, data: new Float64Array(d * d) };
  for (let i = 0; i < d; i++)
    for (let j = 0; j < d; j++) {
      let s = 0;
      for (let k = 0; k < d; k++) s += qInv.data[i * d + k]! * model.F.data[k * d + j]!;
      qInvF.data[i * d + j] = s;
    }
  const ftQf = multiplyTransA(model.F, qInvF);
  const lam = new Float64Array(n * n);
  for (let t = 0; t < T; t++) {
    for (let i = 0; i < d; i++)
      for (let j = 0; j < d; j++) {
        const r = t * d + i;
        lam[r * n + t * d + j] = qInv.data[i * d + j]! + ftQf.data[i * d + j]!;
        if (t + 1 < T) {
          // Λ_{t+1,t} = −Q⁻¹F and its transpose above the diagonal.
          lam[((t + 1) * d + i) * n + t * d + j] = -qInvF.data[i * d + j]!;
          lam[(t * d + j) * n + (t + 1) * d + i] = -qInvF.data[i * d + j]!;
        }
      }
  }
  return { precision: { rows: n, cols: n, data: lam }, qInvF };
}

/** Dense bridge posterior: one Cholesky of Λ, all queries as stacked right-hand sides. */
export function solveBridgeDense(
  model: TransitionModel,
  starts: ArrayLike<number>,
  goals: ArrayLike<number>,
  queries: number,
  T: number,
): BridgePosterior {
  const d = model.dim;
  const n = T * d;
  const { precision, qInvF } = assembleBridgePrecision(model, T);
  const l = cholesky(precision, 'dense bridge precision');
  const h = new Float64Array(n * queries); // [(Td), queries]: one right-hand side per column
  for (let q = 0; q < queries; q++) {
    for (let i = 0; i < d; i++) {
      let a = 0;
      let b = 0;
      for (let j = 0; j < d; j++) {
        a += qInvF.data[i * d + j]! * (starts[q * d + j]! - model.mean[j]!); // h_1 = Q⁻¹F ψ₀
        b += qInvF.data[j * d + i]! * (goals[q * d + j]! - model.mean[j]!); // h_T += FᵀQ⁻¹ ψ_g
      }
      h[i * queries + q] = h[i * queries + q]! + a;
      h[((T - 1) * d + i) * queries + q] = h[((T - 1) * d + i) * queries + q]! + b;
    }
  }
  const mu = solveWithCholesky(l, { rows: n, cols: queries, data: h });
  const means = new Float64Array(queries * n); // [queries, T, d]
  for (let q = 0; q < queries; q++)
    for (let r = 0; r < n; r++) means[q * n + r] = mu.data[r * queries + q]! + model.mean[r % d]!;
  const sigma = inverseFromCholesky(l);
  const covariances: Mat[] = [];
  for (let t = 0; t < T; t++) {
    const c = new Float64Array(d * d);
    for (let i = 0; i < d; i++)
      for (let j = 0; j < d; j++) c[i * d + j] = sigma.data[(t * d + i) * n + t * d + j]!;
    covariances.push({ rows: d, cols: d, data: c });
  }
  return { means, covariances };
}
