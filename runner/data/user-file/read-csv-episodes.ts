/**
 * CSV user files: one row per step, an episode column (any text), a step column (integers)
 * and numeric feature columns; optional state columns. Without `features`, every numeric
 * column (judged by the first data row) other than step and state is a feature.
 */
import type { DataFileConfig } from '../../config/types.ts';
import { DataError } from '../data-error.ts';
import { parseNumericCsv, splitCsvLine } from '../formats/csv.ts';
import { groupStepRows, missingColumn } from './episodes-from-rows.ts';
import type { GroupedEpisodes, StepRow } from './episodes-from-rows.ts';

/** Parsed episodes plus the dimensions and the feature names used. */
export interface FileEpisodes extends GroupedEpisodes {
  obsDim: number;
  stateDim: number;
  featureNames: string[];
}

/** Reads CSV text into episodes. Throws DataError naming file and row. */
export function readCsvEpisodes(text: string, file: string, cfg: DataFileConfig): FileEpisodes {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  const headerAt = lines.findIndex((l) => l.trim().length > 0);
  const header =
    headerAt >= 0 ? splitCsvLine(lines[headerAt]!, file, headerAt + 1).map((h) => h.trim()) : [];
  const headerRow = headerAt + 1;
  if (header.length > 0) {
    for (const [column, role] of [
      [cfg.episodeColumn, 'episode'],
      [cfg.stepColumn, 'step'],
    ] as const) {
      if (!header.includes(column)) throw missingColumn(file, headerRow, column, role, header);
    }
    for (const column of cfg.state)
      if (!header.includes(column)) throw missingColumn(file, headerRow, column, 'state', header);
    for (const column of cfg.features ?? [])
      if (!header.includes(column)) throw missingColumn(file, headerRow, column, 'feature', header);
  }
  const features = cfg.features ?? inferFeatures(lines, headerAt, header, cfg, file);
  const used = new Set([cfg.stepColumn, ...features, ...cfg.state]);
  const table = parseNumericCsv(text, file, {
    textColumns: [cfg.episodeColumn],
    ignoreColumns: header.filter((h) => !used.has(h) && h !== cfg.episodeColumn),
  });
  const col = (name: string): number => table.columns.indexOf(name);
  const stepIdx = col(cfg.stepColumn);
  const featIdx = features.map(col);
  const stateIdx = cfg.state.map(col);
  const width = table.columns.length;
  const keys = table.text[cfg.episodeColumn] ?? [];
  const rows: StepRow[] = [];
  for (let r = 0; r < table.rows; r++) {
    const at = (i: number): number => table.data[r * width + i]!;
    const step = at(stepIdx);
    const row = table.lines[r]!;
    if (!Number.isInteger(step)) {
      throw new DataError({
        code: 'non-numeric',
        file,
        row,
        index: `column '${cfg.stepColumn}'`,
        message: `expected an integer step, got ${step}`,
        hint: 'number the steps of each episode 0, 1, 2, …',
      });
    }
    const stepRow: StepRow = { key: keys[r]!, step, row, features: Float64Array.from(featIdx, at) };
    if (stateIdx.length > 0) stepRow.state = Float64Array.from(stateIdx, at);
    rows.push(stepRow);
  }
  const grouped = groupStepRows(rows, features.length, cfg.state.length, file);
  return {
    ...grouped,
    obsDim: features.length,
    stateDim: cfg.state.length,
    featureNames: features,
  };
}

/** Default features: columns other than episode/step/state whose first data cell is a number. */
function inferFeatures(
  lines: string[],
  headerAt: number,
  header: string[],
  cfg: DataFileConfig,
  file: string,
): string[] {
  const firstAt = lines.findIndex((l, i) => i > headerAt && l.trim().length > 0);
  if (firstAt < 0) return []; // parseNumericCsv reports the empty file
  const cells = splitCsvLine(lines[firstAt]!, file, firstAt + 1);
  const skip = new Set([cfg.episodeColumn, cfg.stepColumn, ...cfg.state]);
  const features = header.filter((h, i) => !skip.has(h) && looksNumeric(cells[i] ?? ''));
  if (features.length === 0) {
    throw new DataError({
      code: 'missing-column',
      file,
      row: firstAt + 1,
      index: 'features',
      message: `expected at least one numeric feature column besides '${cfg.episodeColumn}', '${cfg.stepColumn}' and state, got none`,
      hint: 'add numeric feature columns, or list them in data.file.features',
    });
  }
  return features;
}

function looksNumeric(cell: string): boolean {
  const c = cell.trim();
  return (c.length > 0 && Number.isFinite(Number(c))) || /^[+-]?(nan|inf|infinity)$/i.test(c);
}
