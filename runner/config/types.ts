/**
 * CONTRACT (shared by every stage) — the resolved experiment config, i.e. the YAML after
 * `extends` merging, defaults and normalisation. The config stage owns this file: once
 * `configs/schema.json` exists, these types are generated from / checked against it
 * (STYLE.md §4) and a test fails if they drift. Other stages import, never redefine.
 *
 * Defaults noted as `(default …)` are the ones the schema must carry.
 */

/** Names of the built-in dataset sources (one file each under runner/data/sources/). */
export type DataSource =
  | 'linear-gaussian' // latent linear-Gaussian system with a known model (oracle rows)
  | 'rover-maze' // warehouse rover random walk in a grid with walls, beacon sensors
  | 'swinging-lamp' // damped driven pendulum rendered as small grayscale images
  | 'lorenz' // Lorenz-63 flow lifted to obsDim by a fixed random map
  | 'seattle-weather' // real daily weather series shipped in the vega-datasets package
  | 'file'; // the user's own CSV / JSON Lines / .npy file

export interface DataFileConfig {
  /** Path, relative to the experiment file. */
  path: string;
  /** (default: from the extension) */
  format?: 'csv' | 'jsonl' | 'npy';
  /** Column holding the episode key (csv/jsonl). (default 'episode') */
  episodeColumn: string;
  /** Column holding the step index (csv/jsonl). (default 'step') */
  stepColumn: string;
  /** Feature columns; (default: every other numeric column not named in `state`) */
  features?: string[];
  /** Optional true-state columns, used only for evaluation. (default []) */
  state: string[];
}

export interface DataConfig {
  source: DataSource;
  /** Seed of the data generator and of the episode split. (default 0) */
  seed: number;
  /** Episodes to generate. (default 200, min 3) */
  episodes: number;
  /** Steps per episode. (default 64, min 2) */
  steps: number;
  /** Observation dimension of generated data (images: ignored, side² is used). (default 32) */
  obsDim: number;
  /** Observation noise standard deviation. (default 0.05, min 0) */
  noise: number;
  /** Latent dimension of the linear-Gaussian system. (default 4) */
  stateDim: number;
  /** Observation map of the linear-Gaussian system. (default 'linear') */
  map: 'linear' | 'smooth';
  /** Maze layout of the rover. (default 'open-hall') */
  layout: 'open-hall' | 'long-corridors';
  /** Image side in pixels for the lamp camera. (default 16, 8..64) */
  image: number;
  /** Integration step for the lamp and Lorenz flows (0 = the source's own default). (default 0) */
  dt: number;
  /** Episode split fractions; must sum to 1. (default 0.7 / 0.1 / 0.2) */
  split: { train: number; val: number; test: number };
  /** Standardise observations with statistics of the training episodes. (default true) */
  standardise: boolean;
  /** Only for source 'file'. */
  file?: DataFileConfig;
}

export type EncoderKind = 'linear' | 'mlp' | 'conv' | 'plugin';

export interface EncoderConfig {
  /** (default 'mlp') */
  kind: EncoderKind;
  /** Hidden widths of the MLP. (default [256, 256]) */
  widths: number[];
  /** (default 'relu') */
  activation: 'relu' | 'tanh' | 'gelu' | 'elu';
  /** Layer normalisation after each hidden layer. (default false) */
  layerNorm: boolean;
  /** Convolution channels of the conv encoder. (default [16, 32]) */
  channels: number[];
  /** Only for kind 'plugin': module path relative to the experiment file. */
  plugin?: string;
  /** Free-form options passed to the plugin factory. (default {}) */
  options: Record<string, unknown>;
}

export type CriticKind = 'distance' | 'distance-identity' | 'inner';
export type LossDirection = 'forward' | 'backward' | 'symmetric';
export type RegulariserKind = 'penalty' | 'kl' | 'none';
export type TrainEngine = 'auto' | 'tfjs' | 'native';

export interface TrainConfig {
  /** Optimiser steps. (default 2000, min 0) */
  steps: number;
  /** Pairs per batch. (default 256, min 2) */
  batch: number;
  /** Adam learning rate. (default 0.001, > 0) */
  lr: number;
  /** γ of the geometric offset law P(k) = (1-γ)γ^(k-1). (default 0.9, exclusive 0..1) */
  discount: number;
  /** (default 'distance') */
  critic: CriticKind;
  /** (default 'symmetric') */
  loss: LossDirection;
  /** (default 'penalty') */
  regulariser: RegulariserKind;
  /** Regulariser weight λ. (default 1, min 0) */
  weight: number;
  /** Target marginal variance c of N(0, cI). (default 1, > 0) */
  scale: number;
  /** Gradient-norm clip; 0 turns clipping off. (default 1, min 0) */
  clip: number;
  /** Record losses and accuracies every this many steps. (default 100, min 1) */
  logEvery: number;
  /** (default 'auto') */
  engine: TrainEngine;
}

export type MethodName =
  'contrastive' | 'pca' | 'random' | 'raw' | 'sfa' | 'autoencoder' | 'precomputed';

/** One row of the comparison table. YAML may give a bare name; it resolves to this. */
export interface MethodConfig {
  name: MethodName;
  /** Row label in tables. (default: name) */
  label: string;
  /** Only for 'precomputed': embeddings file relative to the experiment file. */
  path?: string;
}

export type SuiteName =
  'forecast' | 'bridge' | 'calibration' | 'assumptions' | 'planning' | 'projections';

export type TransitionSource = 'critic' | 'fitted' | 'true';

export interface EvalConfig {
  /** (default ['forecast', 'bridge', 'calibration', 'assumptions']) */
  suites: SuiteName[];
  /** Forecast horizons in environment steps. (default [1, 2, 4, 8]) */
  horizons: number[];
  /** Forecast horizons in jumps (sums of geometric offsets). (default [1, 2, 4]) */
  jumps: number[];
  /** Waypoint counts T of the bridge suite. (default [1, 3, 7]) */
  waypoints: number[];
  /** Transition sources evaluated. (default ['critic', 'fitted', 'true']; unavailable ones skipped) */
  transitions: TransitionSource[];
  /** Pairs used to fit the transition. (default 'geometric') */
  fit: 'consecutive' | 'geometric';
  /** Ridge ε of the fitted transition. (default 0.001) */
  ridge: number;
  /** Queries (tasks) per level. (default 200) */
  queries: number;
  /** Fixed subsample size for the assumption tests. (default 500) */
  subsample: number;
  /** Planning: tasks, step budget as a multiple of the shortest path. (default 60, 3) */
  planning: { tasks: number; budget: number };
  /** 2-D projection method for plots. (default 'pca') */
  projection: 'pca' | 'umap';
  /** Seed of the evaluation tasks, shared by every method and training seed. (default 0) */
  seed: number;
}

export interface SweepConfig {
  /** Training seeds: a count n (seeds 0..n-1) or an explicit list. (default 1) */
  seeds: number | number[];
  /** Axes: dotted config path → values; jobs are the product of all axes. (default {}) */
  axes: Record<string, unknown[]>;
  /** Groups of paths whose value lists vary together (equal lengths; one axis each group). (default []) */
  together: Record<string, unknown[]>[];
}

export interface RunConfig {
  /** Refuse plans with more jobs than this. (default 100000) */
  maxJobs: number;
  /** Retries of a crashed job (divergence is never retried). (default 1) */
  retries: number;
  /** Jobs one worker process runs before it is replaced; 1: a fresh process per job. (default 20) */
  jobsPerWorker: number;
  /** Time limits in minutes per job kind. (default train 60, evaluate 30) */
  timeout: { train: number; evaluate: number };
}

/** The resolved experiment: every key present, defaults applied. */
export interface ExperimentConfig {
  name: string;
  /** (default '') */
  description: string;
  data: DataConfig;
  encoder: EncoderConfig;
  /** Representation dimension d. (default 16, min 1) */
  dim: number;
  train: TrainConfig;
  /** (default [{ name: 'contrastive' }]) */
  methods: MethodConfig[];
  eval: EvalConfig;
  sweep: SweepConfig;
  run: RunConfig;
}
