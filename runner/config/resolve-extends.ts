import { dirname, relative, resolve, isAbsolute } from 'node:path';
import type { ConfigError } from './config-error.ts';
import { mergeDeep } from './deep-merge.ts';
import { readYamlFile } from './read-yaml-file.ts';
import { LocationMap } from './source-locations.ts';

/** A file with its `extends` chain merged in, and where every value came from. */
export type MergedFile =
  | { ok: true; value: Record<string, unknown>; locations: LocationMap }
  | { ok: false; errors: ConfigError[] };

/** The path shown to users: relative to `cwd` when inside it, absolute otherwise. */
export function displayPath(absPath: string, cwd: string): string {
  const rel = relative(cwd, absPath);
  return rel === '' || rel.startsWith('..') || isAbsolute(rel) ? absPath : rel;
}

/**
 * Reads `absPath` and, recursively, the base files it `extends`, deep-merging each file over
 * its base. `chain` holds the files already being read, so a file that leads back to itself
 * is reported (extends-cycle) instead of recursing forever.
 */
export function readWithBases(absPath: string, cwd: string, chain: string[] = []): MergedFile {
  const file = displayPath(absPath, cwd);
  const read = readYamlFile(absPath, file);
  if (!read.ok) return read;
  const { extends: base, ...own } = read.value;
  if (base === undefined) return { ok: true, value: read.value, locations: read.locations };
  const at = read.locations.locate(['extends']);
  const located = (code: ConfigError['code'], message: string, hint: string): MergedFile => ({
    ok: false,
    errors: [{ code, file, line: at.line, col: at.col, message, hint }],
  });
  if (typeof base !== 'string' || base.trim() === '') {
    return located(
      'wrong-type',
      `expected a relative file path, got ${JSON.stringify(base)}`,
      'write `extends: ./base.yaml`',
    );
  }
  const baseAbs = resolve(dirname(absPath), base);
  if (baseAbs === absPath || chain.includes(baseAbs)) {
    const loop = [...chain, absPath, baseAbs].map((p) => displayPath(p, cwd)).join(' → ');
    return located(
      'extends-cycle',
      `expected a chain of base files that ends, got a loop: ${loop}`,
      'remove the `extends` that leads back to a file already in the chain',
    );
  }
  const parent = readWithBases(baseAbs, cwd, [...chain, absPath]);
  if (!parent.ok) {
    const missing = parent.errors.find(
      (e) => e.code === 'file-not-found' && e.file === displayPath(baseAbs, cwd),
    );
    if (missing) {
      return located(
        'extends-missing',
        `expected a base file at ${missing.file}, got nothing there`,
        'fix the path; it is resolved relative to the file that names it',
      );
    }
    return parent;
  }
  const locations = new LocationMap({ file, line: 1, col: 1 });
  locations.absorb(parent.locations);
  locations.absorb(read.locations);
  return { ok: true, value: mergeDeep(parent.value, own) as Record<string, unknown>, locations };
}
