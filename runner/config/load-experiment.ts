import { basename, dirname, extname, resolve } from 'node:path';
import { applyOverrides } from './apply-overrides.ts';
import { checkConfigRules } from './check-semantics.ts';
import { checkSweep } from './check-sweep.ts';
import { sortConfigErrors, type ConfigError } from './config-error.ts';
import { countJobs } from './count-jobs.ts';
import { mapSchemaErrors, type Locate } from './map-schema-errors.ts';
import { resolveMethods } from './resolve-methods.ts';
import { readWithBases } from './resolve-extends.ts';
import { compileSchema, loadSchema } from './schema.ts';
import type { ExperimentConfig } from './types.ts';

/** The outcome of loading an experiment file: a resolved config, or every error found. */
export type LoadResult =
  | { ok: true; config: ExperimentConfig; file: string; baseDir: string }
  | { ok: false; errors: ConfigError[] };

/** Options of `loadExperiment`. */
export interface LoadOptions {
  /** `path=value` overrides (the CLI's `--set`), applied after `extends` merging. */
  overrides?: string[];
  /** Directory that relative file names resolve from. (default process.cwd()) */
  cwd?: string;
}

/** A name that satisfies the schema's pattern, from the file name: `Night Sweep.yaml` → `night-sweep`. */
export function nameFromFile(file: string): string {
  const stem = basename(file, extname(file))
    .toLowerCase()
    .replace(/[^a-z0-9._-]+/g, '-');
  const trimmed = stem.replace(/^[^a-z0-9]+/, '').slice(0, 64);
  return trimmed === '' ? 'experiment' : trimmed;
}

/**
 * Reads, merges (`extends`), overrides (`--set`), validates and resolves one experiment file.
 * Never throws on bad input: every problem found comes back located, sorted by position;
 * the checks of a part are skipped only when that part is too broken to check.
 */
export async function loadExperiment(file: string, options: LoadOptions = {}): Promise<LoadResult> {
  await Promise.resolve();
  const cwd = options.cwd ?? process.cwd();
  const absPath = resolve(cwd, file);
  const merged = readWithBases(absPath, cwd);
  if (!merged.ok) return { ok: false, errors: sortConfigErrors(merged.errors) };
  const { value, locations } = merged;
  if (Array.isArray(value.methods)) {
    value.methods = value.methods.map((m: unknown) => (typeof m === 'string' ? { name: m } : m));
  }
  const errors = applyOverrides(value, options.overrides ?? [], locations);
  value.name ??= nameFromFile(absPath);
  const locate: Locate = (path, prefer) => locations.locate(path, prefer);
  const validate = compileSchema(loadSchema());
  const config = structuredClone(value);
  const schemaOk = validate(config);
  const schemaErrors = schemaOk ? [] : mapSchemaErrors(validate.errors ?? [], loadSchema(), locate);
  errors.push(...schemaErrors);
  // Parts with schema errors are too broken for the cross-key checks; the rest is still checked.
  const broken = new Set(
    (validate.errors ?? []).flatMap((e) => {
      const [, first = '', second = ''] = e.instancePath.split('/');
      return [first, `${first}.${second}`];
    }),
  );
  if (!['data', 'encoder', 'methods'].some((s) => broken.has(s))) {
    for (const issue of checkConfigRules(config)) {
      const at = locate(issue.path, issue.prefer);
      errors.push({
        code: issue.code,
        file: at.file,
        line: at.line,
        col: at.col,
        message: issue.message,
        hint: issue.hint,
      });
    }
  }
  if (!['sweep.', 'sweep.axes', 'sweep.together'].some((s) => broken.has(s)))
    errors.push(...checkSweep(config, locate));
  if (errors.length > 0) return { ok: false, errors: sortConfigErrors(errors) };
  const resolved = {
    ...config,
    methods: resolveMethods(config.methods as { name: string; label?: string }[]),
  } as unknown as ExperimentConfig;
  const count = countJobs(resolved);
  if (count.total > resolved.run.maxJobs) {
    const at = locate(['sweep'], 'key');
    return {
      ok: false,
      errors: [
        {
          code: 'too-many-jobs',
          file: at.file,
          line: at.line,
          col: at.col,
          message: `expected at most run.maxJobs = ${resolved.run.maxJobs} jobs, got ${count.total} (${count.train} train + ${count.evaluate} evaluate)`,
          hint: 'shorten the axes or seeds, or raise `run.maxJobs` if you really mean it',
        },
      ],
    };
  }
  return { ok: true, config: resolved, file: absPath, baseDir: dirname(absPath) };
}
