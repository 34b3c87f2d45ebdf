/**
 * Swinging lamp filmed from the side by a wall camera: a damped, driven pendulum (physics/pendulum.ts)
 * integrated with RK4 and rendered as image×image grayscale frames — a bright bulb on a
 * thin cord hanging from a hook at the frame centre. True state: angle θ ∈ (−π, π] and θ' (rad/s).
 */
import type { DataConfig } from '../../config/types.ts';
import type { Rng } from '../../numeric/random.ts';
import type { Episode } from '../episode.ts';
import { LAMP_PARAMS, pendulumField, wrapAngle } from '../physics/pendulum.ts';
import { integrate } from '../physics/rk4.ts';
import type { DataSourceImpl, SourceData } from '../source.ts';

/** Seconds between frames when data.dt is 0. */
const DEFAULT_FRAME_INTERVAL = 0.05;
/** Longest RK4 sub-step, seconds (error ≪ a pixel at these speeds; common practice). */
const MAX_STEP = 0.01;

/** Renders one frame of the lamp at angle θ into `out` ([side, side], values in [0, 1]). */
export function renderLamp(theta: number, side: number, out: Float32Array, offset = 0): void {
  const cx = side / 2;
  const cy = side / 2;
  const reach = 0.38 * side;
  const bx = cx + reach * Math.sin(theta);
  const by = cy + reach * Math.cos(theta); // rows grow downwards; θ = 0 hangs down
  const bulb = side / 12;
  for (let r = 0; r < side; r++) {
    for (let c = 0; c < side; c++) {
      const px = c + 0.5;
      const py = r + 0.5;
      const db2 = (px - bx) ** 2 + (py - by) ** 2;
      const bulbValue = Math.exp(-db2 / (2 * bulb * bulb));
      // Distance to the cord segment from the pivot to the bulb.
      const vx = bx - cx;
      const vy = by - cy;
      const u = Math.max(0, Math.min(1, ((px - cx) * vx + (py - cy) * vy) / (vx * vx + vy * vy)));
      const dc2 = (px - cx - u * vx) ** 2 + (py - cy - u * vy) ** 2;
      const cordValue = 0.5 * Math.exp(-dc2 / (2 * 0.35 * 0.35));
      out[offset + r * side + c] = Math.max(bulbValue, cordValue);
    }
  }
}

function produce(config: DataConfig, rng: Rng): SourceData {
  const side = config.image;
  const p = side * side;
  const interval = config.dt > 0 ? config.dt : DEFAULT_FRAME_INTERVAL;
  const episodes: Episode[] = [];
  for (let e = 0; e < config.episodes; e++) {
    const y0 = Float64Array.of(Math.PI * (2 * rng.next() - 1), rng.normal());
    const phase = 2 * Math.PI * rng.next();
    const traj = integrate(pendulumField(LAMP_PARAMS, phase), y0, interval, config.steps, MAX_STEP); // [steps, 2]
    const obs = new Float32Array(config.steps * p);
    const state = new Float32Array(config.steps * 2);
    for (let t = 0; t < config.steps; t++) {
      const theta = wrapAngle(traj[2 * t]!);
      renderLamp(theta, side, obs, t * p);
      for (let i = t * p; i < (t + 1) * p; i++) obs[i]! += config.noise * rng.normal();
      state[2 * t] = theta;
      state[2 * t + 1] = traj[2 * t + 1]!;
    }
    episodes.push({ obs, steps: config.steps, obsDim: p, state, stateDim: 2 });
  }
  return {
    name: 'swinging-lamp',
    description: `swinging lamp seen by a ${side}×${side} camera, a frame every ${interval} s`,
    obsDim: p,
    stateDim: 2,
    imageShape: [side, side],
    standardise: 'global',
    episodes,
  };
}

/** The swinging-lamp source. */
export const swingingLamp: DataSourceImpl = {
  summary: 'damped driven pendulum rendered as small grayscale camera frames',
  produce,
};
