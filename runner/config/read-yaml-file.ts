import { readFileSync, statSync } from 'node:fs';
import { isMap, isSeq, LineCounter, parseDocument } from 'yaml';
import type { ConfigError } from './config-error.ts';
import { LocationMap, recordYamlLocations, type ConfigPath } from './source-locations.ts';

/** A YAML mapping read from disk, with the positions of every key and value. */
export type YamlRead =
  | { ok: true; value: Record<string, unknown>; locations: LocationMap }
  | { ok: false; errors: ConfigError[] };

function fail(file: string, code: ConfigError['code'], message: string, hint?: string): YamlRead {
  const error: ConfigError = { code, file, line: 1, col: 1, message };
  if (hint !== undefined) error.hint = hint;
  return { ok: false, errors: [error] };
}

/** Reads the bytes, refusing missing, unreadable and binary files with a coded error. */
function readText(absPath: string, file: string): string | YamlRead {
  let bytes: Buffer;
  try {
    if (!statSync(absPath).isFile()) {
      return fail(file, 'file-unreadable', 'expected a file, got a folder', 'name a .yaml file');
    }
    bytes = readFileSync(absPath);
  } catch (cause) {
    const code = (cause as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') {
      return fail(file, 'file-not-found', `no such file: ${file}`, 'check the path and spelling');
    }
    return fail(file, 'file-unreadable', `cannot read ${file} (${code ?? 'unknown error'})`);
  }
  const binaryHint = 'experiment files are UTF-8 YAML text';
  if (bytes.subarray(0, 8192).includes(0)) {
    return fail(file, 'binary-file', 'expected YAML text, got binary data (NUL bytes)', binaryHint);
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return fail(file, 'binary-file', 'expected UTF-8 text, got invalid byte sequences', binaryHint);
  }
}

/** True when a duplicate key at `offset` sits directly inside the `sweep.axes` mapping. */
function isInsideAxes(doc: ReturnType<typeof parseDocument>, offset: number): boolean {
  const axes = doc.getIn(['sweep', 'axes'], true) as { range?: [number, number, number] } | null;
  return Boolean(axes?.range && offset >= axes.range[0] && offset <= axes.range[2]);
}

/**
 * Reads and parses one YAML experiment file. Never throws: every problem (missing, binary,
 * empty, syntax, not a mapping) comes back as a located ConfigError.
 */
export function readYamlFile(absPath: string, file: string): YamlRead {
  const text = readText(absPath, file);
  if (typeof text !== 'string') return text;
  const counter = new LineCounter();
  const doc = parseDocument(text, { lineCounter: counter, prettyErrors: false, uniqueKeys: true });
  if (doc.errors.length > 0) {
    const errors = doc.errors.map((e): ConfigError => {
      const { line, col } = counter.linePos(e.pos[0]);
      const duplicate = e.code === 'DUPLICATE_KEY';
      const axis = duplicate && isInsideAxes(doc, e.pos[0]);
      const code = axis ? 'duplicate-axis' : duplicate ? 'duplicate-key' : 'yaml-syntax';
      const message = e.message.replace(/\s+at line \d+, column \d+:?[\s\S]*$/, '').trim();
      const hint = duplicate
        ? 'keep one entry for the key (YAML mappings cannot repeat keys)'
        : 'check indentation (spaces, never tabs), quotes and brackets near this position';
      return { code, file, line, col, message, hint };
    });
    return { ok: false, errors };
  }
  if (doc.contents === null || (doc.contents as { value?: unknown }).value === null) {
    return fail(
      file,
      'empty-file',
      'expected a mapping of experiment keys, got an empty file',
      'start from configs/demo.yaml',
    );
  }
  if (!isMap(doc.contents)) {
    const what = isSeq(doc.contents) ? 'a list' : 'a single value';
    const { line, col } = counter.linePos(doc.contents.range?.[0] ?? 0);
    return {
      ok: false,
      errors: [
        {
          code: 'not-a-mapping',
          file,
          line,
          col,
          message: `expected a mapping of keys (name:, data:, …), got ${what}`,
          hint: 'write one `key: value` per line at the top level',
        },
      ],
    };
  }
  let value: unknown;
  try {
    value = doc.toJS({ maxAliasCount: 100 });
  } catch (cause) {
    return fail(file, 'yaml-syntax', `cannot build values: ${(cause as Error).message}`);
  }
  const locations = new LocationMap({ file, line: 1, col: 1 });
  recordYamlLocations(doc.contents, file, counter, locations, [] as ConfigPath);
  return { ok: true, value: value as Record<string, unknown>, locations };
}
