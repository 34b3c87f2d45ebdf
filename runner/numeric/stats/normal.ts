/**
 * Standard normal distribution function and its inverse.
 */
import { gammaQ } from './special.ts';

/** Standard normal density φ(x). */
export function normalPdf(x: number): number {
  return Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
}

/**
 * Standard normal distribution function Φ(x). Uses erfc(z) = Q(½, z²) (Abramowitz &
 * Stegun 6.5.17 with 7.1.2), so both tails keep full relative precision.
 */
export function normalCdf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  const z = (x * x) / 2;
  const tail = 0.5 * gammaQ(0.5, z); // P(N > |x|)
  return x < 0 ? tail : 1 - tail;
}

/**
 * Standard normal quantile Φ⁻¹(p). Starting value from Abramowitz & Stegun (1964) 26.2.23
 * (|error| < 4.5e-4), refined by Halley steps on the accurate Φ to machine precision.
 */
export function normalQuantile(p: number): number {
  if (Number.isNaN(p) || p < 0 || p > 1) return NaN;
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p > 0.5) return -normalQuantile(1 - p);
  // Lower tail: x < 0 and Φ(x) = p keeps relative precision here.
  const t = Math.sqrt(-2 * Math.log(p));
  let x = -(
    t -
    (2.515517 + 0.802853 * t + 0.010328 * t * t) /
      (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t)
  );
  for (let i = 0; i < 3; i++) {
    const e = normalCdf(x) - p;
    const u = e / normalPdf(x);
    // Halley's method for Φ(x) = p (Φ'' = -xφ).
    x -= u / (1 + (x * u) / 2);
  }
  return x;
}
