/**
 * Crash-safe file writes: a reader sees either the old file or the complete new one, never
 * a torn write, even after `kill -9` or a power cut. The classic recipe: write a temporary
 * file in the same directory, fsync it, rename it over the target (atomic on POSIX file
 * systems), then fsync the directory so the rename itself is durable (common practice;
 * see the rename(2) and fsync(2) manual pages).
 */
import { closeSync, fsyncSync, openSync, renameSync, rmSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { randomBytes } from 'node:crypto';

/** Temporary files start with this prefix; readers skip them, cleaners may delete them. */
export const TEMP_PREFIX = '.tmp-';

/** Writes `text` to `path` atomically and durably. Throws the file system's error as is. */
export function writeFileAtomic(path: string, text: string): void {
  const dir = dirname(path);
  const temp = join(
    dir,
    `${TEMP_PREFIX}${basename(path)}.${process.pid}.${randomBytes(4).toString('hex')}`,
  );
  const fd = openSync(temp, 'wx', 0o644);
  try {
    writeSync(fd, text);
    fsyncSync(fd);
  } catch (error) {
    closeSync(fd);
    rmSync(temp, { force: true });
    throw error;
  }
  closeSync(fd);
  try {
    renameSync(temp, path);
  } catch (error) {
    rmSync(temp, { force: true });
    throw error;
  }
  syncDirectory(dir);
}

/** fsync of a directory; some file systems refuse it, which loses nothing but durability. */
function syncDirectory(dir: string): void {
  let fd: number | undefined;
  try {
    fd = openSync(dir, 'r');
    fsyncSync(fd);
  } catch {
    // Directories cannot be fsynced on every platform (EISDIR/EINVAL); the rename stands.
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}
