import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

/**
 * Every file below `dirs` with its size and modification time: two equal snapshots taken
 * around an operation show that it wrote, created and deleted nothing there.
 */
export function snapshotFiles(dirs: readonly string[]): string[] {
  const out: string[] = [];
  const walk = (dir: string): void => {
    if (!existsSync(dir)) return;
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, entry.name);
      if (entry.isDirectory()) walk(path);
      else {
        const stat = statSync(path);
        out.push(`${path} ${stat.size} ${stat.mtimeMs}`);
      }
    }
  };
  dirs.forEach(walk);
  return out.sort();
}
