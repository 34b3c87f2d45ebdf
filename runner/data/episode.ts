/**
 * CONTRACT — episodes and datasets as every later stage sees them. Owned by the data stage.
 * All arrays are row-major.
 */

export interface Episode {
  /** [steps, obsDim] observations (float32, standardised when the config asks). */
  obs: Float32Array;
  steps: number;
  obsDim: number;
  /** [steps, stateDim] true low-dimensional state, when known (evaluation only). */
  state?: Float32Array;
  stateDim?: number;
}

/** A known linear-Gaussian latent model s_{t+1} = F s_t + w, w ~ N(0, Q), o_t = h(s_t) + v. */
export interface KnownLinearModel {
  stateDim: number;
  /** [stateDim, stateDim] */
  F: Float64Array;
  /** [stateDim, stateDim] */
  Q: Float64Array;
  /** [stateDim, stateDim] stationary covariance of s. */
  stationary: Float64Array;
  /** Observation dimension (added by the data stage; optional for other producers). */
  obsDim?: number;
  /** Which observation map h the data used. */
  map?: 'linear' | 'smooth';
  /**
   * [obsDim, stateDim] observation matrix in the dataset's (standardised) units, present for
   * the linear map: o_t = H s_t + obsOffset + v_t, v_t ~ N(0, R).
   */
  H?: Float64Array;
  /** [obsDim] constant term of the linear map in standardised units. */
  obsOffset?: Float64Array;
  /** [obsDim, obsDim] observation-noise covariance in standardised units. */
  R?: Float64Array;
  /** Noiseless observation h(s) in standardised units, for any map: [stateDim] → [obsDim]. */
  observe?: (state: Float64Array) => Float64Array;
}

/** A grid maze the planning suite can act in (the rover dataset exposes one). */
export interface MazeEnvironment {
  width: number;
  height: number;
  /** True where a wall blocks the cell; index = row * width + col. */
  walls: Uint8Array;
  /** Free cells in increasing index order (added by the data stage). */
  freeCells?: number[];
  /** The cell reached by action 0..3 (up, right, down, left); a wall leaves it unchanged. */
  step?: (cell: number, action: number) => number;
  /** Cells reachable in one step from `cell` (4-neighbourhood, walls excluded). */
  neighbours(cell: number): number[];
  /** Shortest-path length between two free cells (breadth-first search); Infinity if none. */
  distance(from: number, to: number): number;
  /** One noiseless observation of a cell, as standardised in the dataset: [obsDim]. */
  observe(cell: number): Float32Array;
}

export interface Dataset {
  /** Source name and a one-line description for reports. */
  name: string;
  description: string;
  obsDim: number;
  /** Image shape [height, width] when observations are images (the conv encoder needs it). */
  imageShape?: [number, number];
  stateDim: number;
  train: Episode[];
  val: Episode[];
  test: Episode[];
  /** Present for systems with a known latent model (the oracle rows). */
  model?: KnownLinearModel;
  /** Present for maze datasets (planning). */
  maze?: MazeEnvironment;
  /** Citation / licence lines for real data. */
  provenance?: string[];
  /**
   * The standardisation fitted on the training episodes: stored = (raw - mean) / scale.
   * [obsDim] each ('global' mode repeats one value).
   */
  standardisation?: { mode: 'per-feature' | 'global'; mean: Float64Array; scale: Float64Array };
  /** Data file the episodes came from (source 'file' and real datasets). */
  file?: string;
}
