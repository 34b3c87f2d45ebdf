/**
 * JSON: `{ settingColumns, rows }`, each row with its setting as an object (so a setting
 * named like a fixed column cannot clash), full-precision numbers, null for missing values,
 * and `best` ('best' | 'tie' | '') as marked in the HTML and LaTeX tables.
 */
import { machineNumber, markOf, type TidyTable } from '../tidy-table.ts';
import type { TableFormat } from './table-format.ts';

/** The JSON document as a value (also embedded in the HTML report). */
export function tidyJson(table: TidyTable): { settingColumns: string[]; rows: unknown[] } {
  const rows = table.rows.map((row) => ({
    setting: row.setting,
    method: row.method,
    suite: row.suite,
    metric: row.metric,
    source: row.source,
    level: row.level,
    unit: row.unit,
    n: row.n,
    mean: machineNumber(row.mean),
    std: machineNumber(row.std),
    ci_low: machineNumber(row.ciLow),
    ci_high: machineNumber(row.ciHigh),
    best: markOf(table, row),
  }));
  return { settingColumns: table.settingColumns, rows };
}

export const jsonFormat: TableFormat = {
  name: 'json',
  render: (table: TidyTable): string => `${JSON.stringify(tidyJson(table), null, 2)}\n`,
};
