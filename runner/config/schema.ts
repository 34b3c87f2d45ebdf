import { readFileSync } from 'node:fs';
import { Ajv2020, type ValidateFunction } from 'ajv/dist/2020.js';

/** The subset of JSON Schema keywords the config stage reads directly. */
export interface SchemaNode {
  type?: string | string[];
  description?: string;
  default?: unknown;
  enum?: unknown[];
  properties?: Record<string, SchemaNode>;
  additionalProperties?: boolean | SchemaNode;
  required?: string[];
  items?: SchemaNode;
  anyOf?: SchemaNode[];
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minItems?: number;
  maxItems?: number;
  uniqueItems?: boolean;
  pattern?: string;
  'x-resolved'?: SchemaNode;
  'x-computed-default'?: string;
  [keyword: string]: unknown;
}

let cachedSchema: SchemaNode | undefined;
let cachedAjv: Ajv2020 | undefined;
const compiled = new WeakMap<SchemaNode, ValidateFunction>();

/** The experiment-file schema, read once from configs/schema.json (the YAML-facing truth). */
export function loadSchema(): SchemaNode {
  cachedSchema ??= JSON.parse(
    readFileSync(new URL('../../configs/schema.json', import.meta.url), 'utf8'),
  ) as SchemaNode;
  return cachedSchema;
}

/**
 * An ajv instance for draft 2020-12 that reports every error (not the first), fills in
 * defaults, and knows the two annotation keywords the schema adds:
 * `x-resolved` (the shape of a value after normalisation, e.g. a method written out in full)
 * and `x-computed-default` (a default computed from other input, e.g. the file name).
 */
export function createValidator(): Ajv2020 {
  cachedAjv ??= (() => {
    const ajv = new Ajv2020({ allErrors: true, useDefaults: true, strict: true, verbose: true });
    ajv.addKeyword({ keyword: 'x-resolved' });
    ajv.addKeyword({ keyword: 'x-computed-default' });
    return ajv;
  })();
  return cachedAjv;
}

/** Compiles (once) a validator for `node`, the whole schema or a part of it. */
export function compileSchema(node: SchemaNode): ValidateFunction {
  let validate = compiled.get(node);
  if (!validate) {
    // A root-level `default` means nothing to ajv (and strict mode rejects it): drop it.
    const rest: SchemaNode = { ...node };
    for (const keyword of ['$schema', '$id', 'default']) delete rest[keyword];
    validate = createValidator().compile(rest);
    compiled.set(node, validate);
  }
  return validate;
}

/**
 * The schema node of a dotted config path (`train.discount`, `data`, `eval.planning.tasks`),
 * or undefined when no such key exists. `keys` lists the valid keys at the point the walk
 * stopped, for "did you mean" hints.
 */
export function findSchemaAt(
  root: SchemaNode,
  segments: readonly string[],
): { node: SchemaNode | undefined; keys: string[]; depth: number } {
  let node: SchemaNode = root;
  for (let depth = 0; depth < segments.length; depth++) {
    const segment = segments[depth] ?? '';
    const next = node.properties?.[segment];
    if (!next) {
      const free = node.additionalProperties === true;
      return free
        ? { node: {}, keys: [], depth }
        : { node: undefined, keys: Object.keys(node.properties ?? {}), depth };
    }
    node = next;
  }
  return { node, keys: [], depth: segments.length };
}
