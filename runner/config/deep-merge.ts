/** True for plain mappings (not arrays, not null). */
export function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/**
 * Merges `over` onto `base`: mappings merge key by key, recursively; lists and plain values
 * in `over` replace those of `base`. Neither input is modified.
 */
export function mergeDeep(base: unknown, over: unknown): unknown {
  if (!isPlainObject(base) || !isPlainObject(over)) return structuredClone(over);
  const out: Record<string, unknown> = structuredClone(base);
  for (const [key, value] of Object.entries(over)) {
    out[key] = key in out ? mergeDeep(out[key], value) : structuredClone(value);
  }
  return out;
}
