/**
 * The one entry point from a data config to a Dataset: runs the source (a generator, a
 * reader of the user's file, or the shipped real dataset), checks every episode is long
 * enough, splits by episode with a stream seeded by config.seed, and standardises with
 * statistics of the training episodes only. This file is the I/O edge of the data stage:
 * it alone touches the file system, and hands sources a DataIo.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import type { DataConfig } from '../config/types.ts';
import { createRng } from '../numeric/random.ts';
import { DataError } from './data-error.ts';
import type { Dataset, Episode, KnownLinearModel, MazeEnvironment } from './episode.ts';
import type { DataIo, SourceData } from './source.ts';
import { dataSources } from './sources/index.ts';
import { splitEpisodes } from './split-episodes.ts';
import { applyStandardisation, fitStandardisation } from './standardise.ts';
import type { Standardisation } from './standardise.ts';
import { checkDataConfig } from './check-data-config.ts';

/** Options of loadDataset. */
export interface LoadDatasetOptions {
  /** The longest horizon the evaluation needs, in steps; shorter episodes are an error. */
  minSteps?: number;
}

/** Builds the dataset a data config describes. Throws DataError on bad input. */
export function loadDataset(
  config: DataConfig,
  baseDir: string,
  options: LoadDatasetOptions = {},
): Promise<Dataset> {
  try {
    return Promise.resolve(buildDataset(config, baseDir, options));
  } catch (error) {
    return Promise.reject(error instanceof Error ? error : new Error(String(error)));
  }
}

function buildDataset(config: DataConfig, baseDir: string, options: LoadDatasetOptions): Dataset {
  checkDataConfig(config);
  const root = createRng(config.seed);
  const sourceRng = root.fork(`source:${config.source}`);
  const splitRng = root.fork('split');
  const raw = dataSources[config.source].produce(config, sourceRng, createDataIo(baseDir));
  checkEpisodeLengths(raw, Math.max(2, options.minSteps ?? 2));
  const split = splitEpisodes(raw.episodes.length, config.split, splitRng, raw.file);
  const pick = (idx: number[]): Episode[] => idx.map((i) => raw.episodes[i]!);
  let train = pick(split.train);
  let val = pick(split.val);
  let test = pick(split.test);
  let standardisation: Standardisation | undefined;
  if (config.standardise) {
    const s = fitStandardisation(train, raw.obsDim, raw.standardise ?? 'per-feature');
    const apply = (eps: Episode[]): Episode[] =>
      eps.map((ep) => ({ ...ep, obs: applyStandardisation(ep.obs, s) }));
    [train, val, test] = [apply(train), apply(val), apply(test)];
    standardisation = s;
  }
  const dataset: Dataset = {
    name: raw.name,
    description: raw.description,
    obsDim: raw.obsDim,
    stateDim: raw.stateDim,
    train,
    val,
    test,
  };
  if (raw.imageShape) dataset.imageShape = raw.imageShape;
  if (raw.provenance) dataset.provenance = raw.provenance;
  if (raw.file !== undefined) dataset.file = raw.file;
  if (standardisation) dataset.standardisation = standardisation;
  if (raw.model) dataset.model = standardiseModel(raw.model, standardisation);
  if (raw.maze) dataset.maze = standardiseMaze(raw.maze, standardisation);
  return dataset;
}

function checkEpisodeLengths(raw: SourceData, minSteps: number): void {
  raw.episodes.forEach((ep, i) => {
    if (ep.steps >= minSteps) return;
    const key = raw.keys?.[i];
    const row = raw.firstRows?.[i];
    throw new DataError({
      code: 'episode-too-short',
      ...(raw.file !== undefined ? { file: raw.file } : {}),
      ...(row !== undefined ? { row } : {}),
      index: key !== undefined ? `episode '${key}'` : `episode ${i}`,
      message: `expected at least ${minSteps} steps per episode (the longest horizon the evaluation needs), got ${ep.steps}`,
      hint: raw.file
        ? 'drop or merge short episodes, or lower the largest eval.horizons / eval.waypoints'
        : 'raise data.steps, or lower the largest eval.horizons / eval.waypoints',
    });
  });
}

/** Re-expresses the observation side of a known model in standardised units. */
function standardiseModel(
  model: NonNullable<SourceData['model']>,
  s: Standardisation | undefined,
): KnownLinearModel {
  const { observeRaw, H, R, ...rest } = model;
  const out: KnownLinearModel = { ...rest };
  const p = model.obsDim ?? s?.mean.length ?? 0;
  const n = model.stateDim;
  const mean = s?.mean ?? new Float64Array(p);
  const scale = s?.scale ?? new Float64Array(p).fill(1);
  if (H) {
    out.H = H.map((h, k) => h / scale[Math.floor(k / n)]!);
    out.obsOffset = mean.map((m, i) => -m / scale[i]!);
  }
  if (R) out.R = R.map((r, k) => r / (scale[Math.floor(k / p)]! * scale[k % p]!));
  if (observeRaw)
    out.observe = (state) =>
      Float64Array.from(
        applyStandardisation(observeRaw(state), { mode: 'per-feature', mean, scale }),
      );
  return out;
}

function standardiseMaze(maze: MazeEnvironment, s: Standardisation | undefined): MazeEnvironment {
  if (!s) return maze;
  return { ...maze, observe: (cell) => applyStandardisation(maze.observe(cell), s) };
}

/** File access for sources, with errors that name the missing file. */
function createDataIo(baseDir: string): DataIo {
  const read = (path: string): Buffer => {
    const full = isAbsolute(path) ? path : resolve(baseDir, path);
    try {
      return readFileSync(full);
    } catch (error) {
      throw new DataError({
        code: 'file-not-found',
        file: path,
        message: `expected a readable file, got ${(error as NodeJS.ErrnoException).code ?? 'an error'} for ${full}`,
        hint: 'data.file.path is resolved relative to the experiment file; check the path',
      });
    }
  };
  return {
    baseDir,
    readText: (path) => read(path).toString('utf8'),
    readBytes: (path) => new Uint8Array(read(path)),
    resolvePackageFile: (pkg, relative) => {
      // The package's main entry lives under build/; data files sit beside it at the root.
      const entry = createRequire(import.meta.url).resolve(pkg);
      let dir = dirname(entry);
      while (!dir.endsWith(`node_modules/${pkg}`) && dirname(dir) !== dir) dir = dirname(dir);
      return join(dir, relative);
    },
  };
}
