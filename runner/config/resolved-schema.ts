import type { SchemaNode } from './schema.ts';

/**
 * Derives the schema of the *resolved* config (after `extends`, defaults and normalisation)
 * from the YAML-facing schema, so there is one source of truth (STYLE.md §4):
 * - a key with a `default` or an `x-computed-default` is always present, hence required;
 * - a node with `x-resolved` is replaced by that shape (a method name becomes `{name, label}`);
 * - `extends` is gone (it was merged away).
 * `scripts/generate.ts` turns the result into `ResolvedExperiment`, which a type-level test
 * proves identical to `ExperimentConfig` in types.ts.
 */
export function toResolvedSchema(node: SchemaNode, isRoot = true): SchemaNode {
  const resolvedShape = node['x-resolved'];
  if (resolvedShape) return toResolvedSchema(resolvedShape, false);
  const out: SchemaNode = { ...node };
  if (node.properties) {
    const properties: Record<string, SchemaNode> = {};
    const required = new Set(node.required ?? []);
    for (const [key, child] of Object.entries(node.properties)) {
      if (isRoot && key === 'extends') continue;
      properties[key] = toResolvedSchema(child, false);
      if (child.default !== undefined || child['x-computed-default'] !== undefined)
        required.add(key);
    }
    out.properties = properties;
    if (required.size > 0) out.required = Object.keys(properties).filter((k) => required.has(k));
  }
  if (node.items) out.items = toResolvedSchema(node.items, false);
  if (node.anyOf) out.anyOf = node.anyOf.map((branch) => toResolvedSchema(branch, false));
  if (typeof node.additionalProperties === 'object') {
    out.additionalProperties = toResolvedSchema(node.additionalProperties, false);
  }
  return out;
}
