import { canonicalJson } from '../config/canonical-json.ts';
import { isPlainObject } from '../config/deep-merge.ts';

/**
 * How each value of one axis appears in a job's `setting` (and so in table columns). Plain
 * values appear as they are. Mapping values (an axis over `data` listing dataset blocks)
 * appear as text: the block's `source` when the sources alone tell the blocks apart
 * (`linear-gaussian`, `rover-maze`); otherwise the values of the keys in which the blocks
 * differ, joined by `/` with `source` first (`rover-maze/long-corridors`). When even that
 * does not tell them apart, the block's canonical JSON is used.
 */
export function labelAxisValues(values: readonly unknown[]): unknown[] {
  if (!values.every(isPlainObject)) return [...values];
  const blocks = values as Record<string, unknown>[];
  const keys = [...new Set(blocks.flatMap((b) => Object.keys(b)))];
  const differing =
    blocks.length === 1
      ? keys
      : keys.filter((key) => new Set(blocks.map((b) => canonicalJson(b[key] ?? null))).size > 1);
  differing.sort((a, b) => Number(b === 'source') - Number(a === 'source'));
  const sources = blocks.map((b) => b.source);
  if (sources.every((s) => typeof s === 'string') && new Set(sources).size === blocks.length) {
    return sources;
  }
  const labels = blocks.map((block) =>
    differing
      .filter((key) => block[key] !== undefined)
      .map((key) => (typeof block[key] === 'string' ? block[key] : canonicalJson(block[key])))
      .join('/'),
  );
  const distinct = new Set(labels).size === labels.length && labels.every((l) => l !== '');
  return distinct ? labels : blocks.map((b) => canonicalJson(b));
}
