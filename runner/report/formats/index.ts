/**
 * The table formats of `midpath table`, name → implementation (STYLE.md §7): adding one
 * means adding one file and one entry here.
 */
import { csvFormat } from './csv-format.ts';
import { jsonFormat } from './json-format.ts';
import { latexFormat } from './latex-format.ts';
import { markdownFormat } from './markdown-format.ts';
import type { TableFormat } from './table-format.ts';

export type { TableFormat } from './table-format.ts';

export const tableFormats: ReadonlyMap<string, TableFormat> = new Map(
  [csvFormat, markdownFormat, latexFormat, jsonFormat].map((f) => [f.name, f]),
);
