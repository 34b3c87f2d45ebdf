/**
 * Forecasts (MATH.md §2): the critic n-jump formula mean (mA)ⁿψ₀, covariance
 * m Σ_{j<n} (mA)^j (mA)^{jᵀ}, evaluated independently in mathjs; the batched forecast equals
 * one-by-one forecasts; and the Gaussian marginal of Bishop PRML eq. 2.115 for one jump.
 */
import { describe, expect, it } from 'vitest';
import { criticTransition, forecast, forecastBatch } from '../../runner/inference/index.ts';
import {
  add,
  eye,
  maxDiff,
  mm,
  randomMat,
  randomVec,
  toDense,
  tr,
  col,
  type Dense,
} from './helpers/dense-oracle.ts';

describe('forecast, critic-derived model', () => {
  it.each([0, 1, 3, 8])('n = %s matches (mA)ⁿψ₀ and m Σ_{j<n} (mA)^j (mA)^{jᵀ}', (n) => {
    const d = 4;
    const c = 2.5;
    const m = c / (c + 1);
    const A = randomMat(d, 51, 0.5);
    const start = randomVec(d, 52);
    const mA = toDense(A).map((r) => r.map((v) => m * v));
    let power = eye(d);
    let cov: Dense = eye(d, 0);
    for (let j = 0; j < n; j++) {
      cov = add(
        cov,
        mm(power, tr(power)).map((r) => r.map((v) => m * v)),
      );
      power = mm(mA, power);
    }
    const mean = mm(power, col(start)).map((r) => r[0]!);
    const out = forecast(criticTransition(A, c), start, n);
    expect(maxDiff(out.mean, mean)).toBeLessThan(1e-12);
    expect(maxDiff(out.cov.data, cov.flat())).toBeLessThan(1e-12);
  });

  it('one jump is the linear-Gaussian marginal N(Fψ₀, Q) (Bishop eq. 2.115 with a point prior)', () => {
    const model = criticTransition(randomMat(3, 53, 0.8), 1);
    const start = randomVec(3, 54);
    const out = forecast(model, start, 1);
    expect(maxDiff(out.mean, mm(toDense(model.F), col(start)).flat())).toBeLessThan(1e-14);
    expect(maxDiff(out.cov.data, model.Q.data)).toBe(0);
  });

  it('the batched forecast equals one-by-one forecasts and honours the model mean', () => {
    const d = 3;
    const model = {
      ...criticTransition(randomMat(d, 55, 0.6), 4),
      mean: Float64Array.from([1, 2, 3]),
    };
    const starts = randomVec(5 * d, 56);
    const batch = forecastBatch(model, starts, 5, 4);
    for (let q = 0; q < 5; q++) {
      const one = forecast(model, starts.subarray(q * d, (q + 1) * d), 4);
      expect(maxDiff(batch.means.subarray(q * d, (q + 1) * d), one.mean)).toBeLessThan(1e-14);
      expect(maxDiff(batch.cov.data, one.cov.data)).toBe(0);
    }
    // Starting at the mean stays at the mean: (ψ₀ − μ̄) = 0.
    expect(maxDiff(forecast(model, model.mean, 6).mean, model.mean)).toBeLessThan(1e-15);
  });
});
