import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { renderReport, writeReport } from '../../runner/report/index.ts';
import { HOSTILE_NAME } from '../fixtures/results/build-run.ts';
import { makeFixtureRun } from './fixture-run.ts';

let dir = '';
let bare = '';
const cleanups: (() => void)[] = [];
beforeAll(() => {
  const run = makeFixtureRun();
  dir = run.dir;
  const noArtifacts = makeFixtureRun({
    withArtifacts: false,
    withFailures: false,
    experiment: 'greenhouse sensors',
  });
  bare = noArtifacts.dir;
  cleanups.push(run.cleanup, noArtifacts.cleanup);
});
afterAll(() => cleanups.forEach((c) => c()));

describe('writeReport', () => {
  it('writes <dir>/report.html by default and returns its path', async () => {
    const path = await writeReport(dir);
    expect(path).toBe(join(dir, 'report.html'));
    expect(readFileSync(path, 'utf8')).toMatch(/^<!doctype html>/);
  });

  it('writes where --html says', async () => {
    const path = await writeReport(dir, { htmlPath: join(dir, 'elsewhere', 'page.html') });
    expect(existsSync(path)).toBe(true);
  });

  it('gives the same bytes twice (no timestamps, no random ids)', async () => {
    const a = await renderReport(dir);
    const b = await renderReport(dir);
    expect(a).toBe(b);
    expect(a).not.toMatch(
      /\sid="(?!overview|forecast|bridge|diagnostics|planning|figures|all-metrics|metric-filter|csv-download|filter-count|tidy-table|midpath-data)/,
    );
  });

  it('keeps a hostile experiment name inert in text and inside <script>', async () => {
    const html = await renderReport(dir);
    expect(html).not.toContain(HOSTILE_NAME);
    expect(html).toContain('&lt;/script&gt;&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain(
      '\\u003c/script\\u003e\\u003cscript\\u003ealert(1)\\u003c/script\\u003e',
    );
    // Only our own two script elements open and close.
    expect(html.match(/<script/g)).toHaveLength(2);
    expect(html.match(/<\/script>/g)).toHaveLength(2);
    // A failure reason with markup is shown as text.
    expect(html).toContain('&lt;b&gt;bold&lt;/b&gt;');
  });

  it('forbids network fetches with a Content-Security-Policy and references no URL', async () => {
    const html = await renderReport(dir);
    expect(html).toContain("default-src 'none'");
    expect(html).not.toMatch(/\s(src|href)="(https?:)?\/\//);
  });

  it('shows failures with their reasons, and oracle rows apart', async () => {
    const html = await renderReport(dir);
    expect(html).toContain('step 120: loss became NaN (regulariser term)');
    expect(html).toContain('class="oracle');
    expect(html).toContain('reading-fails');
  });

  it('omits plots with a note when artifacts are missing, and still renders', async () => {
    const html = await renderReport(bare);
    expect(html).toContain('Omitted: no evaluate job left a bridge.json');
    expect(html).toContain('Omitted: no train job left a curves.json');
    expect(html).toContain('Omitted: no evaluate job left a projections.json');
    expect(html).toContain('None: every job that ran finished.');
  });

  it('skips a corrupt artifact instead of failing', async () => {
    writeFileSync(
      join(dir, 'jobs', 't-contrastive-d4-s0', 'artifacts', 'curves.json'),
      '{ not json',
    );
    const html = await renderReport(dir);
    expect(html).toContain('Training curves');
  });

  it('throws no-results for a directory without results', async () => {
    await expect(writeReport(join(dir, 'jobs', 'nothing-here'))).rejects.toMatchObject({
      code: 'no-results',
    });
  });
});
