import type { ConfigPath } from './source-locations.ts';

/** The JSON type of a value, with integers told apart from other numbers. */
export function typeOfValue(value: unknown): string {
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'array';
  if (typeof value === 'number') return Number.isInteger(value) ? 'integer' : 'number';
  return typeof value;
}

/** A short, human description of a value for "got …" messages. */
export function describeValue(value: unknown): string {
  if (value === null || value === undefined) return 'nothing (null)';
  if (typeof value === 'string') return `text ${JSON.stringify(value)}`;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  if (Array.isArray(value))
    return value.length === 0 ? 'an empty list' : `a list of ${value.length}`;
  return 'a mapping';
}

/** Names a JSON Schema type the way users read it. */
export function describeType(type: string): string {
  const names: Record<string, string> = {
    integer: 'a whole number',
    number: 'a number',
    string: 'text',
    boolean: 'true or false',
    array: 'a list',
    object: 'a mapping',
    null: 'nothing',
  };
  return names[type] ?? type;
}

/** `data.split.train`, `methods[1].label`: how a config path reads in messages. */
export function formatPath(path: ConfigPath): string {
  let out = '';
  for (const segment of path) {
    if (typeof segment === 'number') out += `[${segment}]`;
    else out += out === '' ? segment : `.${segment}`;
  }
  return out === '' ? 'the top level' : out;
}

/** Splits a JSON pointer (`/methods/1/name`) into path segments, list indices as numbers. */
export function parsePointer(pointer: string, data: unknown): (string | number)[] {
  if (pointer === '') return [];
  const out: (string | number)[] = [];
  let cursor: unknown = data;
  for (const raw of pointer.slice(1).split('/')) {
    const segment = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    const index = Array.isArray(cursor) ? Number(segment) : NaN;
    out.push(Number.isInteger(index) ? index : segment);
    cursor = (cursor as Record<string, unknown> | undefined)?.[segment];
  }
  return out;
}
