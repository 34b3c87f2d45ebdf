import { canonicalJson } from '../config/canonical-json.ts';
import { isPlainObject } from '../config/deep-merge.ts';

/** Keys tried first when naming a mapping on an axis: they usually say what the block is. */
const NAMING_KEYS = ['source', 'kind', 'name'];

function showValue(value: unknown): string {
  return typeof value === 'string' ? value : canonicalJson(value);
}

/**
 * How each value of one axis appears in a job's `setting` (and so in table columns). Plain
 * values appear as they are. Mapping values (an axis over `data` listing dataset blocks)
 * appear as text: the value of the first key that alone tells the blocks apart — `source`,
 * then `kind`, then `name`, then the others in order (`linear-gaussian`, `rover-maze`);
 * failing that, the values of every key in which the blocks differ, joined by `/`
 * (`rover-maze/long-corridors`); failing that, the block's canonical JSON.
 */
export function labelAxisValues(values: readonly unknown[]): unknown[] {
  if (!values.every(isPlainObject)) return [...values];
  const blocks = values as Record<string, unknown>[];
  const keys = [...new Set(blocks.flatMap((b) => Object.keys(b)))];
  const ordered = [
    ...NAMING_KEYS.filter((k) => keys.includes(k)),
    ...keys.filter((k) => !NAMING_KEYS.includes(k)),
  ];
  const differing =
    blocks.length === 1
      ? ordered
      : ordered.filter((key) => new Set(blocks.map((b) => canonicalJson(b[key] ?? null))).size > 1);
  for (const key of differing) {
    const shown = blocks.map((b) => (b[key] === undefined ? '' : showValue(b[key])));
    if (shown.every((s) => s !== '') && new Set(shown).size === blocks.length) return shown;
  }
  const labels = blocks.map((block) =>
    differing
      .filter((key) => block[key] !== undefined)
      .map((key) => showValue(block[key]))
      .join('/'),
  );
  const distinct = new Set(labels).size === labels.length && labels.every((l) => l !== '');
  return distinct ? labels : blocks.map((b) => canonicalJson(b));
}
