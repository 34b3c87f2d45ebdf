/**
 * Assumption diagnostics (MATH.md §2 A1–A4 and §4): is the marginal of ψ close to N(0, cI),
 * and does the critic agree with the theory? Sampling tests run on a fixed-size random
 * subsample of the test encodings (eval.subsample, drawn from the evaluation seed) so a large
 * test set does not reject by sheer size, and each reports an effect size beside its p-value.
 * Consecutive steps are correlated; the subsample spreads draws over episodes, but the
 * p-values still assume independent rows and are best read through the effect sizes.
 */
import type { Mat } from '../../numeric/matrix.ts';
import { symmetricEigen } from '../../numeric/linalg/index.ts';
import {
  chiSquareTail,
  henzeZirkler,
  holm,
  kolmogorovSmirnov,
  mardia,
  normalCdf,
} from '../../numeric/stats/index.ts';
import type { MetricRow } from '../metric.ts';
import { metricRow, type EvalContext, type SuiteOutput } from '../context.ts';
import { sampleCovariance } from '../moments.ts';
import { taskRng } from '../tasks.ts';
import { criticRows } from './critic-checks.ts';

const row = (metric: string, value: number, n?: number): MetricRow =>
  metricRow('assumptions', metric, 'all', '', value, n === undefined ? {} : { n });

/** Runs the assumption diagnostics. */
export function runAssumptionsSuite(context: EvalContext): SuiteOutput {
  const { dim, scale } = context;
  const { data: X, rows: n } = subsampleCodes(context);
  const metrics: MetricRow[] = [];
  const details: Record<string, unknown> = { n, dim, scale };
  if (n > dim + 1) {
    metrics.push(...ksRows(X, n, dim, scale, details));
    try {
      metrics.push(...multivariateRows(X, n, dim, details));
    } catch (error) {
      // A degenerate representation (a constant or collinear dimension) has a singular
      // covariance: the multivariate tests do not apply, and the eigenvalues below say why.
      details.skipped = `multivariate normality tests: ${(error as Error).message}`;
    }
    metrics.push(...covarianceRows(X, n, dim, scale, details));
  } else {
    details.skipped = `subsample of ${n} rows is too small for ${dim} dimensions`;
  }
  const critic = criticRows(context);
  metrics.push(...critic.metrics);
  details.critic = critic.details;
  return { metrics, artifacts: details };
}

/** A uniform random subsample of every test step, without replacement: [rows, dim]. */
function subsampleCodes(context: EvalContext): { data: Float64Array; rows: number } {
  const { dim } = context;
  const index: [number, number][] = [];
  context.test.forEach((e, ep) => {
    for (let t = 0; t < e.steps; t++) index.push([ep, t]);
  });
  const rows = Math.min(context.config.subsample, index.length);
  const rng = taskRng(context.config.seed, 'assumptions:subsample');
  for (let i = 0; i < rows; i++) {
    const j = i + rng.int(index.length - i);
    [index[i], index[j]] = [index[j]!, index[i]!];
  }
  const data = new Float64Array(rows * dim);
  for (let i = 0; i < rows; i++) {
    const [ep, t] = index[i]!;
    data.set(context.test[ep]!.codes.subarray(t * dim, (t + 1) * dim), i * dim);
  }
  return { data, rows };
}

function multivariateRows(
  X: Float64Array,
  n: number,
  d: number,
  details: Record<string, unknown>,
): MetricRow[] {
  const m = mardia(X, n, d);
  const hz = henzeZirkler(X, n, d);
  details.mardia = m;
  details.henzeZirkler = hz;
  return [
    // Effect sizes: b₁,d (0 under normality) and b₂,d / d(d+2) (1 under normality).
    row('mardia_skewness', m.skewness, n),
    row('mardia_skewness_p', m.pSkew, n),
    row('mardia_kurtosis_ratio', m.kurtosis / (d * (d + 2)), n),
    row('mardia_kurtosis_p', m.pKurt, n),
    row('hz_statistic', hz.statistic, n),
    row('hz_p', hz.p, n),
  ];
}

/** Per-dimension KS against N(0, c), Holm-corrected across dimensions. */
function ksRows(
  X: Float64Array,
  n: number,
  d: number,
  c: number,
  details: Record<string, unknown>,
): MetricRow[] {
  const sd = Math.sqrt(c);
  const stats: number[] = [];
  const pValues: number[] = [];
  const column = new Float64Array(n);
  for (let j = 0; j < d; j++) {
    for (let i = 0; i < n; i++) column[i] = X[i * d + j]!;
    const r = kolmogorovSmirnov(column, (x) => normalCdf(x / sd));
    stats.push(r.statistic);
    pValues.push(r.p);
  }
  const adjusted = Array.from(holm(pValues));
  details.ks = { statistic: stats, p: pValues, pHolm: adjusted };
  return [
    row('ks_max_statistic', Math.max(...stats), n),
    row('ks_min_p_holm', Math.min(...adjusted), n),
    row('ks_rejected_fraction', adjusted.filter((p) => p < 0.05).length / d, n),
  ];
}

/**
 * Eigenvalues of Cov(ψ)/c (all 1 under N(0, cI)), the Gaussian KL from N(μ̂, Σ̂) to N(0, cI)
 * per dimension (the moment KL of MATH.md §1) as the effect size, and the likelihood-ratio
 * test of Σ = cI (Anderson, "An Introduction to Multivariate Statistical Analysis", 3rd ed.,
 * 2003, §10.8: -2 log λ = ν [tr S/c - log det(S/c) - d] ~ χ² with d(d+1)/2 df, ν = n - 1).
 */
function covarianceRows(
  X: Float64Array,
  n: number,
  d: number,
  c: number,
  details: Record<string, unknown>,
): MetricRow[] {
  const { mean, cov } = sampleCovariance(X, n, d);
  const scaled: Mat = { rows: d, cols: d, data: cov.map((v) => v / c) };
  const { values } = symmetricEigen(scaled);
  const eig = Array.from(values);
  const min = Math.min(...eig);
  const max = Math.max(...eig);
  let trace = 0;
  let logDet = 0;
  for (const v of eig) {
    trace += v;
    logDet += Math.log(v);
  }
  let meanTerm = 0;
  for (const m of mean) meanTerm += (m * m) / c;
  const kl = 0.5 * (trace + meanTerm - d - logDet);
  const lrt = (n - 1) * (trace - logDet - d);
  details.covarianceEigenvalues = eig;
  return [
    row('cov_eig_min', min, n),
    row('cov_eig_max', max, n),
    row('cov_eig_spread', max / min, n),
    row('marginal_kl_per_dim', kl / d, n),
    row('cov_identity_p', chiSquareTail(lrt, (d * (d + 1)) / 2), n),
  ];
}
