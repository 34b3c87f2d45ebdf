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
import { inverseFromCholesky, solveWithCholesky } from '../numeric/linalg/spd.ts';
import { solveLower, solveLowerTranspose } from '../numeric/linalg/triangular.ts';
import { centreRows, checkFinite, checkInteger, checkLength, checkModel } from './validate.ts';

/** A bridge factorisation for one model and one T; `solve` answers batches of queries. */
export interface BridgeSolver {
  dim: number;
  T: number;
  /** T marginal covariances [dim, dim], shared by every query and every `solve` result: read only. */
  covariances: Mat[];
  /** Posterior for `queries` start/goal pairs, each [queries, dim]; means [queries, T, dim]. */
  solve(starts: ArrayLike<number>, goals: ArrayLike<number>, queries: number): BridgePosterior;
}

/**
 * What one factorisation keeps for the solves: the filter gains K_t = D_t⁻¹ P and the
 * smoother gains J_t = D_t⁻¹ Pᵀ (P = Q⁻¹F), both obtained from the Cholesky factor of D_t
 * by triangular solves, so every per-query operation is one [queries, d] × [d, d] product.
 */
interface BridgeFactor {
  model: TransitionModel;
  /** K_t, t = 1 … T, each [d, d]. */
  filterGain: Mat[];
  /** J_t, t = 1 … T, each [d, d] (J_T maps the goal in). */
  smootherGain: Mat[];
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
  const pT = transpose(p); // = −Λ_{t,t+1}
  const diag = multiplyTransA(w, w); // Λ_tt = Q⁻¹ + Fᵀ Q⁻¹ F
  const qInv = inverseFromCholesky(lq);
  for (let i = 0; i < diag.data.length; i++) diag.data[i] = diag.data[i]! + qInv.data[i]!;
  symmetrizeInPlace(diag);

  // Forward block LDLᵀ: D_1 = Λ_11, D_t = Λ_tt − Λ_{t,t−1} D_{t−1}⁻¹ Λ_{t−1,t} = Λ_tt − V_{t−1}ᵀ V_{t−1}
  // with D_t = L_t L_tᵀ and V_t = L_t⁻¹ Pᵀ (a difference of a PSD term keeps D_t symmetric).
  const lower: Mat[] = [];
  const filterGain: Mat[] = [];
  const smootherGain: Mat[] = [];
  let pivot = diag;
  for (let t = 0; t < T; t++) {
    const l = cholesky(pivot, `bridge pivot D_${t + 1}`);
    lower.push(l);
    const v = solveLower(l, pT);
    smootherGain.push(solveLowerTranspose(l, v)); // J_t = D_t⁻¹ Pᵀ
    filterGain.push(solveWithCholesky(l, p)); // K_t = D_t⁻¹ P
    const vv = multiplyTransA(v, v);
    pivot = symmetrizeInPlace({ rows: d, cols: d, data: diag.data.map((x, i) => x - vv.data[i]!) });
  }
  const factor: BridgeFactor = {
    model,
    filterGain,
    smootherGain,
    covariances: marginalCovariances(lower, smootherGain),
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
 * G_t = D_t⁻¹ Λ_{t,t+1} = −J_t (MATH.md §3; the sign cancels). Runs once per factorisation.
 */
function marginalCovariances(lower: Mat[], smootherGain: Mat[]): Mat[] {
  const T = lower.length;
  const out: Mat[] = new Array<Mat>(T);
  let next = inverseFromCholesky(lower[T - 1]!);
  out[T - 1] = next;
  for (let t = T - 2; t >= 0; t--) {
    const l = lower[t]!;
    const g = smootherGain[t]!;
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

/**
 * All queries at once, each a row of a [queries, d] block. With m_t = D_t⁻¹ y_t the block
 * LDLᵀ recursions of MATH.md §3 read, since h_t = 0 between the ends:
 * forward m_1 = K_1 ψ₀, m_t = K_t m_{t−1} (+ J_T ψ_g at t = T); backward μ_T = m_T,
 * μ_t = m_t + J_t μ_{t+1} — the Rauch–Tung–Striebel form, O(T d²) per query.
 */
function solveQueries(
  f: BridgeFactor,
  starts: ArrayLike<number>,
  goals: ArrayLike<number>,
  queries: number,
): BridgePosterior {
  const { model } = f;
  const d = model.dim;
  const T = f.filterGain.length;
  checkInteger('solveBridge: queries', queries, 0);
  checkLength('solveBridge: starts', starts.length, queries * d, `[${queries}, ${d}]`);
  checkLength('solveBridge: goals', goals.length, queries * d, `[${queries}, ${d}]`);
  checkFinite('solveBridge: starts', starts, d);
  checkFinite('solveBridge: goals', goals, d);
  const size = queries * d;
  const sg = centreRows(goals, queries, d, model.mean); // [queries, d]
  const m: Float64Array[] = []; // m_t, each [queries, d]; overwritten by μ_t
  let prev = centreRows(starts, queries, d, model.mean); // ψ₀ − μ̄, then m_{t−1}
  const tmp = new Float64Array(size);
  for (let t = 0; t < T; t++) {
    const mt = new Float64Array(size);
    multiplyTransBInto(prev, f.filterGain[t]!.data, mt, queries, d, d); // rows: m_{t−1} K_tᵀ
    m.push(mt);
    prev = mt;
  }
  const last = m[T - 1]!;
  multiplyTransBInto(sg, f.smootherGain[T - 1]!.data, tmp, queries, d, d); // J_T ψ_g
  for (let i = 0; i < size; i++) last[i] = last[i]! + tmp[i]!;
  for (let t = T - 2; t >= 0; t--) {
    const mu = m[t]!;
    multiplyTransBInto(m[t + 1]!, f.smootherGain[t]!.data, tmp, queries, d, d); // J_t μ_{t+1}
    for (let i = 0; i < size; i++) mu[i] = mu[i]! + tmp[i]!;
  }
  const means = new Float64Array(queries * T * d); // [queries, T, d]
  for (let t = 0; t < T; t++) {
    const mu = m[t]!;
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
