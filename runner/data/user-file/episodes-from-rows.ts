/**
 * Groups step rows of a user file into episodes, checking that each episode's steps are in
 * increasing order without gaps. Shared by the CSV and JSON Lines readers.
 */
import { DataError } from '../data-error.ts';
import type { Episode } from '../episode.ts';

/** One step as read from a file. */
export interface StepRow {
  /** Episode key as written (numbers are kept as their text). */
  key: string;
  step: number;
  /** 1-based line in the file. */
  row: number;
  /** [features] */
  features: Float64Array;
  /** [stateDim] */
  state?: Float64Array;
}

/** Episodes in order of first appearance, with their keys and first rows. */
export interface GroupedEpisodes {
  episodes: Episode[];
  keys: string[];
  firstRows: number[];
}

/** Groups rows by episode key; throws 'unordered-steps' / 'missing-steps' with the row. */
export function groupStepRows(
  rows: StepRow[],
  obsDim: number,
  stateDim: number,
  file: string,
): GroupedEpisodes {
  const groups = new Map<string, StepRow[]>();
  for (const r of rows) {
    const g = groups.get(r.key);
    if (g) g.push(r);
    else groups.set(r.key, [r]);
  }
  const out: GroupedEpisodes = { episodes: [], keys: [], firstRows: [] };
  for (const [key, g] of groups) {
    checkStepOrder(g, key, file);
    const obs = new Float32Array(g.length * obsDim);
    const state = stateDim > 0 ? new Float32Array(g.length * stateDim) : undefined;
    g.forEach((r, t) => {
      obs.set(r.features, t * obsDim);
      if (state && r.state) state.set(r.state, t * stateDim);
    });
    const episode: Episode = { obs, steps: g.length, obsDim };
    if (state) {
      episode.state = state;
      episode.stateDim = stateDim;
    }
    out.episodes.push(episode);
    out.keys.push(key);
    out.firstRows.push(g[0]!.row);
  }
  return out;
}

function checkStepOrder(g: StepRow[], key: string, file: string): void {
  // Order first: a swapped pair would otherwise be reported as a gap.
  for (let i = 1; i < g.length; i++) {
    const prev = g[i - 1]!;
    const cur = g[i]!;
    if (cur.step <= prev.step) {
      throw new DataError({
        code: 'unordered-steps',
        file,
        row: cur.row,
        index: `episode '${key}'`,
        message: `expected step > ${prev.step} (row ${prev.row}) in episode '${key}', got step ${cur.step}`,
        hint: 'sort the rows of each episode by step, and give each step once',
      });
    }
  }
  for (let i = 1; i < g.length; i++) {
    const prev = g[i - 1]!;
    const cur = g[i]!;
    if (cur.step !== prev.step + 1) {
      throw new DataError({
        code: 'missing-steps',
        file,
        row: cur.row,
        index: `episode '${key}'`,
        message: `expected step ${prev.step + 1} after step ${prev.step} in episode '${key}', got step ${cur.step}`,
        hint: 'steps must be consecutive integers; fill the gap or split the episode in two',
      });
    }
  }
}

/** The 'missing-column' error for a configured column absent from a file. */
export function missingColumn(
  file: string,
  row: number,
  column: string,
  role: string,
  available: string[],
): DataError {
  return new DataError({
    code: 'missing-column',
    file,
    row,
    index: `column '${column}'`,
    message: `expected a ${role} column '${column}', got columns ${available.map((c) => `'${c}'`).join(', ')}`,
    hint: `rename the column in the file, or set data.file.${role === 'feature' ? 'features' : role === 'state' ? 'state' : `${role}Column`} to one of the columns above`,
  });
}
