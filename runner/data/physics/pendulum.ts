/**
 * The damped, driven pendulum of the swinging-lamp dataset:
 *   θ'' = −(g/L) sin θ − b θ' + A cos(ω_d t)
 * (e.g. Baker & Gollub, "Chaotic Dynamics: An Introduction", 2nd ed., 1996, eq. 1.3, in
 * dimensional form). θ = 0 hangs straight down. For b = A = 0 and small θ the period is
 * 2π√(L/g) (the small-angle law, any mechanics textbook).
 */
import type { VectorField } from './rk4.ts';

/** Physical parameters, SI units. */
export interface PendulumParams {
  /** Gravity, m/s². */
  g: number;
  /** Length, m. */
  length: number;
  /** Damping rate b, 1/s. */
  damping: number;
  /** Drive amplitude A, rad/s². */
  drive: number;
  /** Drive angular frequency ω_d, rad/s. */
  driveFrequency: number;
}

/** The lamp: a 1 m cord, light damping, a gentle draught pushing near resonance. */
export const LAMP_PARAMS: PendulumParams = {
  g: 9.81,
  length: 1,
  damping: 0.15,
  drive: 1.2,
  driveFrequency: 2.5,
};

/** dy/dt for y = (θ, θ'); `phase` shifts the drive, cos(ω_d t + phase). */
export function pendulumField(p: PendulumParams, phase = 0): VectorField {
  const w2 = p.g / p.length;
  return (t, y, out) => {
    out[0] = y[1]!;
    out[1] =
      -w2 * Math.sin(y[0]!) - p.damping * y[1]! + p.drive * Math.cos(p.driveFrequency * t + phase);
  };
}

/** θ wrapped to (−π, π]. */
export function wrapAngle(theta: number): number {
  const w = theta - 2 * Math.PI * Math.floor((theta + Math.PI) / (2 * Math.PI));
  return w === -Math.PI ? Math.PI : w;
}
