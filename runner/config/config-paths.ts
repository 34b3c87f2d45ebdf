import { isPlainObject, mergeDeep } from './deep-merge.ts';

/** Reads the value at dotted `segments` of a config object. */
export function readAtPath(config: unknown, segments: readonly string[]): unknown {
  let cursor = config;
  for (const segment of segments) {
    if (!isPlainObject(cursor)) return undefined;
    cursor = cursor[segment];
  }
  return cursor;
}

/**
 * Writes `value` at dotted `segments` of `config` (in place). A mapping value is merged over
 * the mapping already there, so an axis over `data` may list only what differs.
 */
export function writeAtPath(
  config: Record<string, unknown>,
  segments: readonly string[],
  value: unknown,
): void {
  let cursor = config;
  segments.slice(0, -1).forEach((segment) => {
    if (!isPlainObject(cursor[segment])) cursor[segment] = {};
    cursor = cursor[segment] as Record<string, unknown>;
  });
  const last = segments[segments.length - 1] ?? '';
  cursor[last] =
    isPlainObject(value) && isPlainObject(cursor[last])
      ? mergeDeep(cursor[last], value)
      : structuredClone(value);
}
