import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { escapeLatex } from '../../runner/report/formats/latex-format.ts';
import { quoteCsvField } from '../../runner/report/formats/csv-format.ts';
import { renderTable } from '../../runner/report/write-table.ts';
import { SPECIAL_LABEL } from '../fixtures/results/build-run.ts';
import { makeFixtureRun } from './fixture-run.ts';

const goldenDir = new URL('../fixtures/results/golden/', import.meta.url);
const update = process.env.MIDPATH_UPDATE_GOLDEN === '1';

/** Compares with a checked-in golden file; MIDPATH_UPDATE_GOLDEN=1 rewrites it instead. */
function expectGolden(name: string, text: string): void {
  const url = new URL(name, goldenDir);
  if (update) {
    mkdirSync(goldenDir, { recursive: true });
    writeFileSync(url, text);
  }
  expect(text).toBe(readFileSync(url, 'utf8'));
}

let dir = '';
let cleanup = (): void => {};
beforeAll(() => {
  ({ dir, cleanup } = makeFixtureRun());
});
afterAll(() => cleanup());

describe('table formats', () => {
  it('renders Markdown as the golden file', async () => {
    const text = await renderTable(dir, {
      format: 'markdown',
      metrics: ['forecast_nmse', 'coverage_90', 'planning_success'],
    });
    expectGolden('rover-small.md', text);
  });

  it('renders LaTeX as the golden file', async () => {
    const text = await renderTable(dir, {
      format: 'latex',
      metrics: ['bridge_nmse', 'forecast_nmse', 'planning_success'],
    });
    expectGolden('rover-small.tex', text);
    expect(text).toContain(escapeLatex(SPECIAL_LABEL));
    expect(text).not.toContain(SPECIAL_LABEL);
  });

  it('compiles the LaTeX with pdflatex when it is installed', async (ctx) => {
    const found = spawnSync('pdflatex', ['--version']).status === 0;
    if (!found) {
      console.warn(
        'notice: pdflatex not found; skipping the LaTeX compile check (apt-get install texlive-latex-recommended)',
      );
      ctx.skip();
    }
    const tables = await renderTable(dir, { format: 'latex' });
    const work = mkdtempSync(join(tmpdir(), 'midpath-latex-'));
    try {
      const doc = [
        '\\documentclass{article}',
        '\\usepackage{booktabs}',
        '\\begin{document}',
        tables,
        '\\end{document}',
      ];
      writeFileSync(join(work, 'tables.tex'), doc.join('\n'));
      execFileSync('pdflatex', ['-interaction=nonstopmode', '-halt-on-error', 'tables.tex'], {
        cwd: work,
        stdio: 'pipe',
      });
      expect(existsSync(join(work, 'tables.pdf'))).toBe(true);
    } finally {
      rmSync(work, { recursive: true, force: true });
    }
  });

  it('writes CSV per RFC 4180, quoting fields with commas, quotes or line breaks', async () => {
    const text = await renderTable(dir, { format: 'csv', metrics: ['bridge_nmse'] });
    const lines = text.split('\r\n');
    expect(lines[0]).toBe('dim,method,suite,metric,source,level,unit,n,mean,std,ci_low,ci_high');
    expect(lines.filter((l) => l !== '')).toHaveLength(1 + 2 * 3 * 2);
    expect(quoteCsvField('a,"b"')).toBe('"a,""b"""');
    expect(quoteCsvField('two\nlines')).toBe('"two\nlines"');
  });

  it('writes JSON with full precision and the same rows as CSV', async () => {
    const json = JSON.parse(await renderTable(dir, { format: 'json' })) as {
      settingColumns: string[];
      rows: { mean: number; method: string; best: string }[];
    };
    const csv = (await renderTable(dir, { format: 'csv' })).split('\r\n').filter((l) => l !== '');
    expect(json.settingColumns).toEqual(['dim']);
    expect(json.rows).toHaveLength(csv.length - 1);
    const first = csv[1]!.split(',');
    expect(Number(first[8])).toBe(json.rows[0]!.mean);
  });

  it('escapes the LaTeX special characters', () => {
    expect(escapeLatex('a_b & 50% {x} #1 $2 ~^\\')).toBe(
      'a\\_b \\& 50\\% \\{x\\} \\#1 \\$2 \\textasciitilde{}\\textasciicircum{}\\textbackslash{}',
    );
  });
});
