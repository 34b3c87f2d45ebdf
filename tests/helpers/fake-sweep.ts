import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { SweepOptions } from '../../runner/execute/run-sweep.ts';
import { runSweep } from '../../runner/execute/run-sweep.ts';
import type { SweepEvent, SweepSummary } from '../../runner/execute/sweep-events.ts';
import type { JobSpec } from '../../runner/plan/job-spec.ts';
import { RunLedger } from '../../runner/store/run-ledger.ts';

/** The test-only handler module the workers load (see docs/runner.md). */
export const fakeHandlersPath = fileURLToPath(
  new URL('../fixtures/execute/fake-handlers.ts', import.meta.url),
);

/** A fresh temporary results directory and a journal file for the fake handlers. */
export function tempRun(): { dir: string; journal: string } {
  const root = mkdtempSync(join(tmpdir(), 'midpath-run-'));
  return { dir: join(root, 'out'), journal: join(root, 'journal.txt') };
}

/** Counts journal lines per job id: how many attempts each job started. */
export function readJournal(journal: string): Map<string, number> {
  const counts = new Map<string, number>();
  let text = '';
  try {
    text = readFileSync(journal, 'utf8');
  } catch {
    return counts;
  }
  for (const line of text.split('\n').filter(Boolean)) {
    const id = line.split(' ')[0] ?? '';
    counts.set(id, (counts.get(id) ?? 0) + 1);
  }
  return counts;
}

/** Runs `jobs` with the fake handlers into `dir`; returns the summary and the events. */
export async function runFakeSweep(
  dir: string,
  journal: string,
  jobs: JobSpec[],
  extra: Partial<SweepOptions> = {},
): Promise<{ summary: SweepSummary; events: SweepEvent[] }> {
  const ledger = new RunLedger(dir, { runId: `test-${process.pid}-${Math.random()}` });
  const events: SweepEvent[] = [];
  try {
    const summary = await runSweep(jobs, {
      ledger,
      workers: 2,
      cores: 2,
      fresh: false,
      retries: 1,
      timeLimitMs: () => 30_000,
      killGraceMs: 300,
      pollMs: 100,
      env: { MIDPATH_HANDLERS_MODULE: fakeHandlersPath, MIDPATH_FAKE_JOURNAL: journal },
      onEvent: (event) => events.push(event),
      ...extra,
    });
    return { summary, events };
  } finally {
    ledger.close();
  }
}
