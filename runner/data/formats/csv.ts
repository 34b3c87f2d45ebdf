/**
 * A reader for numeric CSV (RFC 4180: comma-separated, optional double quotes, "" escapes a
 * quote; a quoted field may not span lines here). The first line is the header. Every cell of
 * a numeric column must parse as a finite number; errors name the file, the 1-based line and
 * the column. Pure: takes text, returns arrays; the caller reads the file.
 */
import { DataError } from '../data-error.ts';

/** Options of parseNumericCsv. */
export interface CsvOptions {
  /** Columns kept as text (e.g. an episode key or a date) instead of parsed as numbers. */
  textColumns?: string[];
  /** Columns dropped without checking (e.g. a categorical label). */
  ignoreColumns?: string[];
}

/** A parsed table: numeric columns as a dense matrix, text columns as strings. */
export interface NumericTable {
  /** Names of the numeric columns, in file order. */
  columns: string[];
  rows: number;
  /** [rows, columns.length] row-major. */
  data: Float64Array;
  /** 1-based file line of each row, for error messages downstream. [rows] */
  lines: Int32Array;
  /** Text columns by name: [rows] each. */
  text: Record<string, string[]>;
}

/** Parses CSV text whose cells are numbers (apart from `textColumns`). Throws DataError. */
export function parseNumericCsv(
  text: string,
  fileName: string,
  options: CsvOptions = {},
): NumericTable {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  const { header, bodyLines } = locateRows(lines, fileName);
  const textSet = new Set(options.textColumns ?? []);
  const ignoreSet = new Set(options.ignoreColumns ?? []);
  const numericIdx: number[] = [];
  const textIdx: number[] = [];
  header.forEach((name, i) => {
    if (textSet.has(name)) textIdx.push(i);
    else if (!ignoreSet.has(name)) numericIdx.push(i);
  });
  const width = numericIdx.length;
  const data = new Float64Array(bodyLines.length * width);
  const lineNumbers = new Int32Array(bodyLines.length);
  const textOut: Record<string, string[]> = {};
  for (const i of textIdx) textOut[header[i]!] = [];
  bodyLines.forEach((lineIndex, r) => {
    const row = lineIndex + 1;
    lineNumbers[r] = row;
    const cells = splitCsvLine(lines[lineIndex]!, fileName, row);
    if (cells.length !== header.length) {
      throw new DataError({
        code: 'ragged-row',
        file: fileName,
        row,
        message: `expected ${header.length} cells as in the header, got ${cells.length}`,
        hint: 'every row needs one cell per header column; check for a missing or extra comma',
      });
    }
    numericIdx.forEach((c, k) => {
      data[r * width + k] = parseCell(cells[c]!, header[c]!, fileName, row);
    });
    for (const c of textIdx) textOut[header[c]!]!.push(cells[c]!.trim());
  });
  const columns = numericIdx.map((i) => header[i]!);
  return { columns, rows: bodyLines.length, data, lines: lineNumbers, text: textOut };
}

/** The header cells and the 0-based indices of the non-blank lines after it. */
function locateRows(lines: string[], fileName: string): { header: string[]; bodyLines: number[] } {
  const headerIndex = lines.findIndex((l) => l.trim().length > 0);
  if (headerIndex < 0) {
    throw new DataError({
      code: 'empty-file',
      file: fileName,
      row: 1,
      message: 'expected a header line and at least one row, got an empty file',
      hint: 'write a header such as "episode,step,x1,x2" followed by one row per step',
    });
  }
  const header = splitCsvLine(lines[headerIndex]!, fileName, headerIndex + 1).map((h) => h.trim());
  const bodyLines: number[] = [];
  for (let i = headerIndex + 1; i < lines.length; i++) {
    if (lines[i]!.trim().length > 0) bodyLines.push(i);
  }
  if (bodyLines.length === 0) {
    throw new DataError({
      code: 'empty-file',
      file: fileName,
      row: headerIndex + 1,
      message: 'expected at least one data row after the header, got none',
      hint: 'add one row per step below the header',
    });
  }
  return { header, bodyLines };
}

/** Parses one numeric cell; NaN / Infinity / text are errors naming row and column. */
function parseCell(raw: string, column: string, fileName: string, row: number): number {
  const cell = raw.trim();
  const value = cell.length === 0 ? Number.NaN : Number(cell);
  if (Number.isFinite(value)) return value;
  if (/^[+-]?(nan|inf|infinity)$/i.test(cell)) {
    throw new DataError({
      code: 'non-finite',
      file: fileName,
      row,
      index: `column '${column}'`,
      message: `expected a finite number in column '${column}', got '${cell}'`,
      hint: 'drop or fill missing values (e.g. interpolate) before training',
    });
  }
  throw new DataError({
    code: 'non-numeric',
    file: fileName,
    row,
    index: `column '${column}'`,
    message: `expected a number in column '${column}', got ${cell.length === 0 ? 'an empty cell' : `'${cell}'`}`,
    hint: 'feature, state and step columns must hold plain numbers such as 0.25 or -3e-2',
  });
}

/** Splits one CSV line into cells, honouring double-quoted fields. */
export function splitCsvLine(line: string, fileName: string, row: number): string[] {
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!;
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      cells.push(cell);
      cell = '';
    } else cell += ch;
  }
  if (quoted) {
    throw new DataError({
      code: 'ragged-row',
      file: fileName,
      row,
      message: 'expected a closing double quote, got the end of the line',
      hint: 'close the quoted field; quoted fields may not span lines',
    });
  }
  cells.push(cell);
  return cells;
}
