import { parse } from 'yaml';
import type { ConfigError } from './config-error.ts';
import { isPlainObject } from './deep-merge.ts';
import { findSchemaAt, loadSchema, type SchemaNode } from './schema.ts';
import type { ConfigPath, LocationMap } from './source-locations.ts';
import { suggestClosest } from './suggest.ts';

/** The pseudo file name of `--set` overrides in errors; line n is the n-th override. */
export const OVERRIDE_FILE = '--set';

/** Splits `sweep.axes.train.discount` so that an axis key stays one (dotted) segment. */
export function splitOverridePath(path: string): (string | number)[] {
  const parts = path.split('.');
  if (parts[0] === 'sweep' && parts[1] === 'axes' && parts.length > 2) {
    return ['sweep', 'axes', parts.slice(2).join('.')];
  }
  if (parts[0] === 'sweep' && parts[1] === 'together' && parts.length > 3) {
    return ['sweep', 'together', Number(parts[2]), parts.slice(3).join('.')];
  }
  return parts.map((p) => (/^\d+$/.test(p) ? Number(p) : p));
}

/** Accepts only text when the schema wants only text, so `--set name=2024` stays "2024". */
function typeBySchema(node: SchemaNode | undefined, parsed: unknown, raw: string): unknown {
  const wantsText =
    node?.type === 'string' || (node?.enum?.every((v) => typeof v === 'string') ?? false);
  return wantsText && typeof parsed !== 'string' && parsed !== null ? raw : parsed;
}

function writeOverride(
  config: Record<string, unknown>,
  path: readonly (string | number)[],
  value: unknown,
): void {
  let cursor: Record<string, unknown> | unknown[] = config;
  path.slice(0, -1).forEach((segment, i) => {
    const next = (cursor as Record<string | number, unknown>)[segment];
    const wantList = typeof path[i + 1] === 'number';
    if (!isPlainObject(next) && !Array.isArray(next)) {
      (cursor as Record<string | number, unknown>)[segment] = wantList ? [] : {};
    }
    cursor = (cursor as Record<string | number, unknown>)[segment] as Record<string, unknown>;
  });
  (cursor as Record<string | number, unknown>)[path[path.length - 1] ?? ''] = value;
}

/** Checks one override's path against the schema; returns an error or the target node. */
function resolveOverridePath(
  path: (string | number)[],
  line: number,
): { node?: SchemaNode; error?: ConfigError } {
  const names = path.filter((p): p is string => typeof p === 'string');
  if (names[0] === 'extends') {
    return {
      error: {
        code: 'bad-override',
        file: OVERRIDE_FILE,
        line,
        col: 1,
        message: 'expected a config path, got `extends`',
        hint: 'base files are chosen in the YAML file, not on the command line',
      },
    };
  }
  if (names[0] === 'sweep' && (names[1] === 'axes' || names[1] === 'together')) return {};
  const methodItem = names[0] === 'methods' && typeof path[1] === 'number';
  const walk = methodItem ? ['methods', ...names.slice(1)] : names;
  const root = loadSchema();
  const target = methodItem
    ? {
        ...root,
        properties: { ...root.properties, methods: root.properties?.methods?.['x-resolved'] ?? {} },
      }
    : root;
  const found = findSchemaAt(target, walk);
  if (found.node) return { node: found.node };
  const bad = walk[found.depth] ?? '';
  const close = suggestClosest(bad, found.keys);
  const col = walk.slice(0, found.depth).join('.').length + (found.depth > 0 ? 2 : 1);
  return {
    error: {
      code: 'unknown-key',
      file: OVERRIDE_FILE,
      line,
      col,
      message: `unknown key \`${bad}\` in override path; expected one of ${found.keys.join(', ')}`,
      hint:
        close !== undefined ? `did you mean \`${close}\`?` : 'see docs/config.md for every path',
    },
  };
}

/**
 * Applies `--set path=value` overrides to a merged config (in place), recording their
 * positions as file `--set`, line = the override's number, so later schema errors point at
 * the override. Values are YAML (`[4, 8]`, `0.95`, `{source: lorenz}`) typed by the schema.
 */
export function applyOverrides(
  config: Record<string, unknown>,
  overrides: readonly string[],
  locations: LocationMap,
): ConfigError[] {
  const errors: ConfigError[] = [];
  overrides.forEach((text, index) => {
    const line = index + 1;
    const eq = text.indexOf('=');
    if (eq <= 0) {
      errors.push({
        code: 'bad-override',
        file: OVERRIDE_FILE,
        line,
        col: 1,
        message: `expected path=value, got ${JSON.stringify(text)}`,
        hint: 'write e.g. --set train.discount=0.95',
      });
      return;
    }
    const path = splitOverridePath(text.slice(0, eq).trim());
    const resolved = resolveOverridePath(path, line);
    if (resolved.error) {
      errors.push(resolved.error);
      return;
    }
    const raw = text.slice(eq + 1);
    let parsed: unknown;
    try {
      parsed = parse(raw, { prettyErrors: false });
    } catch (cause) {
      errors.push({
        code: 'bad-override',
        file: OVERRIDE_FILE,
        line,
        col: eq + 2,
        message: `expected a YAML value, got ${JSON.stringify(raw)} (${(cause as Error).message.split('\n')[0] ?? ''})`,
        hint: 'quote text that holds `:` or `#`, and write lists as [a, b]',
      });
      return;
    }
    writeOverride(config, path, typeBySchema(resolved.node, parsed, raw.trim()));
    const configPath: ConfigPath = path;
    locations.forget(configPath);
    locations.record(configPath, {
      key: { file: OVERRIDE_FILE, line, col: 1 },
      value: { file: OVERRIDE_FILE, line, col: eq + 2 },
    });
  });
  return errors;
}
