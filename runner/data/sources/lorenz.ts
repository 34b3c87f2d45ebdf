/**
 * Chaotic flow: the Lorenz-63 system (physics/lorenz63.ts) integrated with RK4 and lifted to
 * obsDim dimensions by a fixed random map of the scaled state z̃ = (x/8, y/9, (z − 25)/8):
 * o = W z̃ ('linear') or o = tanh(W z̃ + b) ('smooth', data.map). True state: (x, y, z).
 */
import type { DataConfig } from '../../config/types.ts';
import type { Rng } from '../../numeric/random.ts';
import type { Episode } from '../episode.ts';
import { lorenzField } from '../physics/lorenz63.ts';
import { integrate } from '../physics/rk4.ts';
import type { DataSourceImpl, SourceData } from '../source.ts';

/** Time units between samples when data.dt is 0. */
const DEFAULT_INTERVAL = 0.02;
/** Longest RK4 sub-step (common practice for Lorenz-63 with RK4). */
const MAX_STEP = 0.005;
/** Time units run from a random start before recording, to land on the attractor. */
const BURN_IN = 5;

function produce(config: DataConfig, rng: Rng): SourceData {
  const p = config.obsDim;
  const mapRng = rng.fork('map');
  const W = new Float64Array(p * 3); // [obsDim, 3]
  for (let i = 0; i < p * 3; i++) W[i] = mapRng.normal() / Math.sqrt(3);
  const bias = new Float64Array(p);
  for (let i = 0; i < p; i++) bias[i] = 0.5 * mapRng.normal();
  const smooth = config.map === 'smooth';
  const interval = config.dt > 0 ? config.dt : DEFAULT_INTERVAL;
  const field = lorenzField();
  const burnSamples = Math.ceil(BURN_IN / interval);
  const episodes: Episode[] = [];
  for (let e = 0; e < config.episodes; e++) {
    const start = Float64Array.of(10 * rng.normal(), 10 * rng.normal(), 25 + 10 * rng.normal());
    const warm = integrate(field, start, interval, burnSamples + 1, MAX_STEP).subarray(
      3 * burnSamples,
    );
    const traj = integrate(field, warm, interval, config.steps, MAX_STEP); // [steps, 3]
    const obs = new Float32Array(config.steps * p);
    for (let t = 0; t < config.steps; t++) {
      const z0 = traj[3 * t]! / 8;
      const z1 = traj[3 * t + 1]! / 9;
      const z2 = (traj[3 * t + 2]! - 25) / 8;
      for (let i = 0; i < p; i++) {
        const a = W[3 * i]! * z0 + W[3 * i + 1]! * z1 + W[3 * i + 2]! * z2;
        obs[t * p + i] = (smooth ? Math.tanh(a + bias[i]!) : a) + config.noise * rng.normal();
      }
    }
    episodes.push({
      obs,
      steps: config.steps,
      obsDim: p,
      state: Float32Array.from(traj),
      stateDim: 3,
    });
  }
  return {
    name: 'lorenz',
    description: `Lorenz-63 flow (σ=10, ρ=28, β=8/3) every ${interval} time units, ${config.map} lift to ${p} dims`,
    obsDim: p,
    stateDim: 3,
    episodes,
  };
}

/** The Lorenz source. */
export const lorenz: DataSourceImpl = {
  summary: 'Lorenz-63 chaotic flow lifted to obsDim by a fixed random map',
  produce,
};
