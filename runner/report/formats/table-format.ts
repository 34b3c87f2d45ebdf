/** The small interface every `midpath table` format implements (one file per format). */
import type { TidyTable } from '../tidy-table.ts';

export interface TableFormat {
  /** The value of `--format`. */
  name: string;
  /** Renders the whole table as text (ending in a newline). */
  render(table: TidyTable): string;
}
