/**
 * Renders the report model with the handlebars templates in templates/ into one
 * self-contained HTML string: CSS and script inline, plots as inline SVG, data as JSON in a
 * <script type="application/json"> element. A Content-Security-Policy meta tag forbids every
 * network fetch, so the page works offline from a file:// URL and cannot call home.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import Handlebars from 'handlebars';
import { ReportError } from '../report-error.ts';
import { jsonForScript } from './escape.ts';
import type { ReportModel } from './report-model.ts';

const TEMPLATE_DIR = fileURLToPath(new URL('../../../templates/', import.meta.url));

function readTemplate(name: string): string {
  try {
    return readFileSync(join(TEMPLATE_DIR, name), 'utf8');
  } catch {
    throw new ReportError({
      code: 'template-missing',
      path: join(TEMPLATE_DIR, name),
      message: `expected the report template ${name}, got no readable file`,
      hint: 'reinstall Midpath (npm ci) or restore templates/ from the repository',
    });
  }
}

/** A handlebars environment of our own (no global registrations) with the report's helpers. */
function createEnvironment(): typeof Handlebars {
  const hb = Handlebars.create();
  // JSON for <script type="application/json">: see jsonForScript for why it is safe there.
  hb.registerHelper('json', (value: unknown) => new hb.SafeString(jsonForScript(value)));
  hb.registerHelper('eq', (a: unknown, b: unknown) => a === b);
  hb.registerHelper('inc', (i: unknown) => (typeof i === 'number' ? i + 1 : i));
  hb.registerHelper('nonEmpty', (list: unknown) => Array.isArray(list) && list.length > 0);
  const partialDir = join(TEMPLATE_DIR, 'partials');
  for (const file of readdirSync(partialDir).sort()) {
    if (file.endsWith('.hbs'))
      hb.registerPartial(file.slice(0, -4), readTemplate(join('partials', file)));
  }
  return hb;
}

/** Renders the whole page. */
export function renderHtml(model: ReportModel): string {
  const hb = createEnvironment();
  const page = hb.compile(readTemplate('report.hbs'), { strict: true, noEscape: false });
  return page({
    ...model,
    // Our own files, inserted raw: they contain no user strings.
    css: new hb.SafeString(readTemplate('report.css')),
    script: new hb.SafeString(readTemplate('report.js')),
    figures: model.figures.map((g) => ({
      ...g,
      panels: g.panels.map((p) => new hb.SafeString(p)),
    })),
  });
}
