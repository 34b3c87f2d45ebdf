/**
 * `midpath compare`: does a candidate run do worse than a base run? For every group both
 * runs share (setting, method, suite, metric, source, level, unit), the change is measured
 * on a smaller-is-better scale (metric-direction.ts) and judged twice:
 *   1. practically — is it larger than the tolerance (relative to the base mean, or to the
 *      nominal value for coverage-like metrics)? Changes within it are "unchanged".
 *   2. statistically — a paired t-test when both runs hold the same seeds (same seeds, same
 *      evaluation tasks: MATH.md §4), else Welch's t-test, with Holm's (1979) adjustment over
 *      the comparisons that passed step 1, at level alpha.
 * A regression is a change beyond tolerance in the worse direction that is significant. With
 * one seed on either side no test is possible; such a change beyond tolerance counts, marked
 * "untested", so a one-seed baseline still guards something.
 */
import { holm, mean, pairedTTest, welchTTest } from '../../numeric/stats/index.ts';
import { summaryKey, type MetricSummary } from '../aggregate.ts';
import { badnessOf, metricDirection, type MetricDirection } from '../metric-direction.ts';

export type Verdict = 'regressed' | 'improved' | 'unchanged' | 'not-ranked';

export interface CompareOptions {
  /** Relative practical tolerance. (default 0.05) */
  tolerance: number;
  /** Family-wise significance level after Holm's adjustment. (default 0.05) */
  alpha: number;
}

export const DEFAULT_COMPARE: CompareOptions = { tolerance: 0.05, alpha: 0.05 };

export interface ComparisonRow {
  setting: Record<string, string>;
  method: string;
  suite: string;
  metric: string;
  source: string;
  level: number | string;
  unit: string;
  direction: MetricDirection['kind'];
  base: { n: number; mean: number };
  candidate: { n: number; mean: number };
  /** Change in badness relative to the scale (positive = worse); NaN when not ranked. */
  relativeChange: number;
  test: 'paired' | 'welch' | 'none';
  /** Holm-adjusted p-value; null when no test was run or possible. */
  p: number | null;
  verdict: Verdict;
}

export interface Comparison {
  options: CompareOptions;
  rows: ComparisonRow[];
  counts: Record<Verdict, number>;
  onlyInBase: number;
  onlyInCandidate: number;
}

/** Badness values aligned by seed when both sides hold the same seeds once each. */
function pairBySeed(a: MetricSummary, b: MetricSummary): [number[], number[]] | null {
  const sa = [...a.seeds].sort((x, y) => x - y);
  const sb = [...b.seeds].sort((x, y) => x - y);
  if (sa.length !== sb.length || new Set(sa).size !== sa.length) return null;
  if (sa.some((s, i) => s !== sb[i])) return null;
  const at = (s: MetricSummary, seed: number): number =>
    s.values[s.seeds.indexOf(seed)] ?? Number.NaN;
  return [sa.map((seed) => at(a, seed)), sa.map((seed) => at(b, seed))];
}

/** Scale a change is measured against: |base mean|, or the target for target metrics. */
function scaleOf(direction: MetricDirection, baseMean: number): number {
  const scale = direction.kind === 'target' ? direction.target : Math.abs(baseMean);
  return scale > 0 ? scale : 1;
}

interface Pending {
  row: ComparisonRow;
  p: number;
}

function judge(base: MetricSummary, cand: MetricSummary, options: CompareOptions): Pending {
  const direction = metricDirection(base.metric);
  const row: ComparisonRow = {
    setting: base.setting,
    method: base.method,
    suite: base.suite,
    metric: base.metric,
    source: base.source,
    level: base.level,
    unit: base.unit,
    direction: direction.kind,
    base: { n: base.n, mean: base.mean },
    candidate: { n: cand.n, mean: cand.mean },
    relativeChange: Number.NaN,
    test: 'none',
    p: null,
    verdict: 'not-ranked',
  };
  const bad = (v: number): number => badnessOf(v, direction) ?? Number.NaN;
  if (direction.kind === 'none') return { row, p: Number.NaN };
  const b = base.values.map(bad);
  const c = cand.values.map(bad);
  row.relativeChange = (mean(c) - mean(b)) / scaleOf(direction, base.mean);
  if (!(Math.abs(row.relativeChange) > options.tolerance)) {
    row.verdict = 'unchanged';
    return { row, p: Number.NaN };
  }
  row.verdict = row.relativeChange > 0 ? 'regressed' : 'improved';
  const paired = pairBySeed(base, cand);
  if (paired !== null && paired[0].length >= 2) {
    row.test = 'paired';
    return { row, p: pairedTTest(paired[0].map(bad), paired[1].map(bad)).p };
  }
  if (b.length >= 2 && c.length >= 2) {
    row.test = 'welch';
    return { row, p: welchTTest(b, c).p };
  }
  return { row, p: Number.NaN }; // one seed: untested, the tolerance alone decides
}

/** Compares two runs' aggregated summaries. */
export function compareSummaries(
  base: readonly MetricSummary[],
  candidate: readonly MetricSummary[],
  options: CompareOptions = DEFAULT_COMPARE,
): Comparison {
  const byKey = new Map(candidate.map((s) => [summaryKey(s), s]));
  const judged: Pending[] = [];
  for (const s of base) {
    const other = byKey.get(summaryKey(s));
    if (other !== undefined) judged.push(judge(s, other, options));
  }
  // Holm over the tests actually run (changes beyond tolerance with enough seeds).
  const tested = judged.filter((j) => j.row.test !== 'none');
  const adjusted = holm(tested.map((j) => (Number.isNaN(j.p) ? 1 : j.p)));
  tested.forEach((j, i) => {
    const p = adjusted[i] ?? 1;
    j.row.p = p;
    if (!(p < options.alpha)) j.row.verdict = 'unchanged';
  });
  const rows = judged.map((j) => j.row);
  const counts: Record<Verdict, number> = {
    regressed: 0,
    improved: 0,
    unchanged: 0,
    'not-ranked': 0,
  };
  for (const row of rows) counts[row.verdict] += 1;
  const baseKeys = new Set(base.map((s) => summaryKey(s)));
  return {
    options,
    rows,
    counts,
    onlyInBase: base.length - rows.length,
    onlyInCandidate: candidate.filter((s) => !baseKeys.has(summaryKey(s))).length,
  };
}
