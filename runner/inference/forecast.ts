/**
 * Forecasts: the distribution after n applications of a transition model (MATH.md §2).
 * Mean μ̄ + Fⁿ (ψ₀ − μ̄); covariance Σ_{j<n} F^j Q F^{jᵀ} (for a critic model,
 * m Σ_{j<n} (mA)^j (mA)^{jᵀ}) — the linear-Gaussian marginal of Bishop, PRML eq. 2.115,
 * applied n times. For a model fitted on consecutive steps, n jumps are n environment steps.
 */
import type { Gaussian, TransitionModel } from './api.ts';
import type { Mat } from '../numeric/matrix.ts';
import { identity, zeros } from '../numeric/matrix.ts';
import {
  multiply,
  multiplyTransB,
  multiplyTransBInto,
  symmetrizeInPlace,
} from '../numeric/linalg/multiply.ts';
import { centreRows, checkFinite, checkInteger, checkLength, checkModel } from './validate.ts';

/** Fⁿ and the n-jump covariance Σ_{j<n} F^j Q F^{jᵀ} (zero for n = 0); shared by every start. */
export function jumpMoments(model: TransitionModel, n: number): { power: Mat; cov: Mat } {
  checkModel(model, 'jumpMoments');
  checkInteger('jumpMoments: n', n, 0);
  const d = model.dim;
  let power = identity(d);
  let cov = zeros(d, d);
  // S_{k+1} = F S_k Fᵀ + Q: the covariance recursion of a linear-Gaussian chain.
  for (let k = 0; k < n; k++) {
    const next = multiplyTransB(multiply(model.F, cov), model.F);
    for (let i = 0; i < next.data.length; i++) next.data[i] = next.data[i]! + model.Q.data[i]!;
    cov = symmetrizeInPlace(next);
    power = multiply(model.F, power);
  }
  return { power, cov };
}

/** Distribution after n jumps from one start ([dim]). */
export function forecast(model: TransitionModel, start: ArrayLike<number>, n: number): Gaussian {
  const { means, cov } = forecastBatch(model, start, 1, n);
  return { mean: means, cov };
}

/**
 * Distributions after n jumps from `count` starts ([count, dim]): means [count, dim] and
 * the one covariance they share (it does not depend on the start).
 */
export function forecastBatch(
  model: TransitionModel,
  starts: ArrayLike<number>,
  count: number,
  n: number,
): { means: Float64Array; cov: Mat } {
  checkModel(model, 'forecastBatch');
  const d = model.dim;
  checkInteger('forecastBatch: count', count, 0);
  checkLength('forecastBatch: starts', starts.length, count * d, `[${count}, ${d}]`);
  checkFinite('forecastBatch: starts', starts, d);
  const { power, cov } = jumpMoments(model, n);
  const centred = centreRows(starts, count, d, model.mean); // [count, dim]
  const means = new Float64Array(count * d); // [count, dim] = (ψ₀ − μ̄) Fⁿᵀ + μ̄
  multiplyTransBInto(centred, power.data, means, count, d, d);
  for (let i = 0; i < count; i++) {
    for (let j = 0; j < d; j++) means[i * d + j] = means[i * d + j]! + model.mean[j]!;
  }
  return { means, cov };
}
