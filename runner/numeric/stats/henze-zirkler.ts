/**
 * Henze & Zirkler (1990) test of multivariate normality ("A class of invariant consistent
 * tests for multivariate normality", Commun. Statist. Theory Meth. 19(10), 3595–3617): a
 * weighted L² distance between the empirical and the normal characteristic function.
 */
import { normalCdf } from './normal.ts';
import { whitenSample } from './whiten.ts';

export interface HenzeZirklerResult {
  /** HZ_β; about 0 under normality, larger is further from normal. */
  statistic: number;
  /** Upper-tail p-value from the log-normal approximation of HZ (Henze & Zirkler 1990, §3). */
  p: number;
}

/**
 * HZ statistic with the optimal smoothing β = ((2d+1) n / 4)^{1/(d+4)} / √2, on `X` [n, d]
 * row-major, covariance with divisor n.
 */
export function henzeZirkler(X: ArrayLike<number>, n: number, d: number): HenzeZirklerResult {
  const W = whitenSample(X, n, d); // [n, d]
  const beta = Math.pow(((2 * d + 1) * n) / 4, 1 / (d + 4)) / Math.SQRT2;
  const b2 = beta * beta;
  let pairSum = 0; // Σ_ij exp(-β²/2 · D_ij), D_ij = ‖w_i - w_j‖²
  let selfSum = 0; // Σ_i exp(-β²/(2(1+β²)) · D_i), D_i = ‖w_i‖²
  for (let i = 0; i < n; i++) {
    let di = 0;
    for (let a = 0; a < d; a++) di += W[i * d + a]! ** 2;
    selfSum += Math.exp((-b2 / (2 * (1 + b2))) * di);
    pairSum += 1; // j = i
    for (let j = i + 1; j < n; j++) {
      let dij = 0;
      for (let a = 0; a < d; a++) dij += (W[i * d + a]! - W[j * d + a]!) ** 2;
      pairSum += 2 * Math.exp((-b2 / 2) * dij);
    }
  }
  const statistic = pairSum / n - 2 * (1 + b2) ** (-d / 2) * selfSum + n * (1 + 2 * b2) ** (-d / 2);
  return { statistic, p: henzeZirklerPValue(statistic, beta, d) };
}

/** Log-normal approximation with the null mean and variance of HZ (Henze & Zirkler 1990, Thm 2.1). */
function henzeZirklerPValue(hz: number, beta: number, d: number): number {
  const b2 = beta * beta;
  const b4 = b2 * b2;
  const b8 = b4 * b4;
  const a = 1 + 2 * b2;
  const w = (1 + b2) * (1 + 3 * b2);
  const mu = 1 - a ** (-d / 2) * (1 + (d * b2) / a + (d * (d + 2) * b4) / (2 * a * a));
  const variance =
    2 * (1 + 4 * b2) ** (-d / 2) +
    2 * a ** -d * (1 + (2 * d * b4) / (a * a) + (3 * d * (d + 2) * b8) / (4 * a ** 4)) -
    4 * w ** (-d / 2) * (1 + (3 * d * b4) / (2 * w) + (d * (d + 2) * b8) / (2 * w * w));
  const logMean = Math.log(Math.sqrt(mu ** 4 / (variance + mu * mu)));
  const logSd = Math.sqrt(Math.log((variance + mu * mu) / (mu * mu)));
  return 1 - normalCdf((Math.log(hz) - logMean) / logSd);
}
