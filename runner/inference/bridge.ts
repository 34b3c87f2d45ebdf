/**
 * Bridges (MATH.md §3): the posterior of waypoints ψ_1 … ψ_T between an observed start ψ₀
 * and goal ψ_g = ψ_{T+1} under transitions N(Fψ, Q). The precision Λ is block tridiagonal
 * and does not depend on ψ₀, ψ_g, so `prepareBridge` factors it once per (model, T) by
 * block LDLᵀ with Cholesky factors of the pivots D_t (the information-form Kalman filter
 * plus Rauch–Tung–Striebel smoother: Rauch, Tung & Striebel, AIAA J. 3(8), 1965), and
 * `solve` treats every query as a right-hand side in O(T d²).
 */
import type { BridgePosterior, TransitionModel } from './api.ts';
import type { Mat } from '../numeric/matrix.ts';
import { cholesky } from '../numeric/linalg/cholesky.ts';
import {
  multiply,
  multiplyTransA,
  multiplyTransB,
  multiplyTransBInto,
  symmetrizeInPlace,
  transpose,
} from '../numeric/linalg/multiply.ts';
import { inverseFromCholesky } from '../numeric/linalg/spd.ts';
import {
  solveLower,
  solveLowerRowsInPlace,
  solveLowerTranspose,
  solveUpperRowsInPlace,
} from '../numeric/linalg/triangular.ts';
import { centreRows, checkFinite, checkInteger, checkLength, checkModel } from './validate.ts';

/** A bridge factorisation for one model and one T; `solve` answers batches of queries. */
export interface BridgeSolver {
  dim: number;
  T: number;
  /** T marginal covariances [dim, dim], shared by every query. */
  covariances: Mat[];
  /** Posterior for `queries` start/goal pairs, each [queries, dim]; means [queries, T, dim]. */
  solve(starts: ArrayLike<number>, goals: ArrayLike<number>, queries: number): BridgePosterior;
}

/** What one factorisation keeps for the solves; every product in the hot path is A Bᵀ form. */
interface BridgeFactor {
  model: TransitionModel;
  /** P = Q⁻¹F [d, d] and Pᵀ. */
  p: Mat;
  pT: Mat;
  /** L_t and U_t = L_tᵀ, t = 1 … T, with D_t = L_t L_tᵀ. */
  lower: Mat[];
  upper: Mat[];
  /** V_t = L_t⁻¹ Λ_{t,t+1} and V_tᵀ, t = 1 … T−1. */
  coupling: Mat[];
  couplingT: Mat[];
  covariances: Mat[];
}

/** Factors the block-tridiagonal precision of MATH.md §3 once for `model` and `T` waypoints. */
export function prepareBridge(model: TransitionModel, T: number): BridgeSolver {
  checkModel(model, 'prepareBridge');
  checkInteger('prepareBridge: T', T, 1);
  const d = model.dim;
  // Whitening by Q = L_Q L_Qᵀ: W = L_Q⁻¹ F, so Fᵀ Q⁻¹ F = Wᵀ W and Q⁻¹ F = L_Q⁻ᵀ W.
  const lq = cholesky(model.Q, 'transition noise Q');
  const w = solveLower(lq, model.F);
  const p = solveLowerTranspose(lq, w); // [d, d] = Q⁻¹ F = −Λ_{t+1,t}
  const diag = multiplyTransA(w, w); // Λ_tt = Q⁻¹ + Fᵀ Q⁻¹ F
  const qInv = inverseFromCholesky(lq);
  for (let i = 0; i < diag.data.length; i++) diag.data[i] = diag.data[i]! + qInv.data[i]!;
  symmetrizeInPlace(diag);

  // Forward: D_1 = Λ_11, D_t = Λ_tt − Λ_{t,t−1} D_{t−1}⁻¹ Λ_{t−1,t} = Λ_tt − V_{t−1}ᵀ V_{t−1},
  // with D_t = L_t L_tᵀ and V_t = L_t⁻¹ Λ_{t,t+1} = −L_t⁻¹ Pᵀ.
  const pT = transpose(p);
  const lower: Mat[] = [];
  const coupling: Mat[] = [];
  let pivot = diag;
  for (let t = 0; t < T; t++) {
    const l = cholesky(pivot, `bridge pivot D_${t + 1}`);
    lower.push(l);
    if (t === T - 1) break;
    const v = solveLower(l, pT);
    for (let i = 0; i < v.data.length; i++) v.data[i] = -v.data[i]!;
    coupling.push(v);
    const vv = multiplyTransA(v, v);
    pivot = symmetrizeInPlace({ rows: d, cols: d, data: diag.data.map((x, i) => x - vv.data[i]!) });
  }
  const factor: BridgeFactor = {
    model,
    p,
    pT,
    lower,
    upper: lower.map(transpose),
    coupling,
    couplingT: coupling.map(transpose),
    covariances: marginalCovariances(lower, coupling),
  };
  return {
    dim: d,
    T,
    covariances: factor.covariances,
    solve: (starts, goals, queries) => solveQueries(factor, starts, goals, queries),
  };
}

/**
 * Backward covariance recursion: Σ_T = D_T⁻¹, Σ_t = D_t⁻¹ + G_t Σ_{t+1} G_tᵀ with
 * G_t = D_t⁻¹ Λ_{t,t+1} = L_t⁻ᵀ V_t (MATH.md §3). Runs once per factorisation.
 */
function marginalCovariances(lower: Mat[], coupling: Mat[]): Mat[] {
  const T = lower.length;
  const out: Mat[] = new Array<Mat>(T);
  let next = inverseFromCholesky(lower[T - 1]!);
  out[T - 1] = next;
  for (let t = T - 2; t >= 0; t--) {
    const l = lower[t]!;
    const g = solveLowerTranspose(l, coupling[t]!);
    const gsg = multiplyTransB(multiply(g, next), g);
    const inv = inverseFromCholesky(l);
    next = symmetrizeInPlace({
      rows: l.rows,
      cols: l.cols,
      data: inv.data.map((x, i) => x + gsg.data[i]!),
    });
    out[t] = next;
  }
  return out;
}

/** Forward and back substitution for a batch of right-hand sides stored as rows ([queries, d]). */
function solveQueries(
  f: BridgeFactor,
  starts: ArrayLike<number>,
  goals: ArrayLike<number>,
  queries: number,
): BridgePosterior {
  const { model } = f;
  const d = model.dim;
  const T = f.lower.length;
  checkInteger('solveBridge: queries', queries, 0);
  checkLength('solveBridge: starts', starts.length, queries * d, `[${queries}, ${d}]`);
  checkLength('solveBridge: goals', goals.length, queries * d, `[${queries}, ${d}]`);
  checkFinite('solveBridge: starts', starts, d);
  checkFinite('solveBridge: goals', goals, d);
  const size = queries * d;
  const s0 = centreRows(starts, queries, d, model.mean); // [queries, d]
  const sg = centreRows(goals, queries, d, model.mean); // [queries, d]
  const z: Float64Array[] = []; // z_t = L_t⁻¹ y_t, each [queries, d]
  const tmp = new Float64Array(size);
  for (let t = 0; t < T; t++) {
    const y = new Float64Array(size);
    if (t === 0) multiplyTransBInto(s0, f.p.data, y, queries, d, d); // h_1 = Q⁻¹F ψ₀ (rows: ψ₀ Pᵀ)
    if (t === T - 1) {
      multiplyTransBInto(sg, f.pT.data, tmp, queries, d, d); // h_T += FᵀQ⁻¹ ψ_g (rows: ψ_g P)
      for (let i = 0; i < size; i++) y[i] = y[i]! + tmp[i]!;
    }
    if (t > 0) {
      multiplyTransBInto(z[t - 1]!, f.couplingT[t - 1]!.data, tmp, queries, d, d); // V_{t−1}ᵀ z_{t−1}
      for (let i = 0; i < size; i++) y[i] = y[i]! - tmp[i]!;
    }
    solveLowerRowsInPlace(f.lower[t]!.data, d, y, queries);
    z.push(y);
  }
  // Backward: μ_T = L_T⁻ᵀ z_T, μ_t = L_t⁻ᵀ (z_t − V_t μ_{t+1}); z_t is overwritten by μ_t.
  for (let t = T - 1; t >= 0; t--) {
    const mu = z[t]!;
    if (t < T - 1) {
      multiplyTransBInto(z[t + 1]!, f.coupling[t]!.data, tmp, queries, d, d);
      for (let i = 0; i < size; i++) mu[i] = mu[i]! - tmp[i]!;
    }
    solveUpperRowsInPlace(f.upper[t]!.data, d, mu, queries);
  }
  const means = new Float64Array(queries * T * d); // [queries, T, d]
  for (let t = 0; t < T; t++) {
    const mu = z[t]!;
    for (let q = 0; q < queries; q++) {
      const o = (q * T + t) * d;
      for (let j = 0; j < d; j++) means[o + j] = mu[q * d + j]! + model.mean[j]!;
    }
  }
  return { means, covariances: f.covariances };
}

/** Bridge posterior in one call: `prepareBridge(model, T).solve(starts, goals, queries)`. */
export function solveBridge(
  model: TransitionModel,
  starts: ArrayLike<number>,
  goals: ArrayLike<number>,
  queries: number,
  T: number,
): BridgePosterior {
  return prepareBridge(model, T).solve(starts, goals, queries);
}
