/**
 * Which way is better for each metric, by name. Used to mark the best row of a table and to
 * decide whether a change between two runs is a regression. The rules are tried in order and
 * the first match wins; docs/report.md lists them. A metric with no rule has no direction:
 * it is shown, but never marked best and never counted as a regression.
 */

export type MetricDirection =
  | { kind: 'lower' }
  | { kind: 'higher' }
  /** Closeness to a nominal value is better, e.g. coverage_90 should be 0.90. */
  | { kind: 'target'; target: number }
  | { kind: 'none' };

interface DirectionRule {
  pattern: RegExp;
  direction: (match: RegExpMatchArray) => MetricDirection;
  why: string;
}

const lower = (): MetricDirection => ({ kind: 'lower' });
const higher = (): MetricDirection => ({ kind: 'higher' });
const none = (): MetricDirection => ({ kind: 'none' });

/** The ordered rule list; exported so the docs and the tests read the same table. */
export const DIRECTION_RULES: readonly DirectionRule[] = [
  {
    pattern: /(^|_)coverage_(\d+)$/,
    direction: (m) => ({ kind: 'target', target: Number(m[2]) / 100 }),
    why: 'coverage at p % should equal p / 100 (closer is better)',
  },
  {
    pattern: /(kurtosis_ratio|sv_ratio_min|sv_ratio_max)$/,
    direction: () => ({ kind: 'target', target: 1 }),
    why: 'ratios to the value the Gaussian / stationary model predicts should be 1',
  },
  {
    pattern: /(^|_)(p|pvalue|p_value|statistic|count|n|min|max)(_holm|_bh)?$/,
    direction: none,
    why: 'p-values, raw test statistics, counts and extreme eigenvalues are evidence, not quality',
  },
  {
    pattern: /(success|skill|accuracy|acc|mrr|recall|top\d+|auc)(_|$)/,
    direction: higher,
    why: 'success rates, skill scores, accuracies, top-k and reciprocal-rank scores',
  },
  {
    pattern:
      /(nmse|mse|rmse|mae|error|nll|loss|rank|spread|skew|skewness|kurt|ks|kl|gap|distance|steps|length_ratio|rejected)(_|$)/,
    direction: lower,
    why: 'errors, negative log-likelihoods, losses, ranks, gaps and departures from Gaussianity',
  },
];

/** The direction of `metric`, from the first rule whose pattern matches its name. */
export function metricDirection(metric: string): MetricDirection {
  for (const rule of DIRECTION_RULES) {
    const match = metric.match(rule.pattern);
    if (match) return rule.direction(match);
  }
  return { kind: 'none' };
}

/**
 * How bad a value is on a scale where smaller is better, or null without a direction.
 * Lower → the value; higher → its negation; target → the distance to the target.
 */
export function badnessOf(value: number, direction: MetricDirection): number | null {
  switch (direction.kind) {
    case 'lower':
      return value;
    case 'higher':
      return -value;
    case 'target':
      return Math.abs(value - direction.target);
    case 'none':
      return null;
  }
}
