/**
 * Plain readings of the calibration and assumption metrics: holds / doubtful / fails, each
 * rule with its threshold in words so the reader can disagree with it. The thresholds are
 * Midpath's conventions, not laws: p-value cut-offs follow the usual 0.05 / 0.01 levels
 * (common practice); effect-size bands are chosen so that "holds" means a departure too small
 * to change a forecast's interval noticeably. Large samples reject tiny departures, which is
 * why the evaluation tests on fixed-size subsamples and why effect sizes get their own rules
 * (MATH.md §4).
 */

export type Reading = 'holds' | 'doubtful' | 'fails';

export interface DiagnosticRule {
  pattern: RegExp;
  /** The threshold in words, shown beside the reading. */
  threshold: (match: RegExpMatchArray) => string;
  read: (value: number, match: RegExpMatchArray) => Reading;
}

/** holds when |value - target| ≤ a, doubtful when ≤ b, else fails. */
function band(distance: number, a: number, b: number): Reading {
  return distance <= a ? 'holds' : distance <= b ? 'doubtful' : 'fails';
}

/** The ordered rules; the first match wins. Metrics with no rule are shown without a reading. */
export const DIAGNOSTIC_RULES: readonly DiagnosticRule[] = [
  {
    pattern: /(^|_)coverage_(\d+)$/,
    threshold: (m) =>
      `holds within 0.05 of ${Number(m[2]) / 100}, doubtful within 0.10, else fails`,
    read: (v, m) => band(Math.abs(v - Number(m[2]) / 100), 0.05, 0.1),
  },
  {
    // p-values of normality / identity tests on a fixed subsample (Holm-corrected where named).
    pattern: /(^|_)p(_holm|_bh)?$/,
    threshold: () => 'holds when p ≥ 0.05, doubtful when 0.01 ≤ p < 0.05, fails when p < 0.01',
    read: (v) => (v >= 0.05 ? 'holds' : v >= 0.01 ? 'doubtful' : 'fails'),
  },
  {
    pattern: /(kurtosis_ratio|sv_ratio_min|sv_ratio_max)$/,
    threshold: () => 'should be 1: holds within 0.10, doubtful within 0.25, else fails',
    read: (v) => band(Math.abs(v - 1), 0.1, 0.25),
  },
  {
    pattern: /_gap$/,
    threshold: () => 'relative gap: holds ≤ 0.10, doubtful ≤ 0.25, else fails',
    read: (v) => band(v, 0.1, 0.25),
  },
  {
    pattern: /^ks_max_statistic$/,
    threshold: () => 'largest per-dimension KS distance: holds ≤ 0.05, doubtful ≤ 0.10, else fails',
    read: (v) => band(v, 0.05, 0.1),
  },
  {
    pattern: /rejected_fraction$/,
    threshold: () => 'share of dimensions rejected: holds at 0, doubtful ≤ 0.25, else fails',
    read: (v) => band(v, 0, 0.25),
  },
  {
    pattern: /eig_spread$/,
    threshold: () =>
      'largest / smallest eigenvalue of Cov(ψ)/c: holds ≤ 2, doubtful ≤ 4, else fails',
    read: (v) => band(v, 2, 4),
  },
  {
    pattern: /kl_per_dim$/,
    threshold: () => 'KL to N(0, cI) per dimension: holds ≤ 0.05, doubtful ≤ 0.20, else fails',
    read: (v) => band(v, 0.05, 0.2),
  },
];

/** The reading of `metric` at `value`, or null when no rule covers the metric. */
export function readDiagnostic(
  metric: string,
  value: number,
): { reading: Reading; threshold: string } | null {
  if (!Number.isFinite(value)) return null;
  for (const rule of DIAGNOSTIC_RULES) {
    const match = metric.match(rule.pattern);
    if (match) return { reading: rule.read(value, match), threshold: rule.threshold(match) };
  }
  return null;
}
