/**
 * Linear-Gaussian system with a known model — the "greenhouse sensor array": a few slowly
 * drifting latent climate factors s (stateDim) read by obsDim sensors.
 *   s_{t+1} = F s_t + w_t,  w_t ~ N(0, Q),  s_0 ~ N(0, P)  (P the stationary covariance)
 *   o_t = h(s_t) + v_t,     v_t ~ N(0, noise² I)
 * with h(s) = H s ('linear') or h(s) = tanh(H s + b) ('smooth'). Everything an optimal
 * Kalman / Rauch–Tung–Striebel oracle needs is exposed as `model`.
 */
import type { DataConfig } from '../../config/types.ts';
import type { Rng } from '../../numeric/random.ts';
import type { Episode } from '../episode.ts';
import {
  cholesky,
  multiply,
  randomOrthogonal,
  sampleCorrelated,
  solveDiscreteLyapunov,
  transpose,
} from '../lin-alg.ts';
import type { DataSourceImpl, SourceData } from '../source.ts';

/** The latent system's matrices, drawn once per seed. */
export interface LinearSystem {
  n: number;
  /** [n, n] */
  F: Float64Array;
  /** [n, n] */
  Q: Float64Array;
  /** [n, n] stationary covariance, P = F P Fᵀ + Q. */
  P: Float64Array;
}

/**
 * Draws a stable F and an SPD Q. F = O B Oᵀ with O orthogonal and B block-diagonal with
 * damped rotations r [cos θ, −sin θ; sin θ, cos θ], r ∈ [0.85, 0.98], θ ∈ [0, 0.3]: F is
 * normal with ‖F‖₂ = max r < 1, so every trajectory decays — slow, oscillating factors.
 * Q = 0.1 (G Gᵀ / n + I) / 2 with G Gaussian keeps stationary variances of order one.
 */
export function drawLinearSystem(n: number, rng: Rng): LinearSystem {
  const b = new Float64Array(n * n);
  for (let i = 0; i < n; i += 2) {
    const r = 0.85 + 0.13 * rng.next();
    if (i + 1 < n) {
      const theta = 0.3 * rng.next();
      b[i * n + i] = r * Math.cos(theta);
      b[i * n + i + 1] = -r * Math.sin(theta);
      b[(i + 1) * n + i] = r * Math.sin(theta);
      b[(i + 1) * n + i + 1] = r * Math.cos(theta);
    } else {
      b[i * n + i] = r;
    }
  }
  const o = randomOrthogonal(n, rng);
  const F = multiply(multiply(o, b, n, n, n), transpose(o, n, n), n, n, n);
  const g = new Float64Array(n * n);
  for (let i = 0; i < n * n; i++) g[i] = rng.normal();
  const ggt = multiply(g, transpose(g, n, n), n, n, n);
  const Q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++)
      Q[i * n + j] = (0.1 * (ggt[i * n + j]! / n + (i === j ? 1 : 0))) / 2;
  }
  return { n, F, Q, P: solveDiscreteLyapunov(F, Q, n) };
}

/** Simulates `steps` latent states from the stationary law: [steps, n]. */
export function simulateLinearSystem(sys: LinearSystem, steps: number, rng: Rng): Float64Array {
  const { n, F } = sys;
  const lq = cholesky(sys.Q, n);
  const out = new Float64Array(steps * n);
  let s = sampleCorrelated(cholesky(sys.P, n), n, rng);
  for (let t = 0; t < steps; t++) {
    out.set(s, t * n);
    const w = sampleCorrelated(lq, n, rng);
    const next = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let acc = w[i]!;
      for (let j = 0; j < n; j++) acc += F[i * n + j]! * s[j]!;
      next[i] = acc;
    }
    s = next;
  }
  return out;
}

function produce(config: DataConfig, rng: Rng): SourceData {
  const n = config.stateDim;
  const p = config.obsDim;
  const sys = drawLinearSystem(n, rng.fork('system'));
  const mapRng = rng.fork('map');
  const H = new Float64Array(p * n); // [obsDim, stateDim]
  for (let i = 0; i < p * n; i++) H[i] = mapRng.normal() / Math.sqrt(n);
  const bias = new Float64Array(p);
  for (let i = 0; i < p; i++) bias[i] = 0.5 * mapRng.normal();
  const smooth = config.map === 'smooth';
  const observeRaw = (s: Float64Array): Float64Array => {
    const o = new Float64Array(p);
    for (let i = 0; i < p; i++) {
      let acc = 0;
      for (let j = 0; j < n; j++) acc += H[i * n + j]! * s[j]!;
      o[i] = smooth ? Math.tanh(acc + bias[i]!) : acc;
    }
    return o;
  };
  const simRng = rng.fork('episodes');
  const episodes: Episode[] = [];
  for (let e = 0; e < config.episodes; e++) {
    const states = simulateLinearSystem(sys, config.steps, simRng); // [steps, n]
    const obs = new Float32Array(config.steps * p);
    for (let t = 0; t < config.steps; t++) {
      const o = observeRaw(states.subarray(t * n, (t + 1) * n));
      for (let i = 0; i < p; i++) obs[t * p + i] = o[i]! + config.noise * simRng.normal();
    }
    episodes.push({
      obs,
      steps: config.steps,
      obsDim: p,
      state: Float32Array.from(states),
      stateDim: n,
    });
  }
  const R = new Float64Array(p * p);
  for (let i = 0; i < p; i++) R[i * p + i] = config.noise * config.noise;
  return {
    name: 'linear-gaussian',
    description: `greenhouse sensor array: ${n} latent factors, ${config.map} map to ${p} sensors`,
    obsDim: p,
    stateDim: n,
    episodes,
    model: {
      stateDim: n,
      F: sys.F,
      Q: sys.Q,
      stationary: sys.P,
      obsDim: p,
      map: config.map,
      R,
      observeRaw,
      ...(smooth ? {} : { H }),
    },
  };
}

/** The linear-Gaussian source. */
export const linearGaussian: DataSourceImpl = {
  summary: 'latent linear-Gaussian system with a known model (Kalman oracle available)',
  produce,
};
