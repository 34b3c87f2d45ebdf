import { inv, multiply } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { buildContext } from '../../runner/evaluation/build-context.ts';
import { tasksFor } from '../../runner/evaluation/context.ts';
import { runBridgeSuite } from '../../runner/evaluation/suites/bridge.ts';
import { evalConfig, identityRepresentation, stateDataset } from './fixtures.ts';

type Matrix = number[][];

/** Joint covariance of a stationary chain observed at `times`: blocks Cov(s_a, s_b). */
function jointCovariance(F: Matrix, P: Matrix, times: number[]): Matrix {
  const d = F.length;
  const power = (k: number): Matrix => {
    let out: Matrix = F.map((_, i) => F.map((__, j) => (i === j ? 1 : 0)));
    for (let i = 0; i < k; i++) out = multiply(F, out);
    return out;
  };
  const n = times.length;
  const big: Matrix = Array.from({ length: n * d }, () => new Array<number>(n * d).fill(0));
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      const lag = times[b]! - times[a]!;
      // s_later = F^k s_earlier + independent noise, so Cov(s_later, s_earlier) = F^k P and
      // Cov(s_earlier, s_later) = P (F^k)ᵀ, its transpose.
      const later = multiply(power(Math.abs(lag)), P);
      const cov = lag >= 0 ? later.map((_, i) => later.map((r) => r[i]!)) : later;
      for (let i = 0; i < d; i++)
        for (let j = 0; j < d; j++) big[a * d + i]![b * d + j] = cov[i]![j]!;
    }
  }
  return big;
}

describe('bridge_nmse_oracle', () => {
  it('equals Gaussian conditioning on the dense joint covariance (independent of the smoother)', () => {
    // Waypoints given both ends: E[s_mid | s_0, s_g] = Σ_mo Σ_oo⁻¹ [s_0; s_g] for a zero-mean
    // jointly Gaussian vector (Rasmussen & Williams 2006, eq. A.6), with the stationary
    // chain's covariances built from F and P (Brockwell & Davis 1991, §11.3). Dense, via mathjs.
    const dataset = stateDataset({ stateDim: 2, steps: 20, train: 4, test: 30, seed: 2 });
    const config = evalConfig({ transitions: [], waypoints: [3], queries: 40 });
    const context = buildContext(identityRepresentation(2), dataset, {
      config,
      discount: 0.8,
      scale: 1,
    });
    const rows = runBridgeSuite(context).metrics.filter((r) => r.metric === 'bridge_nmse_oracle');
    expect(rows.length).toBe(1);

    const d = 2;
    const model = dataset.model!;
    const F: Matrix = [0, 1].map((i) => [0, 1].map((j) => model.F[i * d + j]!));
    const P: Matrix = [0, 1].map((i) => [0, 1].map((j) => model.stationary[i * d + j]!));
    const big = jointCovariance(F, P, [0, 1, 2, 3, 4]); // s_0, three waypoints, s_4
    const observed = [0, 1, 8, 9];
    const hidden = [2, 3, 4, 5, 6, 7];
    const gain: Matrix = multiply(
      hidden.map((h) => observed.map((o) => big[h]![o]!)),
      inv(observed.map((a) => observed.map((b) => big[a]![b]!))),
    );

    const all = dataset.test.flatMap((e) => Array.from(e.state!));
    const mean = [0, 1].map(
      (j) => all.filter((_, i) => i % d === j).reduce((s, v) => s + v, 0) / (all.length / d),
    );
    const spread = [0, 1].reduce((s, j) => {
      const col = all.filter((_, i) => i % d === j);
      return s + col.reduce((t, v) => t + (v - mean[j]!) ** 2, 0) / (col.length - 1);
    }, 0);
    let total = 0;
    const tasks = tasksFor(context, 'bridge', 4, 'step');
    for (const task of tasks) {
      const state = dataset.test[task.episode]!.state!;
      const at = (k: number): number[] => [0, 1].map((j) => state[task.times[k]! * d + j]!);
      const o = [...at(0), ...at(4)];
      const mu = gain.map((row) => row.reduce((s, g, i) => s + g * o[i]!, 0));
      for (let k = 0; k < 3; k++) {
        const truth = at(k + 1);
        total += (mu[k * d]! - truth[0]!) ** 2 + (mu[k * d + 1]! - truth[1]!) ** 2;
      }
    }
    expect(rows[0]!.value).toBeCloseTo(total / (tasks.length * 3) / spread, 8);
  });
});
