import type { ErrorObject } from 'ajv';
import type { ConfigError, ConfigErrorCode } from './config-error.ts';
import {
  describeType,
  describeValue,
  formatPath,
  parsePointer,
  typeOfValue,
} from './describe-value.ts';
import type { SchemaNode } from './schema.ts';
import type { ConfigPath, SourcePos } from './source-locations.ts';
import { suggestClosest } from './suggest.ts';

/** Finds where a path was written; `key` asks for the key's position rather than the value's. */
export type Locate = (path: ConfigPath, prefer: 'key' | 'value') => SourcePos;

interface Draft {
  code: ConfigErrorCode;
  path: ConfigPath;
  prefer: 'key' | 'value';
  message: string;
  hint?: string;
}

/** Describes the allowed range of a numeric or list schema, e.g. "a number > 0 and < 1". */
export function describeRange(node: SchemaNode): string {
  const parts: string[] = [];
  if (node.minimum !== undefined) parts.push(`≥ ${node.minimum}`);
  if (node.exclusiveMinimum !== undefined) parts.push(`> ${node.exclusiveMinimum}`);
  if (node.maximum !== undefined) parts.push(`≤ ${node.maximum}`);
  if (node.exclusiveMaximum !== undefined) parts.push(`< ${node.exclusiveMaximum}`);
  const kind = node.type === 'integer' ? 'a whole number' : 'a number';
  return `${kind} ${parts.join(' and ')}`;
}

function branchType(node: SchemaNode): string[] {
  if (typeof node.type === 'string')
    return node.type === 'number' ? ['number', 'integer'] : [node.type];
  return Array.isArray(node.type) ? node.type : [];
}

/** Where a whole schema keeps every property name, for "belongs under …" hints. */
function findKeyElsewhere(root: SchemaNode, key: string, prefix = ''): string | undefined {
  for (const [name, child] of Object.entries(root.properties ?? {})) {
    const here = prefix === '' ? name : `${prefix}.${name}`;
    if (name === key) return here;
    const deeper = findKeyElsewhere(child, key, here);
    if (deeper !== undefined) return deeper;
  }
  return undefined;
}

function draftUnknownKey(e: ErrorObject, path: ConfigPath, root: SchemaNode): Draft {
  const key = String((e.params as { additionalProperty: string }).additionalProperty);
  const allowed = Object.keys((e.parentSchema as SchemaNode).properties ?? {});
  const close = suggestClosest(key, allowed);
  const elsewhere = findKeyElsewhere(root, key);
  const hint =
    close !== undefined
      ? `did you mean \`${close}\`?`
      : elsewhere !== undefined
        ? `\`${key}\` belongs at \`${elsewhere}\``
        : `allowed keys here: ${allowed.join(', ')}`;
  return {
    code: 'unknown-key',
    path: [...path, key],
    prefer: 'key',
    hint,
    message: `unknown key \`${key}\` in ${formatPath(path)}; expected one of ${allowed.join(', ')}`,
  };
}

function draftRange(e: ErrorObject, path: ConfigPath): Draft {
  const node = e.parentSchema as SchemaNode;
  const hint = node.description;
  const draft: Draft = {
    code: 'out-of-range',
    path,
    prefer: 'value',
    message: `expected ${describeRange(node)}, got ${describeValue(e.data)}`,
  };
  if (hint !== undefined) draft.hint = hint;
  return draft;
}

function draftListLength(e: ErrorObject, path: ConfigPath): Draft {
  const limit = (e.params as { limit: number }).limit;
  if (e.keyword === 'minItems' && limit === 1) {
    return {
      code: 'empty-list',
      path,
      prefer: 'value',
      message: 'expected at least one entry, got an empty list',
      hint: `list at least one value under ${formatPath(path)}, or delete the key to use its default`,
    };
  }
  const bound = e.keyword === 'minItems' || e.keyword === 'minProperties' ? 'at least' : 'at most';
  const count = Array.isArray(e.data) ? e.data.length : Object.keys(e.data as object).length;
  const hint = e.keyword === 'minProperties' ? 'a single path belongs in sweep.axes' : undefined;
  const draft: Draft = {
    code: 'out-of-range',
    path,
    prefer: 'value',
    message: `expected ${bound} ${limit} entries, got ${count}`,
  };
  if (hint !== undefined) draft.hint = hint;
  return draft;
}

type Drafter = (e: ErrorObject, path: ConfigPath, root: SchemaNode) => Draft;

function draftMissingKey(e: ErrorObject, path: ConfigPath): Draft {
  const key = (e.params as { missingProperty: string }).missingProperty;
  return {
    code: 'missing-key',
    path,
    prefer: 'key',
    hint: `add \`${key}:\` under ${formatPath(path)}`,
    message: `expected key \`${key}\` in ${formatPath(path)}, got none`,
  };
}

function draftWrongType(e: ErrorObject, path: ConfigPath): Draft {
  const want = String((e.params as { type: string }).type);
  const hint =
    want === 'array'
      ? 'write a list, e.g. `[a, b]` or one `- item` per line'
      : want === 'integer' && typeof e.data === 'number'
        ? 'use a whole number'
        : (e.parentSchema as SchemaNode).description;
  const draft: Draft = {
    code: 'wrong-type',
    path,
    prefer: 'value',
    message: `expected ${describeType(want)}, got ${describeValue(e.data)}`,
  };
  if (hint !== undefined) draft.hint = hint;
  return draft;
}

function draftUnknownValue(e: ErrorObject, path: ConfigPath): Draft {
  const allowed = (e.params as { allowedValues: unknown[] }).allowedValues.map(String);
  const close = typeof e.data === 'string' ? suggestClosest(e.data, allowed) : undefined;
  return {
    code: 'unknown-value',
    path,
    prefer: 'value',
    message: `expected one of ${allowed.join(', ')}, got ${describeValue(e.data)}`,
    hint: close !== undefined ? `did you mean \`${close}\`?` : `pick one of ${allowed.join(', ')}`,
  };
}

/** Points at the later of two equal entries: the one to remove. */
function draftDuplicateValue(e: ErrorObject, path: ConfigPath): Draft {
  const { i, j } = e.params as { i: number; j: number };
  const [first, second] = [Math.min(i, j), Math.max(i, j)];
  const list = e.data as unknown[];
  return {
    code: 'duplicate-value',
    path: [...path, second],
    prefer: 'value',
    message: `expected distinct values, got ${JSON.stringify(list[second])} twice (entries ${first + 1} and ${second + 1})`,
    hint: 'remove the repeated entry',
  };
}

function draftBadFormat(e: ErrorObject, path: ConfigPath): Draft {
  return {
    code: 'bad-format',
    path,
    prefer: 'value',
    message: `expected text matching ${(e.params as { pattern: string }).pattern}, got ${describeValue(e.data)}`,
    hint: 'use lower-case letters, digits, `.`, `_` and `-`, starting with a letter or digit',
  };
}

/** `propertyNames` guards only the axis maps: a key there must look like a dotted path. */
function draftBadAxisName(e: ErrorObject, path: ConfigPath): Draft {
  const name = String((e.params as { propertyName: string }).propertyName);
  return {
    code: 'unknown-axis',
    path: [...path, name],
    prefer: 'key',
    message: `expected a dotted config path such as \`train.discount\`, got ${JSON.stringify(name)}`,
    hint: 'write the path of a key, segments joined by dots',
  };
}

/** One drafter per JSON Schema keyword the experiment schema uses. */
const DRAFTERS: Record<string, Drafter> = {
  additionalProperties: draftUnknownKey,
  required: draftMissingKey,
  type: draftWrongType,
  minimum: draftRange,
  maximum: draftRange,
  exclusiveMinimum: draftRange,
  exclusiveMaximum: draftRange,
  minItems: draftListLength,
  maxItems: draftListLength,
  minProperties: draftListLength,
  enum: draftUnknownValue,
  uniqueItems: draftDuplicateValue,
  pattern: draftBadFormat,
  propertyNames: draftBadAxisName,
};

/** Turns one ajv error into a draft ConfigError. */
function draftError(e: ErrorObject, root: SchemaNode, prefix: ConfigPath): Draft {
  const path = [...prefix, ...parsePointer(e.instancePath, undefined)].map((s) =>
    /^\d+$/.test(String(s)) ? Number(s) : s,
  );
  const drafter = DRAFTERS[e.keyword];
  if (drafter) return drafter(e, path, root);
  return {
    code: 'wrong-type',
    path,
    prefer: 'value',
    message: `expected a valid value, got ${describeValue(e.data)} (${e.message ?? e.keyword})`,
  };
}

/**
 * Keeps, for every `anyOf`, only the errors of the branch whose type matches the value (a
 * method written as text is checked as a name, as a mapping as an object); when no branch
 * type matches, one wrong-type error replaces them all.
 */
function foldAnyOf(
  errors: ErrorObject[],
  prefix: ConfigPath,
): { kept: ErrorObject[]; drafts: Draft[] } {
  const anyOfs = errors.filter((e) => e.keyword === 'anyOf');
  const drafts: Draft[] = [];
  const chosen = new Map<string, number>();
  for (const e of anyOfs) {
    const branches = (e.schema as SchemaNode[]).map(branchType);
    const index = branches.findIndex((types) => types.includes(typeOfValue(e.data)));
    chosen.set(`${e.instancePath}|${e.schemaPath}`, index);
    if (index < 0) {
      const wanted = [...new Set(branches.map((t) => describeType(t[0] ?? '')))].join(' or ');
      const path = [...prefix, ...parsePointer(e.instancePath, undefined)].map((s) =>
        /^\d+$/.test(String(s)) ? Number(s) : s,
      );
      const hint = (e.parentSchema as SchemaNode).description;
      drafts.push({
        ...(hint !== undefined ? { hint } : {}),
        code: 'wrong-type',
        path,
        prefer: 'value',
        message: `expected ${wanted}, got ${describeValue(e.data)}`,
      });
    }
  }
  const kept = errors.filter((e) => {
    if (e.keyword === 'anyOf' || e.propertyName !== undefined) return false;
    for (const [key, index] of chosen) {
      const [instancePath, schemaPath] = key.split('|') as [string, string];
      const inside =
        e.instancePath === instancePath || e.instancePath.startsWith(`${instancePath}/`);
      if (inside && e.schemaPath.startsWith(`${schemaPath}/`)) {
        return e.schemaPath.startsWith(`${schemaPath}/${index}/`);
      }
    }
    return true;
  });
  return { kept, drafts };
}

/** Maps ajv errors to located ConfigErrors; `prefix` is prepended to every instance path. */
export function mapSchemaErrors(
  errors: readonly ErrorObject[],
  root: SchemaNode,
  locate: Locate,
  prefix: ConfigPath = [],
): ConfigError[] {
  const { kept, drafts } = foldAnyOf([...errors], prefix);
  const all = [...drafts, ...kept.map((e) => draftError(e, root, prefix))];
  const seen = new Set<string>();
  const out: ConfigError[] = [];
  for (const draft of all) {
    const path = draft.path;
    const at = locate(path, draft.prefer);
    const error: ConfigError = {
      code: draft.code,
      file: at.file,
      line: at.line,
      col: at.col,
      message: draft.message,
    };
    if (draft.hint !== undefined) error.hint = draft.hint;
    const key = `${error.file}:${error.line}:${error.col}:${error.code}:${error.message}`;
    if (!seen.has(key)) out.push(error);
    seen.add(key);
  }
  return out;
}
