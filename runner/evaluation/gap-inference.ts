/**
 * Exact inference under a per-step linear-Gaussian model on chains whose transitions span
 * realised step gaps (the jump tasks of tasks.ts). A gap of k steps is one transition with
 * F_k = F^k and Q_k = Σ_{j<k} F^j Q F^{jᵀ} (MATH.md §2; Bishop PRML eq. 2.115 applied k
 * times), so a bridge with gaps k_1 … k_{T+1} is the block-tridiagonal posterior of MATH.md §3
 * with a different (F_k, Q_k) on every segment. Each task has its own gaps, so the precision is
 * assembled and factored per task; T·d is small (waypoints × state dim), so a dense Cholesky
 * of the (Td)×(Td) precision is cheap and exact. Pure numerics: no I/O.
 */
import type { TransitionModel } from '../inference/index.ts';
import { jumpMoments } from '../inference/index.ts';
import {
  cholesky,
  inverseFromCholesky,
  multiply,
  multiplyTransA,
  solveWithCholesky,
} from '../numeric/linalg/index.ts';
import type { Mat } from '../numeric/matrix.ts';

/** One gap's transition in information form. */
export interface GapTransition {
  /** [d, d] F^k */
  power: Mat;
  /** [d, d] Q_k⁻¹ F^k */
  qInvF: Mat;
  /** [d, d] Q_k⁻¹ */
  qInv: Mat;
  /** [d, d] F^{kᵀ} Q_k⁻¹ F^k */
  ftQf: Mat;
}

/** A memo of gap transitions for one model: gaps repeat across tasks, so each is built once. */
export type GapTable = (k: number) => GapTransition;

/** Builds the memo of (F^k, Q_k) in information form for a per-step model. */
export function createGapTable(model: TransitionModel): GapTable {
  const memo = new Map<number, GapTransition>();
  return (k) => {
    let entry = memo.get(k);
    if (entry === undefined) {
      const { power, cov } = jumpMoments(model, k);
      const qInv = inverseFromCholesky(cholesky(cov, `${k}-step noise covariance`));
      const qInvF = multiply(qInv, power);
      entry = { power, qInvF, qInv, ftQf: multiplyTransA(power, qInvF) };
      memo.set(k, entry);
    }
    return entry;
  };
}

/** Forecast mean μ̄ + F^k (s₀ − μ̄) after the k steps between times[0] and times[n]: [d]. */
export function forecastOnGap(
  model: TransitionModel,
  table: GapTable,
  start: ArrayLike<number>,
  steps: number,
): Float64Array {
  const d = model.dim;
  const { power } = table(steps);
  const out = new Float64Array(d);
  for (let i = 0; i < d; i++) {
    let s = model.mean[i]!;
    for (let j = 0; j < d; j++) s += power.data[i * d + j]! * (start[j]! - model.mean[j]!);
    out[i] = s;
  }
  return out;
}

/**
 * Posterior means [T, d] of the states at times[1..T] given the states at times[0] (start)
 * and times[T+1] (goal), T = times.length − 2 ≥ 1. Segment i (1 ≤ i ≤ T+1) runs from
 * position i−1 to i with gap k_i = times[i] − times[i−1] and contributes
 * −½ (x_i − F_i x_{i−1})ᵀ Q_i⁻¹ (x_i − F_i x_{i−1}) to the log density (MATH.md §3).
 */
export function bridgeOnGaps(
  model: TransitionModel,
  table: GapTable,
  times: readonly number[],
  start: ArrayLike<number>,
  goal: ArrayLike<number>,
): Float64Array {
  const d = model.dim;
  const T = times.length - 2;
  if (T < 1) throw new RangeError(`bridgeOnGaps: need at least 3 times, got ${times.length}`);
  const n = T * d;
  const lam = new Float64Array(n * n); // [(Td), (Td)] precision
  const h = new Float64Array(n); // [(Td)] information vector
  for (let i = 1; i <= T + 1; i++) {
    const seg = table(times[i]! - times[i - 1]!);
    // Destination x_i (unknown when i ≤ T): + Q_i⁻¹ on its diagonal block.
    if (i <= T) addBlock(lam, n, i - 1, i - 1, seg.qInv.data, d, false);
    // Source x_{i−1} (unknown when i ≥ 2): + F_iᵀ Q_i⁻¹ F_i on its diagonal block.
    if (i >= 2) addBlock(lam, n, i - 2, i - 2, seg.ftQf.data, d, false);
    // Both unknown: Λ_{i,i−1} = −Q_i⁻¹ F_i and its transpose.
    if (i >= 2 && i <= T) {
      addBlock(lam, n, i - 1, i - 2, seg.qInvF.data, d, false, -1);
      addBlock(lam, n, i - 2, i - 1, seg.qInvF.data, d, true, -1);
    }
    // Observed ends: h_1 += Q_1⁻¹ F_1 (s₀ − μ̄); h_T += F_{T+1}ᵀ Q_{T+1}⁻¹ (s_g − μ̄).
    for (let a = 0; a < d; a++) {
      for (let b = 0; b < d; b++) {
        if (i === 1) h[a] = h[a]! + seg.qInvF.data[a * d + b]! * (start[b]! - model.mean[b]!);
        if (i === T + 1)
          h[(T - 1) * d + a] =
            h[(T - 1) * d + a]! + seg.qInvF.data[b * d + a]! * (goal[b]! - model.mean[b]!);
      }
    }
  }
  const l = cholesky({ rows: n, cols: n, data: lam }, 'gap bridge precision');
  const mu = solveWithCholesky(l, { rows: n, cols: 1, data: h }).data;
  for (let r = 0; r < n; r++) mu[r] = mu[r]! + model.mean[r % d]!;
  return mu;
}

/** lam[block (r, c)] += sign · B (or Bᵀ), B [d, d]. */
function addBlock(
  lam: Float64Array,
  n: number,
  r: number,
  c: number,
  block: Float64Array,
  d: number,
  transposed: boolean,
  sign = 1,
): void {
  for (let a = 0; a < d; a++) {
    for (let b = 0; b < d; b++) {
      const v = transposed ? block[b * d + a]! : block[a * d + b]!;
      const at = (r * d + a) * n + c * d + b;
      lam[at] = lam[at]! + sign * v;
    }
  }
}
