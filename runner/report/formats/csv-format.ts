/** CSV (RFC 4180): a header row, then one line per tidy row; full-precision numbers. */
import { TIDY_COLUMNS, tidyRecord, type TidyTable } from '../tidy-table.ts';
import type { TableFormat } from './table-format.ts';

/** Quotes a field when it holds a comma, a quote or a line break (RFC 4180 §2.6–2.7). */
export function quoteCsvField(value: string | number | null): string {
  const text = value === null ? '' : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

export const csvFormat: TableFormat = {
  name: 'csv',
  render(table: TidyTable): string {
    const header = [...table.settingColumns, ...TIDY_COLUMNS];
    const lines = [header.map(quoteCsvField).join(',')];
    for (const row of table.rows) {
      const record = tidyRecord(table, row);
      lines.push(header.map((column) => quoteCsvField(record[column] ?? null)).join(','));
    }
    // RFC 4180 ends records with CRLF.
    return `${lines.join('\r\n')}\r\n`;
  },
};
