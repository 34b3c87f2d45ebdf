import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../../runner/data/load-dataset.ts';
import { LORENZ_PARAMS, lorenzField } from '../../../runner/data/physics/lorenz63.ts';
import { makeDataConfig } from '../make-data-config.ts';

const { sigma, rho, beta } = LORENZ_PARAMS;

describe('Lorenz-63 (Lorenz, 1963)', () => {
  it('has the published parameters σ = 10, ρ = 28, β = 8/3', () => {
    expect([sigma, rho, beta]).toEqual([10, 28, 8 / 3]);
  });

  it.each([
    [0, 0, 0],
    [Math.sqrt(beta * (rho - 1)), Math.sqrt(beta * (rho - 1)), rho - 1],
    [-Math.sqrt(beta * (rho - 1)), -Math.sqrt(beta * (rho - 1)), rho - 1],
  ])(
    '(%f, %f, %f) is an equilibrium (Lorenz, 1963, fixed points C, C′ and the origin)',
    (x, y, z) => {
      const out = new Float64Array(3);
      lorenzField()(0, Float64Array.of(x, y, z), out);
      for (const v of out) expect(Math.abs(v)).toBeLessThan(1e-12);
    },
  );

  it('a non-equilibrium point moves', () => {
    const out = new Float64Array(3);
    lorenzField()(0, Float64Array.of(1, 2, 3), out);
    expect(Math.hypot(...out)).toBeGreaterThan(1);
  });

  it('trajectories stay in the absorbing ball and visit both wings', async () => {
    const ds = await loadDataset(
      makeDataConfig({ source: 'lorenz', episodes: 12, steps: 400, obsDim: 6, standardise: false }),
      '.',
    );
    // Lorenz (1963) bounds solutions with V = x² + y² + (z − σ − ρ)²: dV/dt < 0 outside an
    // ellipsoid, on which V ≤ β²(σ+ρ)²/(4(β−1)) for β ≥ 2, σ ≥ 1 (our derivation from his
    // Lyapunov function, maximising V over that ellipsoid) — so the ball V ≤ R² is invariant.
    const r2 = (beta ** 2 * (sigma + rho) ** 2) / (4 * (beta - 1));
    let left = 0;
    let right = 0;
    for (const ep of [...ds.train, ...ds.val, ...ds.test]) {
      for (let t = 0; t < ep.steps; t++) {
        const [x, y, z] = [ep.state![3 * t]!, ep.state![3 * t + 1]!, ep.state![3 * t + 2]!];
        expect(x * x + y * y + (z - sigma - rho) ** 2).toBeLessThanOrEqual(r2 * (1 + 1e-6));
        if (x > 0) right++;
        else left++;
      }
    }
    expect(Math.min(left, right)).toBeGreaterThan(0.2 * (left + right));
  });
});
