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
}

/** A grid maze the planning suite can act in (the rover dataset exposes one). */
export interface MazeEnvironment {
  width: number;
  height: number;
  /** True where a wall blocks the cell; index = row * width + col. */
  walls: Uint8Array;
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
}
