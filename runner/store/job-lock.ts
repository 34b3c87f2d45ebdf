/**
 * Per-job lock files, so two runners on one results directory (two terminals, or SLURM
 * array tasks on a shared file system) never run a job twice. A lock is created with
 * O_CREAT|O_EXCL (atomic on local and NFSv3+ file systems) and names its owner; the owner
 * refreshes its modification time (heartbeat). A lock is stale when its owner process is
 * gone (same host) or it has not been refreshed for `STALE_AFTER_MS` (any host).
 */
import {
  closeSync,
  openSync,
  readFileSync,
  rmSync,
  statSync,
  utimesSync,
  writeSync,
} from 'node:fs';
import { hostname } from 'node:os';

/** A lock not refreshed for this long is stale, whoever owns it (heartbeats run every 30 s). */
export const STALE_AFTER_MS = 120_000;
/** A lock file still empty after this long was left by a runner killed while creating it. */
const UNFINISHED_AFTER_MS = 10_000;

export interface LockOwner {
  pid: number;
  hostname: string;
  runId: string;
  createdAt: string;
}

function ageMs(path: string): number | null {
  try {
    return Date.now() - statSync(path).mtimeMs;
  } catch {
    return null;
  }
}

function readOwner(path: string): { text: string; owner: LockOwner | null } | null {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch {
    return null;
  }
  try {
    return { text, owner: JSON.parse(text) as LockOwner };
  } catch {
    return { text, owner: null };
  }
}

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    // EPERM: the process exists but belongs to someone else.
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** True when the lock at `path` was left by a runner that is gone. */
export function isStaleLock(path: string, text?: string): boolean {
  const read = readOwner(path);
  const age = ageMs(path);
  if (!read || age === null) return false; // vanished: not stale, just retry
  if (text !== undefined && read.text !== text) return false; // replaced meanwhile
  if (!read.owner) return age > UNFINISHED_AFTER_MS;
  if (age > STALE_AFTER_MS) return true;
  return read.owner.hostname === hostname() && !processAlive(read.owner.pid);
}

function createExclusive(path: string, owner: LockOwner): boolean {
  let fd: number;
  try {
    fd = openSync(path, 'wx', 0o644);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'EEXIST') return false;
    throw error;
  }
  try {
    writeSync(fd, JSON.stringify(owner));
  } finally {
    closeSync(fd);
  }
  return true;
}

/**
 * Removes a stale lock safely: only one breaker at a time (its own O_EXCL file), and only if
 * the lock still holds the stale content it was judged on, so a fresh lock taken by another
 * runner in between is never removed.
 */
function breakStaleLock(path: string): void {
  const breaker = `${path}.break`;
  const judged = readOwner(path);
  if (!judged || !isStaleLock(path, judged.text)) return;
  const self: LockOwner = {
    pid: process.pid,
    hostname: hostname(),
    runId: 'breaker',
    createdAt: new Date().toISOString(),
  };
  if (!createExclusive(breaker, self)) {
    if ((ageMs(breaker) ?? 0) > UNFINISHED_AFTER_MS) rmSync(breaker, { force: true });
    return;
  }
  try {
    const again = readOwner(path);
    if (again && again.text === judged.text) rmSync(path, { force: true });
  } finally {
    rmSync(breaker, { force: true });
  }
}

/**
 * Tries to take the lock at `path` for `owner`: true when taken, false when a live runner
 * holds it. Throws the file system's error when the directory cannot be written.
 */
export function tryLock(path: string, owner: LockOwner): boolean {
  if (createExclusive(path, owner)) return true;
  if (!isStaleLock(path)) return false;
  breakStaleLock(path);
  return createExclusive(path, owner);
}

/** Removes the lock at `path` if `runId` owns it. */
export function unlock(path: string, runId: string): void {
  const read = readOwner(path);
  if (read?.owner?.runId === runId) rmSync(path, { force: true });
}

/** Refreshes the modification time of a held lock (the heartbeat). */
export function touchLock(path: string): void {
  const now = new Date();
  try {
    utimesSync(path, now, now);
  } catch {
    // A lock that vanished is re-judged by whoever looks next; nothing to refresh.
  }
}

/** The owner named in the lock at `path` when it is held by a live runner, else null. */
export function readLiveOwner(path: string): LockOwner | null {
  const read = readOwner(path);
  if (!read?.owner || isStaleLock(path, read.text)) return null;
  return read.owner;
}
