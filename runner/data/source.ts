/**
 * The small interface every dataset source implements (STYLE.md §7): one file under
 * `sources/` plus one entry in `sources/index.ts`. A source returns all of its episodes,
 * unsplit and unstandardised; `loadDataset` splits and standardises them the same way for
 * every source. Generators are pure functions of (config, rng); the two sources that read
 * files get them through the injected `DataIo`, so no source touches the file system itself.
 */
import type { DataConfig } from '../config/types.ts';
import type { Rng } from '../numeric/random.ts';
import type { Episode, KnownLinearModel, MazeEnvironment } from './episode.ts';

/** File access handed to sources that read data (the only I/O a source may do). */
export interface DataIo {
  /** Directory that relative paths in the config are resolved against. */
  baseDir: string;
  readText(path: string): string;
  readBytes(path: string): Uint8Array;
  /** Absolute path of a file shipped inside an installed npm package. */
  resolvePackageFile(pkg: string, relative: string): string;
}

/** How observations are standardised on the training episodes. */
export type StandardiseMode =
  | 'per-feature' // each column to zero mean, unit variance
  | 'global'; // one mean and scale for every column (keeps images images)

/** What a source hands back: every episode, before the split. */
export interface SourceData {
  name: string;
  description: string;
  obsDim: number;
  stateDim: number;
  episodes: Episode[];
  /** File that the episodes came from, for error messages. */
  file?: string;
  /** 1-based first file row of each episode (file sources), for error messages. [episodes] */
  firstRows?: number[];
  /** Episode keys as the user wrote them (file sources). [episodes] */
  keys?: string[];
  imageShape?: [number, number];
  standardise?: StandardiseMode;
  /**
   * Known linear-Gaussian latent model. `observeRaw` gives the noiseless observation in raw
   * units; `loadDataset` turns it into standardised units.
   */
  model?: KnownLinearModel & {
    observeRaw?: (state: Float64Array) => Float64Array;
    H?: Float64Array;
  };
  /** The maze, with `observe` in raw units (standardised by loadDataset). */
  maze?: MazeEnvironment;
  provenance?: string[];
}

/** A dataset source: a description for docs and a producer of episodes. */
export interface DataSourceImpl {
  /** One line for `inspect` and reports. */
  summary: string;
  /** Builds every episode. `rng` is this source's own stream, forked from config.seed. */
  produce(config: DataConfig, rng: Rng, io: DataIo): SourceData;
}
