/**
 * JSON Lines user files (https://jsonlines.org): one JSON object per line and step, with the
 * episode key, the step, and features as numbers or arrays of numbers (flattened in key
 * order). Without `features`, every key of the first record other than episode, step and
 * state is a feature.
 */
import type { DataFileConfig } from '../../config/types.ts';
import { DataError } from '../data-error.ts';
import { groupStepRows, missingColumn } from './episodes-from-rows.ts';
import type { StepRow } from './episodes-from-rows.ts';
import type { FileEpisodes } from './read-csv-episodes.ts';

type Record_ = Record<string, unknown>;

/** Reads JSON Lines text into episodes. Throws DataError naming file and line. */
export function readJsonlEpisodes(text: string, file: string, cfg: DataFileConfig): FileEpisodes {
  const records: { value: Record_; row: number }[] = [];
  text.split(/\r?\n/).forEach((line, i) => {
    if (line.trim().length > 0) records.push({ value: parseLine(line, file, i + 1), row: i + 1 });
  });
  const first = records[0];
  if (!first) {
    throw new DataError({
      code: 'empty-file',
      file,
      row: 1,
      message: 'expected one JSON object per line, got an empty file',
      hint: 'write one object per step, e.g. {"episode": 0, "step": 0, "x": [0.1, 0.2]}',
    });
  }
  const skip = new Set([cfg.episodeColumn, cfg.stepColumn, ...cfg.state]);
  const features = cfg.features ?? Object.keys(first.value).filter((k) => !skip.has(k));
  const rows = records.map(({ value, row }) => recordToRow(value, row, features, cfg, file));
  const [obsDim, stateDim] = [rows[0]!.features.length, rows[0]!.state?.length ?? 0];
  for (const r of rows) {
    if (r.features.length !== obsDim || (r.state?.length ?? 0) !== stateDim) {
      throw new DataError({
        code: 'ragged-features',
        file,
        row: r.row,
        message: `expected ${obsDim} feature and ${stateDim} state values as on line ${first.row}, got ${r.features.length} and ${r.state?.length ?? 0}`,
        hint: 'every record needs arrays of the same length for each feature key',
      });
    }
  }
  const grouped = groupStepRows(rows, obsDim, stateDim, file);
  return { ...grouped, obsDim, stateDim, featureNames: features };
}

/** One record as a step row; throws on missing keys and non-numbers. */
function recordToRow(
  value: Record_,
  row: number,
  features: string[],
  cfg: DataFileConfig,
  file: string,
): StepRow {
  const keys = Object.keys(value);
  const field = (k: string, role: string): unknown => {
    if (!(k in value)) throw missingColumn(file, row, k, role, keys);
    return value[k];
  };
  const key = field(cfg.episodeColumn, 'episode');
  const keyText = typeof key === 'string' || typeof key === 'number' ? String(key) : undefined;
  const step = numbersOf(field(cfg.stepColumn, 'step'), cfg.stepColumn, file, row)[0];
  if (step === undefined || !Number.isInteger(step) || keyText === undefined) {
    const bad = step === undefined || !Number.isInteger(step) ? cfg.stepColumn : cfg.episodeColumn;
    throw new DataError({
      code: 'non-numeric',
      file,
      row,
      index: `key '${bad}'`,
      message: `expected an integer step and a string or number episode key, got ${JSON.stringify([key, value[cfg.stepColumn]])}`,
      hint: 'write e.g. "episode": "a", "step": 3',
    });
  }
  const feats = features.flatMap((k) => numbersOf(field(k, 'feature'), k, file, row));
  const state = cfg.state.flatMap((k) => numbersOf(field(k, 'state'), k, file, row));
  const out: StepRow = { key: keyText, step, row, features: Float64Array.from(feats) };
  if (state.length > 0) out.state = Float64Array.from(state);
  return out;
}

function parseLine(line: string, file: string, row: number): Record_ {
  let value: unknown;
  try {
    value = JSON.parse(line);
  } catch (error) {
    // Python's json module writes NaN / Infinity, which is not JSON; name it precisely.
    const bad = /(?<![\w"])-?(NaN|Infinity)(?![\w"])/.exec(line);
    if (bad) {
      throw new DataError({
        code: 'non-finite',
        file,
        row,
        message: `expected finite numbers, got ${bad[0]}`,
        hint: 'drop or fill missing values before writing the file',
      });
    }
    throw new DataError({
      code: 'bad-json',
      file,
      row,
      message: `expected a JSON object, got a line that does not parse (${(error as Error).message})`,
      hint: 'write exactly one JSON object per line',
    });
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new DataError({
      code: 'bad-json',
      file,
      row,
      message: `expected a JSON object, got ${Array.isArray(value) ? 'an array' : typeof value}`,
      hint: 'write one object per line, e.g. {"episode": 0, "step": 0, "x": 1.5}',
    });
  }
  return value as Record_;
}

/** A number or an array of numbers, as numbers; null is a missing (non-finite) value. */
function numbersOf(v: unknown, key: string, file: string, row: number): number[] {
  const list = Array.isArray(v) ? (v as unknown[]) : [v];
  return list.map((x, i) => {
    const index = `key '${key}'${Array.isArray(v) ? `[${i}]` : ''}`;
    if (typeof x === 'number') return x;
    if (x === null) {
      throw new DataError({
        code: 'non-finite',
        file,
        row,
        index,
        message: `expected a number at ${index}, got null (a missing value)`,
        hint: 'drop or fill missing values before writing the file',
      });
    }
    throw new DataError({
      code: 'non-numeric',
      file,
      row,
      index,
      message: `expected a number at ${index}, got ${JSON.stringify(x)}`,
      hint: 'features and state must be numbers or arrays of numbers',
    });
  });
}
