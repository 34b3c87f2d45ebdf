import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { parseArgs } from 'node:util';
import { formatConfigErrors, type ReadSource } from '../../config/config-error.ts';
import { canonicalJson } from '../../config/canonical-json.ts';
import { readAtPath } from '../../config/config-paths.ts';
import { loadExperiment } from '../../config/load-experiment.ts';
import type { DataConfig, ExperimentConfig } from '../../config/types.ts';
import { DataError, formatDataError } from '../../data/data-error.ts';
import { describeDataset, renderAsciiFrames } from '../../data/describe-dataset.ts';
import type { DatasetSummary } from '../../data/describe-dataset.ts';
import type { Dataset } from '../../data/episode.ts';
import { loadDataset } from '../../data/load-dataset.ts';
import { requiredSteps } from '../../data/required-steps.ts';
import { expandPlan } from '../../plan/expand-plan.ts';
import type { Setting } from '../../plan/job-spec.ts';
import { EXIT, type CliCommand, type CliIo } from '../command.ts';

/** One dataset block a config resolves to, with the sweep values that produced it. */
interface DataBlock {
  label: string;
  data: DataConfig;
}

const show = (value: unknown): string =>
  typeof value === 'string' ? value : JSON.stringify(value);

/**
 * The label of a dataset block: each swept `data.*` path with its value, and for a swept
 * whole `data` block its label plus the keys that differ from the file's `data`.
 */
function labelOf(setting: Setting, data: DataConfig, base: DataConfig): string {
  const parts: string[] = [];
  for (const path of Object.keys(setting)) {
    if (path === 'data') {
      const changed = Object.entries(data)
        .filter(([key, value]) => canonicalJson(value) !== canonicalJson(readAtPath(base, [key])))
        .map(([key, value]) => `${key}: ${show(value)}`);
      parts.push(
        `data = ${show(setting[path])}${changed.length ? ` (${changed.join(', ')})` : ''}`,
      );
    } else if (path.startsWith('data.')) {
      parts.push(`${path} = ${show(readAtPath(data, path.split('.').slice(1)))}`);
    }
  }
  return parts.join(', ');
}

/**
 * The distinct dataset blocks of the plan's train jobs, each labelled with the sweep values
 * that produced it. Taken from the expanded plan, so `data` axes, `data.*` axes and
 * `sweep.together` groups resolve exactly as they do for `run`.
 */
export function listDataBlocks(config: ExperimentConfig, baseDir: string): DataBlock[] {
  const blocks = new Map<string, DataBlock>();
  for (const job of expandPlan(config, baseDir)) {
    if (job.kind !== 'train') continue;
    const key = canonicalJson(job.data);
    if (blocks.has(key)) continue;
    const label = labelOf(job.setting, job.data, config.data);
    blocks.set(key, { label, data: job.data });
  }
  return [...blocks.values()];
}

const fmt = (x: number): string =>
  Math.abs(x) >= 1e4 || (x !== 0 && Math.abs(x) < 1e-3)
    ? x.toExponential(2)
    : String(+x.toFixed(3));

/** The text block for one dataset. */
function formatSummary(s: DatasetSummary, ds: Dataset): string[] {
  const { train, val, test } = s.splits;
  const total = train.episodes + val.episodes + test.episodes;
  const lengths = [train, val, test].filter((x) => x.episodes > 0);
  const lo = Math.min(...lengths.map((x) => x.minSteps));
  const hi = Math.max(...lengths.map((x) => x.maxSteps));
  const lines = [
    `  ${s.description}`,
    `  episodes  train ${train.episodes} · val ${val.episodes} · test ${test.episodes}  (${total} in all)`,
    `  steps     ${lo === hi ? `${lo} per episode` : `${lo}..${hi} per episode`}  (${train.steps + val.steps + test.steps} in all)`,
    `  obs       ${s.obsDim} dims${s.imageShape ? ` (${s.imageShape[0]}×${s.imageShape[1]} images)` : ''}, range [${fmt(s.obsRange.min)}, ${fmt(s.obsRange.max)}], standardised: ${s.standardised}`,
    `  state     ${s.stateDim === 0 ? 'none' : `${s.stateDim} dims: ${s.stateRanges.map((r) => `[${fmt(r.min)}, ${fmt(r.max)}]`).join(' ')}`}`,
  ];
  if (s.model)
    lines.push(
      `  model     known linear-Gaussian latent (${s.model.stateDim} dims, ${s.model.map ?? 'linear'} map): oracle rows available`,
    );
  if (s.maze)
    lines.push(
      `  maze      ${s.maze.height}×${s.maze.width} grid, ${s.maze.freeCells} free cells: planning suite available`,
    );
  if (!s.imageShape) {
    const shown = s.obsRanges.slice(0, 8).map((r, i) => `${i}:[${fmt(r.min)}, ${fmt(r.max)}]`);
    lines.push(`  columns   ${shown.join(' ')}${s.obsDim > 8 ? ` … (${s.obsDim - 8} more)` : ''}`);
  }
  for (const p of s.provenance ?? []) lines.push(`  source    ${p}`);
  const first = ds.train[0];
  if (s.imageShape && first) {
    const size = s.imageShape[0] * s.imageShape[1];
    const picks = [0, 1, 2, 3].map((k) => Math.floor((k * (first.steps - 1)) / 3));
    lines.push(`  preview   train episode 0, steps ${picks.join(', ')}:`);
    const frames = picks.map((t) => first.obs.subarray(t * size, (t + 1) * size));
    for (const row of renderAsciiFrames(frames, s.imageShape)) lines.push(`    ${row}`);
  }
  return lines;
}

function parseInspectArgs(args: string[], io: CliIo): { file: string; json: boolean } | undefined {
  try {
    const { positionals, values } = parseArgs({
      args,
      allowPositionals: true,
      options: { json: { type: 'boolean' } },
      strict: true,
    });
    if (positionals.length === 1) return { file: positionals[0]!, json: values.json === true };
    io.err(
      `midpath inspect: expected one experiment file, got ${positionals.length}\n${inspectCommand.usage}`,
    );
  } catch (cause) {
    io.err(`midpath inspect: ${(cause as Error).message}\n${inspectCommand.usage}`);
  }
  return undefined;
}

const readSourceIn =
  (cwd: string): ReadSource =>
  (file) => {
    try {
      return readFileSync(resolve(cwd, file), 'utf8');
    } catch {
      return undefined;
    }
  };

/** `midpath inspect FILE [--json]`: shows the data an experiment file resolves to. */
export const inspectCommand: CliCommand = {
  name: 'inspect',
  summary: 'show the datasets an experiment file resolves to: splits, sizes, ranges, previews',
  usage: [
    'Usage: midpath inspect FILE [--json]',
    '',
    'Builds every dataset the experiment file resolves to (one per `data` sweep value) and',
    'prints episodes per split, steps, observation and state dimensions, value ranges, and an',
    'ASCII preview of image data. --json prints the same as one JSON object.',
    'Exit status: 0 when every dataset loads, 2 on a config or data error. Nothing is written.',
  ].join('\n'),
  async run(args, io) {
    const parsed = parseInspectArgs(args, io);
    if (!parsed) return EXIT.badInput;
    const loaded = await loadExperiment(parsed.file, { cwd: io.cwd });
    if (!loaded.ok) {
      io.err(formatConfigErrors(loaded.errors, readSourceIn(io.cwd)));
      return EXIT.badInput;
    }
    const minSteps = requiredSteps(loaded.config.eval);
    const reports: { label: string; summary: DatasetSummary }[] = [];
    const blocks = listDataBlocks(loaded.config, loaded.baseDir);
    for (const [i, block] of blocks.entries()) {
      let ds: Dataset;
      try {
        ds = await loadDataset(block.data, loaded.baseDir, { minSteps });
      } catch (error) {
        if (!(error instanceof DataError)) throw error;
        io.err(
          `${parsed.file}${block.label ? ` (${block.label})` : ''}:\n${formatDataError(error)}`,
        );
        return EXIT.badInput;
      }
      const summary = describeDataset(ds);
      reports.push({ label: block.label, summary });
      if (!parsed.json) {
        const head = `dataset ${i + 1} of ${blocks.length}: ${summary.name}${block.label ? `  (${block.label})` : ''}`;
        io.out([head, ...formatSummary(summary, ds), ''].join('\n'));
      }
    }
    if (parsed.json)
      io.out(JSON.stringify({ file: parsed.file, minSteps, datasets: reports }, null, 2));
    return EXIT.ok;
  },
};
