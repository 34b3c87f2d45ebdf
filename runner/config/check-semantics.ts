import type { ConfigErrorCode } from './config-error.ts';
import { isPlainObject } from './deep-merge.ts';
import type { ConfigPath } from './source-locations.ts';

/** A rule broken across keys, located by path (the caller turns it into a ConfigError). */
export interface SemanticIssue {
  code: ConfigErrorCode;
  path: ConfigPath;
  prefer: 'key' | 'value';
  message: string;
  hint: string;
}

/** Rules of a `data` block that one key's schema cannot express. */
export function checkDataRules(data: Record<string, unknown>, at: ConfigPath): SemanticIssue[] {
  const issues: SemanticIssue[] = [];
  const split = data.split;
  if (isPlainObject(split)) {
    const { train, val, test } = split as { train: number; val: number; test: number };
    const sum = train + val + test;
    if (Math.abs(sum - 1) > 1e-9) {
      issues.push({
        code: 'bad-split',
        path: [...at, 'split'],
        prefer: 'key',
        message: `expected train + val + test = 1, got ${train} + ${val} + ${test} = ${Number(sum.toFixed(12))}`,
        hint: 'adjust the fractions so that they add up to 1',
      });
    }
  }
  if (data.source === 'file' && data.file === undefined) {
    issues.push({
      code: 'needs-key',
      path: [...at, 'source'],
      prefer: 'value',
      message: "expected a `file:` block for source 'file', got none",
      hint: 'add `file: { path: episodes.csv }` under data',
    });
  }
  return issues;
}

/** Rules of an `encoder` block. */
export function checkEncoderRules(
  encoder: Record<string, unknown>,
  at: ConfigPath,
): SemanticIssue[] {
  if (encoder.kind === 'plugin' && encoder.plugin === undefined) {
    return [
      {
        code: 'needs-key',
        path: [...at, 'kind'],
        prefer: 'value',
        message: "expected `plugin:` (a module path) for kind 'plugin', got none",
        hint: 'add `plugin: ./my-encoder.ts` under encoder',
      },
    ];
  }
  return [];
}

/** Rules of the `methods` list: precomputed needs a path, labels must differ. */
export function checkMethodRules(methods: unknown[]): SemanticIssue[] {
  const issues: SemanticIssue[] = [];
  const labels = new Map<string, number>();
  const fits = new Map<string, number>();
  methods.forEach((entry, index) => {
    const method = typeof entry === 'string' ? { name: entry } : (entry as Record<string, unknown>);
    const label = String(method.label ?? method.name);
    // Same name and path fit the same representation: a second row would only repeat the first.
    const fit = JSON.stringify([method.name, method.path ?? null]);
    const sameFit = fits.get(fit);
    if (sameFit !== undefined && labels.get(label) === undefined) {
      issues.push({
        code: 'duplicate-method',
        path: ['methods', index],
        prefer: 'value',
        message: `expected distinct methods, got ${String(method.name)} twice (entries ${sameFit + 1} and ${index + 1})`,
        hint: 'list each method once; compare variants by sweeping a path instead',
      });
    }
    if (sameFit === undefined) fits.set(fit, index);
    if (method.name === 'precomputed' && method.path === undefined) {
      issues.push({
        code: 'needs-key',
        path: ['methods', index],
        prefer: 'value',
        message: "expected `path:` for method 'precomputed', got none",
        hint: 'write `- { name: precomputed, path: embeddings.npy }`',
      });
    }
    const first = labels.get(label);
    if (first !== undefined) {
      issues.push({
        code: 'duplicate-method',
        path: ['methods', index],
        prefer: 'value',
        message: `expected distinct method labels, got "${label}" twice (entries ${first + 1} and ${index + 1})`,
        hint: 'give one of them its own `label:`, e.g. `{ name: pca, label: pca-2 }`',
      });
    } else {
      labels.set(label, index);
    }
  });
  return issues;
}
