import { basename, dirname, extname, resolve } from 'node:path';
import { applyOverrides } from './apply-overrides.ts';
import { checkDataRules, checkEncoderRules, checkMethodRules } from './check-semantics.ts';
import { checkSweep } from './check-sweep.ts';
import { sortConfigErrors, type ConfigError } from './config-error.ts';
import { countJobs } from './count-jobs.ts';
import { checkEpisodeLength } from './check-episode-length.ts';
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

/** Checks the merged file against the schema and the cross-key rules; fills in defaults. */
function validateMerged(
  value: Record<string, unknown>,
  locate: Locate,
): { config: Record<string, unknown>; errors: ConfigError[] } {
  const validate = compileSchema(loadSchema());
  const config = structuredClone(value);
  const errors = validate(config)
    ? []
    : mapSchemaErrors(validate.errors ?? [], loadSchema(), locate);
  // A part with schema errors is too broken for the cross-key checks; the rest is still checked.
  const broken = new Set(
    (validate.errors ?? []).flatMap((e) => {
      const [, first = '', second = ''] = e.instancePath.split('/');
      return [first, `${first}.${second}`];
    }),
  );
  const rules = [
    ...(broken.has('data') ? [] : checkDataRules(config.data as Record<string, unknown>, ['data'])),
    ...(broken.has('encoder')
      ? []
      : checkEncoderRules(config.encoder as Record<string, unknown>, ['encoder'])),
    ...(broken.has('methods') ? [] : checkMethodRules(config.methods as unknown[])),
  ];
  for (const issue of rules) {
    const at = locate(issue.path, issue.prefer);
    const { code, message, hint } = issue;
    errors.push({ code, file: at.file, line: at.line, col: at.col, message, hint });
  }
  if (!['sweep.', 'sweep.axes', 'sweep.together'].some((s) => broken.has(s))) {
    errors.push(...checkSweep(config, locate));
  }
  return { config, errors };
}

/** The too-many-jobs error, located at `sweep`, when the plan exceeds `run.maxJobs`. */
function checkPlanLimit(config: ExperimentConfig, locate: Locate): ConfigError[] {
  const count = countJobs(config);
  if (count.total <= config.run.maxJobs) return [];
  const at = locate(['sweep'], 'key');
  return [
    {
      code: 'too-many-jobs',
      file: at.file,
      line: at.line,
      col: at.col,
      message: `expected at most run.maxJobs = ${config.run.maxJobs} jobs, got ${count.total} (${count.train} train + ${count.evaluate} evaluate)`,
      hint: 'shorten the axes or seeds, or raise `run.maxJobs` if you really mean it',
    },
  ];
}

function loadNow(file: string, options: LoadOptions): LoadResult {
  const cwd = options.cwd ?? process.cwd();
  const absPath = resolve(cwd, file);
  const merged = readWithBases(absPath, cwd);
  if (!merged.ok) return { ok: false, errors: sortConfigErrors(merged.errors) };
  const { value, locations } = merged;
  // Bare method names become `{ name }` first, so `--set methods.0.label=…` has a mapping to write into.
  if (Array.isArray(value.methods)) {
    value.methods = value.methods.map((m: unknown) => (typeof m === 'string' ? { name: m } : m));
  }
  const errors = applyOverrides(value, options.overrides ?? [], locations);
  value.name ??= nameFromFile(absPath);
  const locate: Locate = (path, prefer) => locations.locate(path, prefer);
  const checked = validateMerged(value, locate);
  errors.push(...checked.errors);
  if (errors.length > 0) return { ok: false, errors: sortConfigErrors(errors) };
  const config = {
    ...checked.config,
    methods: resolveMethods(checked.config.methods as { name: string; label?: string }[]),
  } as unknown as ExperimentConfig;
  const tooLarge = checkPlanLimit(config, locate);
  if (tooLarge.length > 0) return { ok: false, errors: tooLarge };
  const tooShort = checkEpisodeLength(config, locate);
  if (tooShort.length > 0) return { ok: false, errors: tooShort };
  return { ok: true, config, file: absPath, baseDir: dirname(absPath) };
}

/**
 * Reads, merges (`extends`), overrides (`--set`), validates and resolves one experiment file.
 * Never rejects on bad input: every problem found comes back located, sorted by position;
 * the checks of a part are skipped only when that part is too broken to check.
 */
export function loadExperiment(file: string, options: LoadOptions = {}): Promise<LoadResult> {
  return new Promise((done) => done(loadNow(file, options)));
}
