/**
 * LaTeX: one booktabs table per (suite, metric, source), ready to paste. Rows are setting ×
 * method, columns the levels (horizons, waypoint counts, distance bins); a cell is
 * "mean ± half-width of the 95 % t-interval over seeds"; the best row of each column within a
 * setting is in bold, and so are the rows tied with it (overlapping intervals), as the
 * caption says. Needs \usepackage{booktabs} (the booktabs rules are the trade's convention).
 */
import { compareText, type MetricSummary } from '../aggregate.ts';
import { levelColumnsOf, levelKeyOf } from '../level-columns.ts';
import { formatMeanInterval } from '../format-number.ts';
import { markOf, type TidyTable } from '../tidy-table.ts';
import type { TableFormat } from './table-format.ts';

const LATEX_SPECIALS: Record<string, string> = {
  '\\': '\\textbackslash{}',
  '&': '\\&',
  '%': '\\%',
  $: '\\$',
  '#': '\\#',
  _: '\\_',
  '{': '\\{',
  '}': '\\}',
  '~': '\\textasciitilde{}',
  '^': '\\textasciicircum{}',
  '<': '\\textless{}',
  '>': '\\textgreater{}',
};

/** Escapes the ten LaTeX special characters (and < >, which T1-less fonts misprint). */
export function escapeLatex(text: string): string {
  return text.replace(/[\\&%$#_{}~^<>]/g, (c) => LATEX_SPECIALS[c] ?? c);
}

interface Block {
  suite: string;
  metric: string;
  source: string;
  rows: MetricSummary[];
}

function blocksOf(rows: readonly MetricSummary[]): Block[] {
  const blocks = new Map<string, Block>();
  for (const row of rows) {
    const key = JSON.stringify([row.suite, row.metric, row.source]);
    const block = blocks.get(key) ?? {
      suite: row.suite,
      metric: row.metric,
      source: row.source,
      rows: [],
    };
    block.rows.push(row);
    blocks.set(key, block);
  }
  return [...blocks.values()].sort(
    (a, b) =>
      compareText(a.suite, b.suite) ||
      compareText(a.metric, b.metric) ||
      compareText(a.source, b.source),
  );
}

function cellText(table: TidyTable, row: MetricSummary | undefined): string {
  if (!row) return '--';
  const { text } = formatMeanInterval(row.mean, row.ciLow, row.ciHigh, '\\pm');
  return markOf(table, row) === '' ? `$${text}$` : `$\\mathbf{${text}}$`;
}

function labelOf(block: Block): string {
  const raw = `${block.metric}-${block.source || 'all'}`;
  return `tab:${raw.replace(/[^A-Za-z0-9-]/g, '-')}`;
}

function renderBlock(table: TidyTable, block: Block): string {
  const levels = levelColumnsOf(block.rows);
  const lineKeys: string[] = [];
  const cells = new Map<string, MetricSummary>();
  for (const row of block.rows) {
    const lineKey = JSON.stringify([row.setting, row.method]);
    if (!lineKeys.includes(lineKey)) lineKeys.push(lineKey);
    cells.set(JSON.stringify([lineKey, levelKeyOf(row)]), row);
  }
  const columns = table.settingColumns;
  const spec = `${'l'.repeat(columns.length + 1)}${'r'.repeat(levels.length)}`;
  const head = [...columns, 'method'].map((c) => escapeLatex(c));
  head.push(...levels.map((l) => escapeLatex(l.label)));
  const body: string[] = [];
  let previousSetting: string | null = null;
  for (const lineKey of lineKeys) {
    const [setting, method] = JSON.parse(lineKey) as [Record<string, string>, string];
    const settingKey = JSON.stringify(setting);
    if (previousSetting !== null && settingKey !== previousSetting) body.push('\\midrule');
    previousSetting = settingKey;
    const line = [...columns.map((c) => escapeLatex(setting[c] ?? '')), escapeLatex(method)];
    for (const level of levels)
      line.push(cellText(table, cells.get(JSON.stringify([lineKey, level.key]))));
    body.push(`${line.join(' & ')} \\\\`);
  }
  const source = block.source ? ` (${escapeLatex(block.source)} transition)` : '';
  return [
    '\\begin{table}[htbp]',
    '\\centering',
    `\\caption{${escapeLatex(block.metric)}${source}: mean $\\pm$ half-width of the 95\\,\\% t-interval over seeds. Bold: best in its column within a setting, and those whose intervals overlap it.}`,
    `\\label{${labelOf(block)}}`,
    `\\begin{tabular}{${spec}}`,
    '\\toprule',
    `${head.join(' & ')} \\\\`,
    '\\midrule',
    ...body,
    '\\bottomrule',
    '\\end{tabular}',
    '\\end{table}',
  ].join('\n');
}

/** Tables between two \\clearpage commands in a whole-file export. */
const FLUSH_EVERY = 10;

export const latexFormat: TableFormat = {
  name: 'latex',
  render(table: TidyTable): string {
    const parts = ['% Tables written by midpath; they need \\usepackage{booktabs}.'];
    blocksOf(table.rows).forEach((block, i) => {
      // LaTeX holds at most 18 unplaced floats; a \clearpage every 10 tables lets the whole
      // file be \input. Pasting one table leaves it behind.
      if (i > 0 && i % FLUSH_EVERY === 0) parts.push('\\clearpage % flush pending floats');
      parts.push(renderBlock(table, block));
    });
    return `${parts.join('\n\n')}\n`;
  },
};
