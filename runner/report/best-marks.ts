/**
 * Marks the best row of each comparison group — the same setting, suite, metric, source and
 * level across methods — and the rows tied with it: rows whose 95 % interval overlaps the
 * best row's interval (Cumming and Finch, 2005, note that overlap is a conservative reading;
 * we use it as a plain, visible rule). Without intervals (one seed) only equal means tie.
 * Oracle rows are never marked.
 */
import { summaryKey, type MetricSummary } from './aggregate.ts';
import { badnessOf, metricDirection } from './metric-direction.ts';

export type BestMark = 'best' | 'tie' | '';

/** Badness interval of a summary (smaller is better), or null when the metric has no direction. */
function badnessRange(s: MetricSummary): { mid: number; lo: number; hi: number } | null {
  const direction = metricDirection(s.metric);
  const mid = badnessOf(s.mean, direction);
  if (mid === null) return null;
  const a = badnessOf(s.ciLow, direction) ?? Number.NaN;
  const b = badnessOf(s.ciHigh, direction) ?? Number.NaN;
  if (!Number.isFinite(a) || !Number.isFinite(b)) return { mid, lo: mid, hi: mid };
  if (direction.kind === 'target' && s.ciLow <= direction.target && direction.target <= s.ciHigh) {
    // The interval straddles the target: the badness interval starts at zero.
    return { mid, lo: 0, hi: Math.max(a, b) };
  }
  return { mid, lo: Math.min(a, b), hi: Math.max(a, b) };
}

function groupKey(s: MetricSummary): string {
  return summaryKey({ ...s, method: '' });
}

/** Mark of every summary, by `summaryKey`. Groups with a single method get no mark. */
export function markBest(summaries: readonly MetricSummary[]): Map<string, BestMark> {
  const groups = new Map<string, MetricSummary[]>();
  for (const s of summaries) {
    const key = groupKey(s);
    const list = groups.get(key) ?? [];
    list.push(s);
    groups.set(key, list);
  }
  const marks = new Map<string, BestMark>();
  for (const list of groups.values()) {
    // Oracle rows (`*_oracle`) are the true model, the same for every method by
    // construction: a reference, never ranked.
    const ranged = list
      .filter((s) => !s.metric.endsWith('_oracle'))
      .map((s) => ({ s, r: badnessRange(s) }))
      .filter((x): x is { s: MetricSummary; r: NonNullable<typeof x.r> } => x.r !== null);
    if (ranged.length < 2) continue;
    let best = ranged[0];
    for (const x of ranged) if (best === undefined || x.r.mid < best.r.mid) best = x;
    if (best === undefined) continue;
    for (const x of ranged) {
      const overlaps = x.r.lo <= best.r.hi && best.r.lo <= x.r.hi;
      const mark: BestMark = x === best ? 'best' : overlaps ? 'tie' : '';
      marks.set(summaryKey(x.s), mark);
    }
  }
  return marks;
}
