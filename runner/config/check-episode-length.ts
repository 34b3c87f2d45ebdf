/**
 * Episodes too short for the evaluation, caught before any job runs. Every built-in source
 * makes each episode exactly `data.steps` long, and the evaluation needs at least
 * requiredSteps(eval) steps (runner/data/required-steps.ts); without this check such a
 * sweep would train every encoder and then fail every evaluation. Axes over `data`,
 * `data.steps`, `data.source`, `eval`, `eval.horizons`, `eval.waypoints` or `eval.suites`
 * are expanded, so each combination the plan will run is checked. A user's file (source
 * `file`) has its own lengths and is checked when it loads.
 */
import { requiredSteps } from '../data/required-steps.ts';
import type { ConfigError } from './config-error.ts';
import { writeAtPath } from './config-paths.ts';
import { listSweepAxes } from './count-jobs.ts';
import type { Locate } from './map-schema-errors.ts';
import type { DataConfig, EvalConfig, ExperimentConfig } from './types.ts';

const RELEVANT = new Set([
  'data',
  'data.steps',
  'data.source',
  'eval',
  'eval.horizons',
  'eval.waypoints',
  'eval.suites',
]);

/** Above this many combinations of the relevant axes the check is skipped (never in practice). */
const MAX_COMBINATIONS = 100_000;

interface Combination {
  data: DataConfig;
  eval: EvalConfig;
  /** The axis values that made it, for the message ('' for the file's own values). */
  label: string;
  /** Where in the file the first relevant axis value of the combination is (empty: none). */
  axisPath: (string | number)[];
}

function* combinations(config: ExperimentConfig): Generator<Combination> {
  const values = (path: string): unknown[] =>
    config.sweep.axes[path] ?? config.sweep.together.find((g) => path in g)?.[path] ?? [];
  const axes = listSweepAxes(config.sweep).filter((axis) =>
    axis.paths.some((p) => RELEVANT.has(p)),
  );
  const sizes = axes.map((axis) => axis.length);
  const total = sizes.reduce((a, b) => a * b, 1);
  if (total === 0 || total > MAX_COMBINATIONS) return;
  for (let n = 0; n < total; n++) {
    const out = structuredClone({ data: config.data, eval: config.eval }) as unknown as Record<
      string,
      unknown
    >;
    const parts: string[] = [];
    let axisPath: (string | number)[] = [];
    let rest = n;
    axes.forEach((axis, a) => {
      const size = sizes[a] ?? 1;
      const index = rest % size;
      rest = Math.floor(rest / size);
      for (const path of axis.paths) {
        if (!RELEVANT.has(path)) continue;
        const value = values(path)[index];
        writeAtPath(out, path.split('.'), value);
        parts.push(`${path} = ${JSON.stringify(value)}`);
        if (axisPath.length === 0) {
          // The offending value in its list, e.g. sweep.axes["data.steps"][1].
          const group = config.sweep.together.findIndex((g) => path in g);
          axisPath =
            group >= 0 ? ['sweep', 'together', group, path, index] : ['sweep', 'axes', path, index];
        }
      }
    });
    yield {
      data: out.data as DataConfig,
      eval: out.eval as EvalConfig,
      label: parts.join(', '),
      axisPath,
    };
  }
}

/** The too-short error at `data.steps` (or the sweep), for the first combination that fails. */
export function checkEpisodeLength(config: ExperimentConfig, locate: Locate): ConfigError[] {
  for (const combo of combinations(config)) {
    if (combo.data.source === 'file') continue;
    const needed = requiredSteps(combo.eval);
    if (combo.data.steps >= needed) continue;
    const inSweep = combo.label !== '';
    const at = inSweep ? locate(combo.axisPath, 'value') : locate(['data', 'steps'], 'key');
    const longest = Math.max(0, ...combo.eval.horizons);
    const widest = Math.max(0, ...combo.eval.waypoints);
    return [
      {
        code: 'episodes-too-short',
        file: at.file,
        line: at.line,
        col: at.col,
        message: `expected data.steps ≥ ${needed} for the evaluation (forecast horizon ${longest} needs ${longest + 1} steps, ${widest} bridge waypoints need ${widest + 2}), got ${combo.data.steps}${inSweep ? ` in the sweep combination ${combo.label}` : ''}`,
        hint: 'raise data.steps, or shorten eval.horizons and eval.waypoints',
      },
    ];
  }
  return [];
}
