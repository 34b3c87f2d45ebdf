import { describe, expect, it } from 'vitest';
import {
  createProgressPrinter,
  describeSummary,
  formatDuration,
} from '../../runner/execute/progress-printer.ts';
import { fakeTrainSpec } from '../fixtures/execute/fake-plan.ts';

describe('progress printer', () => {
  it('prints plain lines without escapes off a terminal, a summary on the timer, and reasons', async () => {
    const out: string[] = [];
    const printer = createProgressPrinter({
      write: (t) => out.push(t),
      isTty: false,
      color: false,
      summaryEveryMs: 20,
    });
    const spec = fakeTrainSpec(0);
    printer.onEvent({ type: 'planned', total: 4, stored: 1, workers: 2, threads: 1 });
    printer.onEvent({ type: 'started', spec, attempt: 1 });
    printer.onEvent({
      type: 'finished',
      spec,
      status: 'failed',
      wallSeconds: 12,
      reason: 'worker exited with code 3',
      elsewhere: false,
    });
    printer.onEvent({
      type: 'finished',
      spec: fakeTrainSpec(1),
      status: 'done',
      wallSeconds: 8,
      elsewhere: false,
    });
    await new Promise((wake) => setTimeout(wake, 60));
    printer.stop();
    const text = out.join('');
    expect(text).not.toContain('\x1b');
    expect(text).toContain('4 jobs, 1 already done; 2 worker(s) × 1 thread(s)');
    expect(text).toContain('failed   train');
    expect(text).toContain('    worker exited with code 3');
    // 3 of 4 complete; one left at the mean 10 s over 2 workers = 5 s.
    expect(text).toContain('progress 3/4 (done 2, failed 1, diverged 0) ETA 5.0 s');
  });

  it('colours statuses and redraws the bar on a terminal unless colour is off', () => {
    const out: string[] = [];
    const printer = createProgressPrinter({ write: (t) => out.push(t), isTty: true, color: true });
    printer.onEvent({ type: 'planned', total: 2, stored: 0, workers: 1, threads: 2 });
    printer.onEvent({
      type: 'finished',
      spec: fakeTrainSpec(0),
      status: 'done',
      wallSeconds: 1,
      elsewhere: false,
    });
    printer.stop();
    const text = out.join('');
    expect(text).toContain('\x1b[32mdone');
    expect(text).toContain('[############............] 1/2');
  });

  it('formats durations and summaries', () => {
    expect([formatDuration(4.25), formatDuration(120), formatDuration(7200)]).toEqual([
      '4.3 s',
      '2.0 min',
      '2.0 h',
    ]);
    expect(
      describeSummary({
        total: 5,
        stored: 1,
        done: 2,
        failed: 1,
        diverged: 0,
        unfinished: 1,
        interrupted: true,
      }),
    ).toBe(
      'Interrupted: 2 done, 1 failed, 0 diverged, 1 kept from earlier runs, 1 not finished (5 jobs).',
    );
  });
});
