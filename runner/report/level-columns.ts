/**
 * The columns of a wide table (LaTeX, HTML): one per (unit, level) — a forecast horizon of 4
 * environment steps and one of 4 geometric jumps are different columns.
 */
import { compareLevels, compareUnits, type MetricSummary } from './aggregate.ts';

export interface LevelColumn {
  level: number | string;
  unit: string;
  /** Identity for lookups. */
  key: string;
  /** Header text, e.g. "4" or "4 (jumps)"; 'all' reads as "value". */
  label: string;
}

/** The column identity of a summary. */
export function levelKeyOf(row: Pick<MetricSummary, 'level' | 'unit'>): string {
  return JSON.stringify([row.unit, row.level]);
}

function labelOf(level: number | string, unit: string): string {
  if (level === 'all') return 'value';
  // A forecast horizon of 4 jumps, or 3 bridge waypoints spaced by jumps: "(jumps)" fits both.
  if (unit === 'jump') return `${level} (jumps)`;
  return String(level);
}

/** Distinct columns of `rows`: step (or unit-less) levels first, then jumps, each ascending. */
export function levelColumnsOf(rows: readonly MetricSummary[]): LevelColumn[] {
  const columns = new Map<string, LevelColumn>();
  for (const row of rows) {
    const key = levelKeyOf(row);
    if (!columns.has(key)) {
      columns.set(key, {
        level: row.level,
        unit: row.unit,
        key,
        label: labelOf(row.level, row.unit),
      });
    }
  }
  return [...columns.values()].sort(
    (a, b) => compareUnits(a.unit, b.unit) || compareLevels(a.level, b.level),
  );
}
