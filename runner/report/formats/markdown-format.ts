/**
 * Markdown: a pipe table of the tidy rows with three significant digits, the 95 % interval
 * as "[low, high]", and the best row of each group in bold (ties in italics).
 */
import { formatValue } from '../format-number.ts';
import { markOf, type TidyTable } from '../tidy-table.ts';
import type { TableFormat } from './table-format.ts';

/** Escapes the characters that would break a pipe-table cell or turn into emphasis. */
export function escapeMarkdownCell(text: string): string {
  return text.replace(/[\\|*_`[\]<>]/g, (c) => `\\${c}`).replace(/\r?\n/g, ' ');
}

function intervalText(low: number, high: number): string {
  return Number.isFinite(low) && Number.isFinite(high)
    ? `[${formatValue(low)}, ${formatValue(high)}]`
    : '–';
}

export const markdownFormat: TableFormat = {
  name: 'markdown',
  render(table: TidyTable): string {
    const header = [
      ...table.settingColumns,
      'method',
      'suite',
      'metric',
      'source',
      'level',
      'unit',
    ];
    header.push('n', 'mean', 'std', '95 % interval');
    const lines = [
      `| ${header.map(escapeMarkdownCell).join(' | ')} |`,
      `|${header.map((_, i) => (i >= header.length - 4 ? ' ---: ' : ' --- ')).join('|')}|`,
    ];
    for (const row of table.rows) {
      const mark = markOf(table, row);
      const wrap = mark === 'best' ? '**' : mark === 'tie' ? '_' : '';
      const cells = [
        ...table.settingColumns.map((c) => escapeMarkdownCell(row.setting[c] ?? '')),
        escapeMarkdownCell(row.method),
        escapeMarkdownCell(row.suite),
        escapeMarkdownCell(row.metric),
        escapeMarkdownCell(row.source),
        escapeMarkdownCell(String(row.level)),
        escapeMarkdownCell(row.unit),
        String(row.n),
        `${wrap}${formatValue(row.mean)}${wrap}`,
        formatValue(row.std),
        intervalText(row.ciLow, row.ciHigh),
      ];
      lines.push(`| ${cells.join(' | ')} |`);
    }
    lines.push('', 'Bold: best in its group (same setting, metric, source and level);');
    lines.push(
      'italics: 95 % interval overlaps the best one. Intervals are t-intervals over seeds.',
    );
    return `${lines.join('\n')}\n`;
  },
};
