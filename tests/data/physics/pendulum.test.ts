import { describe, expect, it } from 'vitest';
import { pendulumField, wrapAngle } from '../../../runner/data/physics/pendulum.ts';
import type { PendulumParams } from '../../../runner/data/physics/pendulum.ts';
import { integrate } from '../../../runner/data/physics/rk4.ts';

const free: PendulumParams = { g: 9.81, length: 0.8, damping: 0, drive: 0, driveFrequency: 0 };

/** Mean period from upward zero crossings of θ, linearly interpolated. */
function measurePeriod(theta0: number, p: PendulumParams): number {
  const dt = 0.001;
  const samples = 8000;
  const traj = integrate(pendulumField(p), Float64Array.of(theta0, 0), dt, samples, dt);
  const crossings: number[] = [];
  for (let i = 1; i < samples; i++) {
    const a = traj[2 * (i - 1)]!;
    const b = traj[2 * i]!;
    if (a < 0 && b >= 0) crossings.push((i - 1 + a / (a - b)) * dt);
  }
  return (crossings[crossings.length - 1]! - crossings[0]!) / (crossings.length - 1);
}

describe('swinging-lamp pendulum (RK4)', () => {
  it('undamped, undriven, small angle: period 2π√(L/g) (small-angle law)', () => {
    const expected = 2 * Math.PI * Math.sqrt(free.length / free.g);
    // At θ0 = 0.01 the finite-amplitude correction is θ0²/16 ≈ 6e-6 (Landau & Lifshitz,
    // Mechanics, §11 problem 1a), below the tolerance.
    expect(Math.abs(measurePeriod(0.01, free) / expected - 1)).toBeLessThan(5e-5);
  });

  it('at 90° amplitude the period is 1.18034 × 2π√(L/g) (complete elliptic integral: T = 4√(L/g) K(sin 45°))', () => {
    // 2K(1/√2)/π = 1.18034 (value from memory; Abramowitz & Stegun table 17.1 gives K(m=0.5) = 1.854075).
    const expected = 2 * Math.PI * Math.sqrt(free.length / free.g) * 1.18034;
    expect(Math.abs(measurePeriod(Math.PI / 2, free) / expected - 1)).toBeLessThan(1e-4);
  });

  it('damping without drive dissipates energy monotonically', () => {
    const p = { ...free, damping: 0.3 };
    const traj = integrate(pendulumField(p), Float64Array.of(2, 0), 0.01, 2000, 0.01);
    const w2 = p.g / p.length;
    let prev = Infinity;
    for (let i = 0; i < 2000; i += 10) {
      const e = 0.5 * traj[2 * i + 1]! ** 2 + w2 * (1 - Math.cos(traj[2 * i]!));
      expect(e).toBeLessThanOrEqual(prev + 1e-12);
      prev = e;
    }
  });

  it('wrapAngle maps to (−π, π]', () => {
    expect(wrapAngle(Math.PI)).toBeCloseTo(Math.PI, 12);
    expect(wrapAngle(-Math.PI)).toBeCloseTo(Math.PI, 12);
    expect(wrapAngle((3 * Math.PI) / 2)).toBeCloseTo(-Math.PI / 2, 12);
    expect(wrapAngle(0.3 + 4 * Math.PI)).toBeCloseTo(0.3, 12);
  });
});
