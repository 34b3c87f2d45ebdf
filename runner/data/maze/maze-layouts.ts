/**
 * The warehouse floor plans of the rover dataset, drawn as text: '#' is a wall or shelf,
 * '.' a free cell. Both are our own drawings. Every free cell of each is reachable from
 * every other (checked in tests/data/maze).
 */

/** A parsed grid: walls[row * width + col] = 1 where blocked. */
export interface MazeLayout {
  width: number;
  height: number;
  walls: Uint8Array;
}

/** Names of the built-in layouts (DataConfig.layout). */
export type LayoutName = 'open-hall' | 'long-corridors';

/** An open loading hall with four pairs of pillars: many routes between any two cells. */
const OPEN_HALL = `
############
#..........#
#..........#
#..##..##..#
#..##..##..#
#..........#
#..........#
#..##..##..#
#..##..##..#
#..........#
#..........#
############`;

/**
 * Narrow aisles between shelving, one route between any two cells (a tree: six dead ends,
 * no loops), so maze distance ≫ straight-line distance.
 */
const LONG_CORRIDORS = `
###############
#...#...#.....#
###.#.#.#.###.#
#.#...#.#.#...#
#.#####.#.#.#.#
#.....#.#.#.#.#
#####.#.#.#.#.#
#.....#.#.#.#.#
#.###.#.###.#.#
#.#...#.....#.#
#.###.#######.#
#...#.......#.#
#.#.#########.#
#.#...........#
###############`;

/** The text drawing of a built-in layout. */
export const LAYOUTS: Record<LayoutName, string> = {
  'open-hall': OPEN_HALL,
  'long-corridors': LONG_CORRIDORS,
};

/** Parses a drawing ('#' wall, anything else free); rows must have equal length. */
export function parseMazeLayout(text: string): MazeLayout {
  const rows = text.split('\n').filter((r) => r.trim().length > 0);
  const width = rows[0]?.length ?? 0;
  if (width === 0 || rows.some((r) => r.length !== width)) {
    throw new RangeError(
      `maze drawing must be a non-empty rectangle, got row lengths ${rows.map((r) => r.length).join(', ')}`,
    );
  }
  const walls = new Uint8Array(width * rows.length);
  rows.forEach((r, i) => {
    for (let j = 0; j < width; j++) walls[i * width + j] = r[j] === '#' ? 1 : 0;
  });
  return { width, height: rows.length, walls };
}
