import type { ConfigError } from './config-error.ts';
import { checkDataRules, checkEncoderRules } from './check-semantics.ts';
import { readAtPath, writeAtPath } from './config-paths.ts';
import { mapSchemaErrors, type Locate } from './map-schema-errors.ts';
import { compileSchema, findSchemaAt, loadSchema, type SchemaNode } from './schema.ts';
import type { ConfigPath } from './source-locations.ts';
import { suggestClosest } from './suggest.ts';
import { canonicalJson } from './canonical-json.ts';

/** Top-level keys an axis may sweep; the rest describe the sweep or the run itself. */
const SWEEPABLE = ['data', 'encoder', 'dim', 'train', 'eval'];

/** One swept path as written: where it sits under `sweep` and its value list. */
interface AxisEntry {
  path: string;
  values: unknown[];
  at: ConfigPath;
}

/** Every dotted path the schema defines below the sweepable keys, for "did you mean". */
export function listSchemaPaths(node: SchemaNode, prefix = ''): string[] {
  const out: string[] = [];
  for (const [key, child] of Object.entries(node.properties ?? {})) {
    const path = prefix === '' ? key : `${prefix}.${key}`;
    if (prefix === '' && !SWEEPABLE.includes(key)) continue;
    out.push(path, ...listSchemaPaths(child, path));
  }
  return out;
}

function error(
  locate: Locate,
  path: ConfigPath,
  prefer: 'key' | 'value',
  code: ConfigError['code'],
  message: string,
  hint: string,
): ConfigError {
  const at = locate(path, prefer);
  return { code, file: at.file, line: at.line, col: at.col, message, hint };
}

/** Checks that `entry.path` exists and may be swept; returns its schema node when it does. */
function checkAxisPath(
  entry: AxisEntry,
  locate: Locate,
  errors: ConfigError[],
): SchemaNode | undefined {
  const segments = entry.path.split('.');
  const root = loadSchema();
  if (
    !SWEEPABLE.includes(segments[0] ?? '') &&
    root.properties?.[segments[0] ?? ''] !== undefined
  ) {
    errors.push(
      error(
        locate,
        entry.at,
        'key',
        'axis-not-sweepable',
        `expected a path under ${SWEEPABLE.join(', ')}, got \`${entry.path}\``,
        segments[0] === 'methods'
          ? 'compared methods are listed under `methods`, not swept'
          : 'this key is the same for every job; set it once',
      ),
    );
    return undefined;
  }
  const found = findSchemaAt(root, segments);
  if (!found.node) {
    const close = suggestClosest(entry.path, listSchemaPaths(root));
    errors.push(
      error(
        locate,
        entry.at,
        'key',
        'unknown-axis',
        `expected an existing config path, got \`${entry.path}\` (no key \`${segments[found.depth] ?? ''}\` there)`,
        close !== undefined ? `did you mean \`${close}\`?` : 'see docs/config.md for every path',
      ),
    );
  }
  return found.node;
}

/**
 * Checks the whole top-level section once an axis value is written into it: a value valid
 * on its own can still leave the section invalid (an axis over `data.file.features` with no
 * `data.file.path`), and cross-key rules (split fractions summing to 1) span keys.
 */
function checkSectionWith(
  trial: Record<string, unknown>,
  base: Record<string, unknown>,
  section: string,
): { text: string; hint: string }[] {
  const node = loadSchema().properties?.[section];
  if (!node) return [];
  const validate = compileSchema(node);
  // The file's own errors in this section are reported once, by the main validation.
  if (!validate(structuredClone(base[section]))) return [];
  const copy = structuredClone(trial[section]);
  if (!validate(copy)) {
    const nowhere: Locate = () => ({ file: '', line: 0, col: 0 });
    return mapSchemaErrors(validate.errors ?? [], loadSchema(), nowhere, [section]).map((e) => ({
      text: e.message,
      hint: e.hint ?? '',
    }));
  }
  const rules =
    section === 'data'
      ? checkDataRules(copy as Record<string, unknown>, ['data'])
      : section === 'encoder'
        ? checkEncoderRules(copy as Record<string, unknown>, ['encoder'])
        : [];
  return rules.map((issue) => ({ text: issue.message, hint: issue.hint }));
}

/** Validates every listed value as if written at the swept path (merged over the file's value). */
function checkAxisValues(
  entry: AxisEntry,
  node: SchemaNode,
  config: Record<string, unknown>,
  locate: Locate,
  errors: ConfigError[],
): void {
  const segments = entry.path.split('.');
  const validate = compileSchema(node);
  const seen = new Map<string, number>();
  entry.values.forEach((value, index) => {
    const at = [...entry.at, index];
    const key = canonicalJson(value);
    const first = seen.get(key);
    if (first !== undefined) {
      errors.push(
        error(
          locate,
          at,
          'value',
          'duplicate-value',
          `expected distinct values on axis \`${entry.path}\`, got ${key} twice (entries ${first + 1} and ${index + 1})`,
          'remove the repeated value',
        ),
      );
    }
    seen.set(key, index);
    const trial = structuredClone(config);
    writeAtPath(trial, segments, value);
    const written = structuredClone(readAtPath(trial, segments));
    if (!validate(written)) {
      for (const e of mapSchemaErrors(validate.errors ?? [], loadSchema(), locate, at)) {
        errors.push({
          ...e,
          code: 'bad-axis-value',
          message: `value ${index + 1} of axis \`${entry.path}\`: ${e.message}`,
        });
      }
      return;
    }
    writeAtPath(trial, segments, written);
    for (const message of checkSectionWith(trial, config, segments[0] ?? '')) {
      errors.push(
        error(
          locate,
          at,
          'value',
          'bad-axis-value',
          `value ${index + 1} of axis \`${entry.path}\`: ${message.text}`,
          message.hint,
        ),
      );
    }
  });
}

function listEntries(sweep: {
  axes: Record<string, unknown[]>;
  together: Record<string, unknown[]>[];
}): AxisEntry[] {
  const entries: AxisEntry[] = Object.entries(sweep.axes).map(([path, values]) => ({
    path,
    values,
    at: ['sweep', 'axes', path],
  }));
  sweep.together.forEach((group, g) => {
    for (const [path, values] of Object.entries(group))
      entries.push({ path, values, at: ['sweep', 'together', g, path] });
  });
  return entries;
}

/** Checks paired groups: every path of a group lists the same number of values. */
function checkTogether(
  together: Record<string, unknown[]>[],
  locate: Locate,
  errors: ConfigError[],
): void {
  together.forEach((group, g) => {
    const [firstPath, firstValues] = Object.entries(group)[0] ?? ['', []];
    for (const [path, values] of Object.entries(group)) {
      if (values.length !== firstValues.length) {
        errors.push(
          error(
            locate,
            ['sweep', 'together', g, path],
            'key',
            'together-length',
            `expected ${firstValues.length} values like \`${firstPath}\`, got ${values.length} for \`${path}\``,
            'paired paths vary together, one value of each per setting: list the same number of values',
          ),
        );
      }
    }
  });
}

/** Reports a path swept twice, or swept inside another swept path. */
function checkOverlaps(entries: AxisEntry[], locate: Locate, errors: ConfigError[]): void {
  entries.forEach((entry, i) => {
    const earlier = entries
      .slice(0, i)
      .find(
        (e) =>
          e.path === entry.path ||
          entry.path.startsWith(`${e.path}.`) ||
          e.path.startsWith(`${entry.path}.`),
      );
    if (earlier) {
      const what =
        earlier.path === entry.path ? 'is already swept' : `overlaps the swept \`${earlier.path}\``;
      errors.push(
        error(
          locate,
          entry.at,
          'key',
          'duplicate-axis',
          `expected each path swept once, got \`${entry.path}\`, which ${what}`,
          'keep one axis per path; use a `together` group for paths that must vary together',
        ),
      );
    }
  });
}

/**
 * Every check of `sweep` that the schema cannot express: axis paths exist and may vary,
 * their values are valid there, no path is swept twice, lists are non-empty and paired
 * groups have equal lengths. `config` has passed the schema (defaults filled).
 */
export function checkSweep(config: Record<string, unknown>, locate: Locate): ConfigError[] {
  const sweep = config.sweep as {
    axes: Record<string, unknown[]>;
    together: Record<string, unknown[]>[];
  };
  const errors: ConfigError[] = [];
  const entries = listEntries(sweep);
  for (const entry of entries) {
    const node = checkAxisPath(entry, locate, errors);
    if (entry.values.length === 0) {
      errors.push(
        error(
          locate,
          entry.at,
          'key',
          'empty-axis',
          `expected at least one value on axis \`${entry.path}\`, got an empty list`,
          'list the values to sweep, or remove the axis',
        ),
      );
    } else if (node) {
      checkAxisValues(entry, node, config, locate, errors);
    }
  }
  checkTogether(sweep.together, locate, errors);
  checkOverlaps(entries, locate, errors);
  return errors;
}
