/**
 * The classical fourth-order Runge–Kutta step (Kutta, 1901; Press et al., Numerical
 * Recipes, 3rd ed., eq. 17.1.3) for an autonomous-or-not ODE y' = f(t, y).
 */

/** Right-hand side: writes dy/dt at (t, y) into `out`. */
export type VectorField = (t: number, y: Float64Array, out: Float64Array) => void;

/** Advances y by one step h in place; scratch buffers are allocated once per call site. */
export function createRk4Stepper(
  dim: number,
  f: VectorField,
): (t: number, y: Float64Array, h: number) => void {
  const k1 = new Float64Array(dim);
  const k2 = new Float64Array(dim);
  const k3 = new Float64Array(dim);
  const k4 = new Float64Array(dim);
  const tmp = new Float64Array(dim);
  return (t, y, h) => {
    f(t, y, k1);
    for (let i = 0; i < dim; i++) tmp[i] = y[i]! + 0.5 * h * k1[i]!;
    f(t + 0.5 * h, tmp, k2);
    for (let i = 0; i < dim; i++) tmp[i] = y[i]! + 0.5 * h * k2[i]!;
    f(t + 0.5 * h, tmp, k3);
    for (let i = 0; i < dim; i++) tmp[i] = y[i]! + h * k3[i]!;
    f(t + h, tmp, k4);
    for (let i = 0; i < dim; i++) y[i]! += (h / 6) * (k1[i]! + 2 * k2[i]! + 2 * k3[i]! + k4[i]!);
  };
}

/**
 * Integrates from y0 for `samples` samples spaced `interval` apart, with RK4 sub-steps no
 * longer than `maxStep`. Returns [samples, dim]; row 0 is y0.
 */
export function integrate(
  f: VectorField,
  y0: Float64Array,
  interval: number,
  samples: number,
  maxStep: number,
): Float64Array {
  const dim = y0.length;
  const sub = Math.max(1, Math.ceil(interval / maxStep - 1e-9));
  const h = interval / sub;
  const step = createRk4Stepper(dim, f);
  const y = Float64Array.from(y0);
  const out = new Float64Array(samples * dim);
  let t = 0;
  for (let s = 0; s < samples; s++) {
    out.set(y, s * dim);
    for (let k = 0; k < sub; k++) {
      step(t, y, h);
      t += h;
    }
  }
  return out;
}
