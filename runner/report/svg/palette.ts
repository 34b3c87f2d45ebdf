/**
 * Series colours of the report's plots: six muted inks that stay apart in greyscale print
 * (their lightness differs) and for the common colour-vision deficiencies (blue/orange
 * contrast first). Beyond six, colours repeat with a dash pattern.
 */
export const SERIES_COLOURS = ['#1f4e79', '#c0651d', '#4d7f3a', '#7b3f6e', '#8c7a1f', '#56606b'];

/** The colour of series `index`. */
export function seriesColour(index: number): string {
  return SERIES_COLOURS[index % SERIES_COLOURS.length] ?? '#000000';
}

/** A dash pattern for series past the sixth, so repeated colours stay distinguishable. */
export function seriesDash(index: number, dashed: boolean): string {
  if (dashed) return '5 3';
  return index >= SERIES_COLOURS.length ? '2 2' : '';
}
