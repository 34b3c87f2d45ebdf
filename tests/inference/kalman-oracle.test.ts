/**
 * Forecasts and bridges against the `kalman-filter` package (an independent registry
 * implementation of the Kalman predict/correct equations; Kalman, J. Basic Eng. 82, 1960).
 * The oracle's set-up is itself checked first on the scalar random walk with unit noises,
 * whose steady-state gain is 1/φ = 0.618034 (golden ratio; common textbook result).
 */
import { KalmanFilter, type State } from 'kalman-filter';
import { describe, expect, it } from 'vitest';
import { forecast, solveBridge, trueTransition } from '../../runner/inference/index.ts';
import {
  add,
  eye,
  maxDiff,
  mm,
  randomMat,
  randomVec,
  toDense,
  tr,
  type Dense,
} from './helpers/dense-oracle.ts';

const quiet = { info: () => {}, debug: () => {}, warn: () => {}, error: () => {} };
const zerosDense = (r: number, c: number): Dense =>
  Array.from({ length: r }, () => new Array<number>(c).fill(0));
const column = (v: ArrayLike<number>): Dense => Array.from(v, (x) => [x]);

/** A filter with time-varying (index-dependent) dynamics and an exactly known start. */
function makeFilter(
  dim: number,
  transition: (index: number) => Dense,
  noise: (index: number) => Dense,
  H: Dense,
  R: Dense,
  start: Dense,
): KalmanFilter {
  return new KalmanFilter({
    observation: { dimension: H.length, stateProjection: H, covariance: R },
    dynamic: {
      dimension: dim,
      transition: (o) => transition(o.index),
      covariance: (o) => noise(o.index),
      init: { mean: start, covariance: zerosDense(dim, dim), index: 0 },
    },
    logger: quiet,
  });
}

/** Runs `steps` prediction steps from the initial state (index 1 … steps). */
function predictSteps(filter: KalmanFilter, steps: number): State {
  let state: State | null = null;
  for (let i = 1; i <= steps; i++) state = filter.predict({ previousCorrected: state, index: i });
  if (state === null) throw new Error('predictSteps: steps must be ≥ 1');
  return state;
}

describe('oracle set-up: scalar random walk, unit noises', () => {
  it('reaches the steady-state gain 0.618034 (golden ratio; common textbook result)', () => {
    const filter = new KalmanFilter({
      observation: { dimension: 1, stateProjection: [[1]], covariance: [[1]] },
      dynamic: {
        dimension: 1,
        transition: [[1]],
        covariance: [[1]],
        init: { mean: [[0]], covariance: [[1]] },
      },
      logger: quiet,
    });
    let corrected: State | null = null;
    let predicted: State | null = null;
    for (let i = 0; i < 40; i++) {
      predicted = filter.predict({ previousCorrected: corrected });
      corrected = filter.correct({ predicted, observation: [[0]] });
    }
    // The gain is computed from the predicted covariance P⁻ = φ: K = φ/(φ + 1) = 1/φ.
    // (The package's asymptoticGain() feeds the corrected covariance instead and returns 0.382.)
    expect(filter.getGain({ predicted: predicted! })[0]![0]).toBeCloseTo(0.618034, 6);
  });
});

describe('forecast vs Kalman prediction steps', () => {
  it.each([1, 2, 5])('n = %s jumps: mean Fⁿψ₀ and covariance Σ_{j<n} F^j Q F^{jᵀ}', (n) => {
    const d = 3;
    const B = toDense(randomMat(d, 11, 0.4));
    const Q = add(mm(B, tr(B)), eye(d, 0.3));
    const model = trueTransition(randomMat(d, 12, 0.5), {
      rows: d,
      cols: d,
      data: Float64Array.from(Q.flat()),
    });
    const start = randomVec(d, 13);
    const F = toDense(model.F);
    const filter = makeFilter(
      d,
      () => F,
      () => Q,
      eye(d),
      eye(d),
      column(start),
    );
    const state = predictSteps(filter, n);
    const ours = forecast(model, start, n);
    expect(maxDiff(ours.mean, state.mean.flat())).toBeLessThan(1e-12);
    expect(maxDiff(ours.cov.data, state.covariance.flat())).toBeLessThan(1e-12);
  });
});

describe('bridge marginals vs a Kalman forward pass on an augmented state', () => {
  // State [ψ_t; z] (2d): z copies ψ_k when it is created and is then held fixed, so after
  // observing the goal ψ_{T+1} exactly (R = 0) the filter's z-block is p(ψ_k | ψ₀, ψ_g).
  it.each([
    { d: 2, T: 3 },
    { d: 3, T: 5 },
  ])('d = $d, T = $T: every waypoint mean and covariance agree', ({ d, T }) => {
    const B = toDense(randomMat(d, 21, 0.5));
    const Q = add(mm(B, tr(B)), eye(d, 0.4));
    const model = trueTransition(randomMat(d, 22, 0.7), {
      rows: d,
      cols: d,
      data: Float64Array.from(Q.flat()),
    });
    const F = toDense(model.F);
    const start = randomVec(d, 23);
    const goal = randomVec(d, 24);
    const post = solveBridge(model, start, goal, 1, T);
    const block = (a: Dense, b: Dense, c: Dense, e: Dense): Dense => [
      ...a.map((r, i) => [...r, ...b[i]!]),
      ...c.map((r, i) => [...r, ...e[i]!]),
    ];
    const Z = zerosDense(d, d);
    for (let k = 1; k <= T; k++) {
      const transition = (i: number): Dense =>
        i === k ? block(F, Z, F, Z) : block(F, Z, Z, eye(d));
      const noise = (i: number): Dense => (i === k ? block(Q, Q, Q, Q) : block(Q, Z, Z, Z));
      const H = eye(d).map((r) => [...r, ...new Array<number>(d).fill(0)]);
      const filter = makeFilter(2 * d, transition, noise, H, Z, column([...start, ...start]));
      const predicted = predictSteps(filter, T + 1);
      const corrected = filter.correct({ predicted, observation: column(goal) });
      const zMean = corrected.mean.slice(d).flat();
      const zCov = corrected.covariance.slice(d).map((r) => r.slice(d));
      expect(maxDiff(post.means.subarray((k - 1) * d, k * d), zMean)).toBeLessThan(1e-9);
      expect(maxDiff(post.covariances[k - 1]!.data, zCov.flat())).toBeLessThan(1e-9);
    }
  });
});
