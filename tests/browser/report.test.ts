/**
 * The report in a real browser: headless Chromium from Debian (`apt-get install chromium`),
 * driven by playwright-core. Skipped with a notice when /usr/bin/chromium is absent, unless
 * MIDPATH_REQUIRE_BROWSER=1 (CI sets it), in which case a missing browser fails the test.
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../../runner/cli/main.ts';
import { writeReport } from '../../runner/report/index.ts';
import { formatMeanInterval } from '../../runner/report/format-number.ts';
import { HOSTILE_NAME, writeFixtureRun } from '../fixtures/results/build-run.ts';
import { bufferIo } from '../helpers/cli-io.ts';

const CHROMIUM = '/usr/bin/chromium';
const required = process.env.MIDPATH_REQUIRE_BROWSER === '1';
const present = existsSync(CHROMIUM);
if (!present && !required) {
  console.warn(
    `notice: ${CHROMIUM} not found; skipping the browser test (apt-get install chromium, or set MIDPATH_REQUIRE_BROWSER=1 to fail instead)`,
  );
}

interface JsonRow {
  setting: Record<string, string>;
  method: string;
  metric: string;
  source: string;
  level: number | string;
  unit: string;
  mean: number | null;
  ci_low: number | null;
  ci_high: number | null;
}

let root = '';
let context: BrowserContext | null = null;
let page: Page | null = null;
let reportUrl = '';
let tableJson: { settingColumns: string[]; rows: JsonRow[] } = { settingColumns: [], rows: [] };
const consoleErrors: string[] = [];
const requests: string[] = [];
const dialogs: string[] = [];

describe.skipIf(!present && !required)('HTML report in headless Chromium', () => {
  beforeAll(async () => {
    if (!present)
      throw new Error(
        `MIDPATH_REQUIRE_BROWSER=1 but ${CHROMIUM} is missing: apt-get install chromium`,
      );
    root = mkdtempSync(join(tmpdir(), 'midpath-browser-'));
    const dir = join(root, 'run');
    writeFixtureRun(dir);
    reportUrl = pathToFileURL(await writeReport(dir)).href;
    const io = bufferIo();
    expect(await main(['table', dir, '--format', 'json'], io)).toBe(0);
    tableJson = JSON.parse(io.stdout.join('')) as typeof tableJson;
    context = await chromium.launchPersistentContext(join(root, 'profile'), {
      executablePath: CHROMIUM,
      headless: true,
      args: [
        '--headless',
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
      ],
      viewport: { width: 1200, height: 900 },
    });
    page = context.pages()[0] ?? (await context.newPage());
    page.on('console', (m) => {
      if (m.type() === 'error') consoleErrors.push(m.text());
    });
    page.on('pageerror', (e) => consoleErrors.push(String(e)));
    page.on('dialog', (d) => {
      dialogs.push(d.message());
      void d.dismiss();
    });
    page.on('request', (r) => {
      if (r.url() !== reportUrl) requests.push(r.url());
    });
    await page.goto(reportUrl, { waitUntil: 'load' });
  }, 60_000);

  afterAll(async () => {
    await context?.close();
    if (root) rmSync(root, { recursive: true, force: true });
  });

  it('loads from file:// with zero console errors and zero network requests', () => {
    expect(consoleErrors).toEqual([]);
    expect(requests).toEqual([]);
  });

  it('shows the hostile config name as text and never runs it', async () => {
    const p = page!;
    expect(dialogs).toEqual([]);
    expect(await p.locator('h1').textContent()).toBe(HOSTILE_NAME);
    expect(await p.title()).toContain(HOSTILE_NAME);
    const embedded = JSON.parse((await p.locator('#midpath-data').textContent()) ?? '{}') as {
      experiment: string;
      rows: unknown[];
    };
    expect(embedded.experiment).toBe(HOSTILE_NAME);
    expect(embedded.rows).toEqual(tableJson.rows);
    expect(await p.locator('script').count()).toBe(2);
  });

  it('has table cells that match `midpath table --format json`', async () => {
    const cells = await page!.locator('td[data-metric]').evaluateAll((tds) =>
      tds.map((td) => {
        const d = (td as HTMLElement).dataset;
        return {
          setting: d.setting ?? '',
          method: d.method ?? '',
          metric: d.metric ?? '',
          source: d.source ?? '',
          level: d.level ?? '',
          unit: d.unit ?? '',
          mean: d.mean ?? '',
          text: td.textContent ?? '',
        };
      }),
    );
    expect(cells.length).toBeGreaterThan(50);
    const key = (r: {
      setting: string;
      method: string;
      metric: string;
      source: string;
      level: string;
      unit: string;
    }): string => JSON.stringify([r.setting, r.method, r.metric, r.source, r.level, r.unit]);
    const rows = new Map(
      tableJson.rows.map((r) => [
        key({ ...r, setting: JSON.stringify(r.setting), level: String(r.level) }),
        r,
      ]),
    );
    for (const cell of cells) {
      const row = rows.get(key(cell));
      expect(row, `cell ${cell.metric} ${cell.method} ${cell.level}`).toBeDefined();
      expect(Number(cell.mean)).toBe(row!.mean);
      const expected = formatMeanInterval(
        row!.mean ?? Number.NaN,
        row!.ci_low ?? Number.NaN,
        row!.ci_high ?? Number.NaN,
      ).text;
      expect(cell.text.startsWith(expected)).toBe(true);
    }
    // Every forecast_nmse row of the JSON has its cell in the page.
    const forecastCells = cells.filter((c) => c.metric === 'forecast_nmse').length;
    expect(forecastCells).toBe(tableJson.rows.filter((r) => r.metric === 'forecast_nmse').length);
  });

  it('filters the tidy table as the reader types', async () => {
    const p = page!;
    await p.fill('#metric-filter', 'bridge_nmse fitted');
    const count = (await p.locator('#filter-count').textContent()) ?? '';
    const shown = tableJson.rows.filter(
      (r) => `${r.metric} ${r.source}`.includes('bridge_nmse') && r.source === 'fitted',
    ).length;
    expect(count).toBe(`${shown} of ${tableJson.rows.length} rows`);
    await p.fill('#metric-filter', '');
  });

  it('saves a screenshot as a test artifact', async () => {
    mkdirSync('test-artifacts', { recursive: true });
    const path = join('test-artifacts', 'report.png');
    await page!.screenshot({ path, fullPage: true });
    expect(existsSync(path)).toBe(true);
  });
});
