import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, utimesSync, writeFileSync } from 'node:fs';
import { hostname } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  STALE_AFTER_MS,
  isStaleLock,
  readLiveOwner,
  tryLock,
  unlock,
} from '../../runner/store/job-lock.ts';
import { tempRun } from '../fixtures/execute/fake-sweep.ts';

function owner(
  runId: string,
  pid = process.pid,
): { pid: number; hostname: string; runId: string; createdAt: string } {
  return { pid, hostname: hostname(), runId, createdAt: new Date().toISOString() };
}

function lockPath(): string {
  const { dir } = tempRun();
  mkdirSync(dir, { recursive: true });
  return join(dir, '.lock');
}

/** The pid of a process that has already exited (so no live process has it for now). */
function deadPid(): number {
  const child = spawnSync(process.execPath, ['-e', 'process.stdout.write(String(process.pid))'], {
    encoding: 'utf8',
  });
  return Number(child.stdout);
}

describe('job locks', () => {
  it('lets one owner in and refuses a second while the first is alive', () => {
    const path = lockPath();
    expect(tryLock(path, owner('a'))).toBe(true);
    expect(tryLock(path, owner('b'))).toBe(false);
    expect(readLiveOwner(path)?.runId).toBe('a');
    unlock(path, 'b'); // not the owner: no effect
    expect(tryLock(path, owner('b'))).toBe(false);
    unlock(path, 'a');
    expect(tryLock(path, owner('b'))).toBe(true);
  });

  it('takes over a lock whose owner process is gone', () => {
    const path = lockPath();
    writeFileSync(path, JSON.stringify(owner('dead', deadPid())));
    expect(isStaleLock(path)).toBe(true);
    expect(tryLock(path, owner('c'))).toBe(true);
    expect((JSON.parse(readFileSync(path, 'utf8')) as { runId: string }).runId).toBe('c');
  });

  it('takes over a lock of another host only once its heartbeat is old', () => {
    const path = lockPath();
    writeFileSync(path, JSON.stringify({ ...owner('far'), hostname: 'node-17.cluster' }));
    expect(tryLock(path, owner('d'))).toBe(false);
    const old = new Date(Date.now() - STALE_AFTER_MS - 1000);
    utimesSync(path, old, old);
    expect(tryLock(path, owner('d'))).toBe(true);
  });
});
