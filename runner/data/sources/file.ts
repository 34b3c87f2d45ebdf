/**
 * The user's own file: CSV, JSON Lines or NumPy .npy, chosen by data.file.format or the
 * extension. The file is read through the injected DataIo (the only I/O here).
 */
import type { DataConfig, DataFileConfig } from '../../config/types.ts';
import { DataError } from '../data-error.ts';
import type { DataIo, DataSourceImpl, SourceData } from '../source.ts';
import { readCsvEpisodes } from '../user-file/read-csv-episodes.ts';
import type { FileEpisodes } from '../user-file/read-csv-episodes.ts';
import { readJsonlEpisodes } from '../user-file/read-jsonl-episodes.ts';
import { readNpyEpisodes } from '../user-file/read-npy-episodes.ts';

/** The file's format from the config or its extension. */
export function detectFormat(cfg: DataFileConfig): 'csv' | 'jsonl' | 'npy' {
  if (cfg.format) return cfg.format;
  const ext = /\.([a-z0-9]+)$/i.exec(cfg.path)?.[1]?.toLowerCase();
  if (ext === 'csv' || ext === 'npy') return ext;
  if (ext === 'jsonl' || ext === 'ndjson') return 'jsonl';
  throw new DataError({
    code: 'unknown-format',
    file: cfg.path,
    message: `expected a .csv, .jsonl or .npy file, got extension '${ext ?? ''}'`,
    hint: "set data.file.format to 'csv', 'jsonl' or 'npy'",
  });
}

function produce(config: DataConfig, _rng: unknown, io: DataIo): SourceData {
  const cfg = config.file;
  if (!cfg) {
    throw new DataError({
      code: 'bad-config',
      index: 'data.file',
      message: 'expected a data.file block for source file, got none',
      hint: 'add data.file.path',
    });
  }
  const format = detectFormat(cfg);
  let read: FileEpisodes;
  if (format === 'npy') {
    if (cfg.state.length > 0 || (cfg.features?.length ?? 0) > 0) {
      throw new DataError({
        code: 'bad-config',
        file: cfg.path,
        index: 'data.file',
        message: 'expected no features/state columns for a .npy file, got some',
        hint: '.npy files hold observations only; remove data.file.features and data.file.state',
      });
    }
    read = readNpyEpisodes(io.readBytes(cfg.path), cfg.path);
  } else {
    const text = io.readText(cfg.path);
    read =
      format === 'csv'
        ? readCsvEpisodes(text, cfg.path, cfg)
        : readJsonlEpisodes(text, cfg.path, cfg);
  }
  const out: SourceData = {
    name: 'file',
    description: `${cfg.path} (${format}): ${read.obsDim} features${read.stateDim > 0 ? `, ${read.stateDim} state column${read.stateDim === 1 ? '' : 's'}` : ''}`,
    obsDim: read.obsDim,
    stateDim: read.stateDim,
    episodes: read.episodes,
    file: cfg.path,
    keys: read.keys,
  };
  if (read.firstRows.length > 0) out.firstRows = read.firstRows;
  return out;
}

/** The user-file source. */
export const userFile: DataSourceImpl = {
  summary: "the user's own CSV, JSON Lines or .npy file",
  produce,
};
