/**
 * The Lorenz-63 flow (Lorenz, 1963, "Deterministic nonperiodic flow", J. Atmos. Sci. 20,
 * eqs. 25–27) with its published parameters σ = 10, ρ = 28, β = 8/3:
 *   x' = σ (y − x),  y' = x (ρ − z) − y,  z' = x y − β z.
 */
import type { VectorField } from './rk4.ts';

/** Parameters of the flow. */
export interface LorenzParams {
  sigma: number;
  rho: number;
  beta: number;
}

/** Lorenz's own values (Lorenz, 1963, p. 137). */
export const LORENZ_PARAMS: LorenzParams = { sigma: 10, rho: 28, beta: 8 / 3 };

/** dy/dt for y = (x, y, z). */
export function lorenzField(p: LorenzParams = LORENZ_PARAMS): VectorField {
  return (_t, v, out) => {
    const x = v[0]!;
    const y = v[1]!;
    const z = v[2]!;
    out[0] = p.sigma * (y - x);
    out[1] = x * (p.rho - z) - y;
    out[2] = x * y - p.beta * z;
  };
}
