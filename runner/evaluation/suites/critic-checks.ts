/**
 * Deterministic checks of the critic (MATH.md §2): stationarity of N(0, cI) needs
 * A Aᵀ = (1 + 1/c) I, so every singular value of A should equal √(1 + 1/c); and a
 * transition fitted without trusting the critic should approach F = mA, Q = mI. These are
 * comparisons of fitted parameters, reported as effect sizes (relative gaps) with no p-value.
 */
import type { Mat } from '../../numeric/matrix.ts';
import { multiplyTransA, symmetricEigen } from '../../numeric/linalg/index.ts';
import type { MetricRow } from '../metric.ts';
import { metricRow, type EvalContext } from '../context.ts';

/** Singular values of A relative to √(1+1/c), and fitted-vs-critic gaps, when a critic exists. */
export function criticRows(context: EvalContext): {
  metrics: MetricRow[];
  details: Record<string, unknown> | null;
} {
  const critic = context.representation.critic;
  if (critic === undefined) return { metrics: [], details: null };
  const { A, c } = critic;
  const target = Math.sqrt(1 + 1 / c);
  const singular = Array.from(symmetricEigen(multiplyTransA(A, A)).values, (v) =>
    Math.sqrt(Math.max(0, v)),
  );
  const ratios = singular.map((s) => s / target);
  const row = (metric: string, value: number): MetricRow =>
    metricRow('assumptions', metric, 'all', 'critic', value);
  const metrics = [
    row('critic_sv_ratio_min', Math.min(...ratios)),
    row('critic_sv_ratio_max', Math.max(...ratios)),
  ];
  const details: Record<string, unknown> = { singularValues: singular, target };
  const fitted = context.models.find((m) => m.source === 'fitted' && m.unit === 'jump');
  const criticModel = context.models.find((m) => m.source === 'critic');
  if (fitted !== undefined && criticModel !== undefined) {
    const fGap = relativeGap(fitted.model.F, criticModel.model.F);
    const qGap = relativeGap(fitted.model.Q, criticModel.model.Q);
    metrics.push(row('fitted_critic_f_gap', fGap), row('fitted_critic_q_gap', qGap));
    details.fittedVsCritic = { fGap, qGap };
  }
  return { metrics, details };
}

/** ‖X - Y‖_F / ‖Y‖_F. */
function relativeGap(x: Mat, y: Mat): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < y.data.length; i++) {
    num += (x.data[i]! - y.data[i]!) ** 2;
    den += y.data[i]! ** 2;
  }
  return Math.sqrt(num / den);
}
