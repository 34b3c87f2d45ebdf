/** The Markdown summary `midpath compare` prints: counts, then the changed rows. */
import { formatValue } from '../format-number.ts';
import { escapeMarkdownCell } from '../formats/markdown-format.ts';
import type { Comparison, ComparisonRow } from './compare-runs.ts';

function percent(x: number): string {
  return Number.isFinite(x) ? `${x > 0 ? '+' : ''}${(100 * x).toFixed(1)} %` : '–';
}

function settingText(setting: Record<string, string>): string {
  return Object.entries(setting)
    .map(([k, v]) => `${k}=${v}`)
    .join(', ');
}

function rowsTable(rows: readonly ComparisonRow[]): string[] {
  const lines = [
    '| setting | method | metric | source | level | base | candidate | change (worse > 0) | test | p (Holm) |',
    '| --- | --- | --- | --- | --- | ---: | ---: | ---: | --- | ---: |',
  ];
  for (const r of rows) {
    const cells = [
      settingText(r.setting),
      r.method,
      r.metric,
      r.source,
      `${r.level}${r.unit === 'jump' ? ' jumps' : ''}`,
    ].map(escapeMarkdownCell);
    const test = r.test === 'none' ? 'untested (one seed)' : r.test;
    const p = r.p === null ? '–' : r.p < 0.001 ? '< 0.001' : r.p.toFixed(3);
    cells.push(
      `${formatValue(r.base.mean)} (n=${r.base.n})`,
      `${formatValue(r.candidate.mean)} (n=${r.candidate.n})`,
      percent(r.relativeChange),
      test,
      p,
    );
    lines.push(`| ${cells.join(' | ')} |`);
  }
  return lines;
}

/** Renders the comparison as Markdown. */
export function formatComparison(c: Comparison, baseName: string, candidateName: string): string {
  const { tolerance, alpha } = c.options;
  const noise = c.rows.filter((r) => r.verdict === 'unchanged' && r.test !== 'none');
  const lines = [
    `## Comparison: ${escapeMarkdownCell(candidateName)} against ${escapeMarkdownCell(baseName)}`,
    '',
    `Tolerance ${(100 * tolerance).toFixed(1)} % (relative); significance α = ${alpha} after Holm's adjustment;`,
    'paired t-test where both runs hold the same seeds, Welch t-test otherwise.',
    '',
    '| outcome | count |',
    '| --- | ---: |',
    `| regressed | ${c.counts.regressed} |`,
    `| improved | ${c.counts.improved} |`,
    `| unchanged | ${c.counts.unchanged} |`,
    `| not ranked (metric has no better direction) | ${c.counts['not-ranked']} |`,
    `| only in base | ${c.onlyInBase} |`,
    `| only in candidate | ${c.onlyInCandidate} |`,
  ];
  const section = (title: string, rows: readonly ComparisonRow[]): void => {
    if (rows.length === 0) return;
    lines.push('', `### ${title}`, '', ...rowsTable(rows));
  };
  section(
    'Regressions',
    c.rows.filter((r) => r.verdict === 'regressed'),
  );
  section(
    'Improvements',
    c.rows.filter((r) => r.verdict === 'improved'),
  );
  section('Beyond tolerance but not significant (counted as unchanged)', noise);
  lines.push(
    '',
    c.counts.regressed > 0
      ? `Result: ${c.counts.regressed} regression(s).`
      : 'Result: no regression.',
  );
  return `${lines.join('\n')}\n`;
}
