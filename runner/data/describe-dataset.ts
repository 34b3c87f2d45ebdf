/**
 * A plain, JSON-ready summary of a dataset: what `midpath inspect` prints and reports show.
 * Ranges are over every split (after standardisation, i.e. as the encoder sees them).
 */
import type { Dataset, Episode } from './episode.ts';

/** Counts and lengths of one split. */
export interface SplitSummary {
  episodes: number;
  steps: number;
  minSteps: number;
  maxSteps: number;
}

/** Min and max of one column. */
export interface ValueRange {
  min: number;
  max: number;
}

/** The summary of a dataset. */
export interface DatasetSummary {
  name: string;
  description: string;
  obsDim: number;
  stateDim: number;
  imageShape?: [number, number];
  splits: { train: SplitSummary; val: SplitSummary; test: SplitSummary };
  /** Over every observation value. */
  obsRange: ValueRange;
  /** Per observation column. [obsDim] */
  obsRanges: ValueRange[];
  /** Per state column. [stateDim] */
  stateRanges: ValueRange[];
  standardised: 'per-feature' | 'global' | 'no';
  model?: { stateDim: number; map?: string };
  maze?: { width: number; height: number; freeCells: number };
  provenance?: string[];
  file?: string;
}

function summariseSplit(eps: Episode[]): SplitSummary {
  const lengths = eps.map((e) => e.steps);
  return {
    episodes: eps.length,
    steps: lengths.reduce((a, b) => a + b, 0),
    minSteps: lengths.length > 0 ? Math.min(...lengths) : 0,
    maxSteps: lengths.length > 0 ? Math.max(...lengths) : 0,
  };
}

/** Column-wise min/max of [steps, dim] blocks. */
function columnRanges(blocks: Float32Array[], dim: number): ValueRange[] {
  const out = Array.from({ length: dim }, () => ({ min: Infinity, max: -Infinity }));
  for (const b of blocks) {
    for (let i = 0; i < b.length; i++) {
      const r = out[i % dim]!;
      const v = b[i]!;
      if (v < r.min) r.min = v;
      if (v > r.max) r.max = v;
    }
  }
  return out;
}

/** Summarises a dataset for display; pure. */
export function describeDataset(ds: Dataset): DatasetSummary {
  const all = [...ds.train, ...ds.val, ...ds.test];
  const obsRanges = columnRanges(
    all.map((e) => e.obs),
    ds.obsDim,
  );
  const states = all.flatMap((e) => (e.state ? [e.state] : []));
  const summary: DatasetSummary = {
    name: ds.name,
    description: ds.description,
    obsDim: ds.obsDim,
    stateDim: ds.stateDim,
    splits: {
      train: summariseSplit(ds.train),
      val: summariseSplit(ds.val),
      test: summariseSplit(ds.test),
    },
    obsRange: {
      min: Math.min(...obsRanges.map((r) => r.min)),
      max: Math.max(...obsRanges.map((r) => r.max)),
    },
    obsRanges,
    stateRanges: ds.stateDim > 0 ? columnRanges(states, ds.stateDim) : [],
    standardised: ds.standardisation?.mode ?? 'no',
  };
  if (ds.imageShape) summary.imageShape = ds.imageShape;
  if (ds.model)
    summary.model = { stateDim: ds.model.stateDim, ...(ds.model.map ? { map: ds.model.map } : {}) };
  if (ds.maze) {
    const free = ds.maze.walls.reduce((n, w) => n + (w === 0 ? 1 : 0), 0);
    summary.maze = { width: ds.maze.width, height: ds.maze.height, freeCells: free };
  }
  if (ds.provenance) summary.provenance = ds.provenance;
  if (ds.file !== undefined) summary.file = ds.file;
  return summary;
}

/**
 * ASCII preview of image frames side by side (rows of characters, darkest ' ' to
 * brightest '@'). The scale runs from the 80th percentile to the maximum of the frames
 * shown, so sensor noise on a dark background stays blank and the object stands out.
 * frames: [n][h·w].
 */
export function renderAsciiFrames(frames: Float32Array[], shape: [number, number]): string[] {
  const ramp = ' .:-=+*#%@';
  const [h, w] = shape;
  const sorted = frames.flatMap((f) => Array.from(f)).sort((a, b) => a - b);
  const lo = sorted[Math.floor(0.8 * (sorted.length - 1))] ?? 0;
  const hi = sorted[sorted.length - 1] ?? 1;
  const span = hi > lo ? hi - lo : 1;
  const lines: string[] = [];
  for (let r = 0; r < h; r++) {
    const parts = frames.map((f) => {
      let s = '';
      for (let c = 0; c < w; c++) {
        const x = Math.max(0, (f[r * w + c]! - lo) / span);
        s += ramp[Math.min(ramp.length - 1, Math.floor(x * (ramp.length - 1) + 0.5))]!.repeat(2); // two characters per pixel keep the aspect ratio
      }
      return s;
    });
    lines.push(parts.join('  '));
  }
  return lines;
}
