/**
 * Progress of a sweep for people. On a terminal: one overall bar (counts and ETA) kept at
 * the bottom, and a line per finished job above it. Elsewhere (CI, nohup, cluster logs):
 * plain lines, one per finished job, and a summary line every 30 s. Colour only on a
 * terminal and never when NO_COLOR is set (https://no-color.org, common practice).
 */
import type { JobSpec } from '../plan/job-spec.ts';
import type { FinishedStatus } from './job-ledger.ts';
import type { SweepEvent, SweepSummary } from './sweep-events.ts';

export interface ProgressOptions {
  /** Writes text as is (no newline added). */
  write: (text: string) => void;
  isTty: boolean;
  color: boolean;
  /** Milliseconds between summary lines when not on a terminal. (default 30000) */
  summaryEveryMs?: number;
}

export interface ProgressPrinter {
  onEvent(event: SweepEvent): void;
  /** Clears the bar and stops the summary timer. */
  stop(): void;
}

const COLORS: Record<FinishedStatus, string> = {
  done: '\x1b[32m',
  failed: '\x1b[31m',
  diverged: '\x1b[33m',
};
const BAR_WIDTH = 24;

/** Seconds as "42 s", "3.5 min" or "2.1 h". */
export function formatDuration(seconds: number): string {
  if (seconds < 90) return `${seconds.toFixed(seconds < 10 ? 1 : 0)} s`;
  if (seconds < 5400) return `${(seconds / 60).toFixed(1)} min`;
  return `${(seconds / 3600).toFixed(1)} h`;
}

function describeJob(spec: JobSpec): string {
  const setting = Object.entries(spec.setting)
    .map(([key, value]) => `${key}=${typeof value === 'string' ? value : JSON.stringify(value)}`)
    .join(' ');
  return `${spec.kind.padEnd(8)} ${spec.id.slice(0, 10)}  ${spec.method.label} seed=${spec.seed}${setting ? ` ${setting}` : ''}`;
}

/** Live counts of a sweep and the measured cost per kind, for the bar and summaries. */
class Tally {
  total = 0;
  stored = 0;
  workers = 1;
  readonly finished: Record<FinishedStatus, number> = { done: 0, failed: 0, diverged: 0 };
  private readonly cost = new Map<string, { seconds: number; count: number }>();

  plan(total: number, stored: number, workers: number): void {
    Object.assign(this, { total, stored, workers });
  }

  finish(spec: JobSpec, status: FinishedStatus, seconds: number): void {
    this.finished[status] += 1;
    if (seconds > 0) {
      const cost = this.cost.get(spec.kind) ?? { seconds: 0, count: 0 };
      this.cost.set(spec.kind, { seconds: cost.seconds + seconds, count: cost.count + 1 });
    }
  }

  get complete(): number {
    return this.stored + this.finished.done + this.finished.failed + this.finished.diverged;
  }

  /** Seconds left: remaining jobs × mean cost of their kind ÷ workers; null before any measure. */
  eta(): number | null {
    const remaining = this.total - this.complete;
    const costs = [...this.cost.values()];
    if (remaining <= 0) return 0;
    if (costs.length === 0) return null;
    const mean = costs.reduce((s, c) => s + c.seconds, 0) / costs.reduce((s, c) => s + c.count, 0);
    return (remaining * mean) / this.workers;
  }

  line(): string {
    const eta = this.eta();
    const { done, failed, diverged } = this.finished;
    return `${this.complete}/${this.total} (done ${done + this.stored}, failed ${failed}, diverged ${diverged}) ETA ${eta === null ? '?' : formatDuration(eta)}`;
  }
}

/** Creates the printer for one sweep. */
export function createProgressPrinter(options: ProgressOptions): ProgressPrinter {
  const tally = new Tally();
  const paint = (status: FinishedStatus, text: string): string =>
    options.color ? `${COLORS[status]}${text}\x1b[0m` : text;
  const bar = (): string => {
    const filled =
      tally.total === 0 ? BAR_WIDTH : Math.round((tally.complete / tally.total) * BAR_WIDTH);
    return `[${'#'.repeat(filled)}${'.'.repeat(BAR_WIDTH - filled)}] ${tally.line()}`;
  };
  const print = (line: string): void => {
    options.write(options.isTty ? `\r\x1b[2K${line}\n${bar()}` : `${line}\n`);
  };
  const timer = options.isTty
    ? undefined
    : setInterval(
        () => options.write(`progress ${tally.line()}\n`),
        options.summaryEveryMs ?? 30_000,
      );
  timer?.unref();

  return {
    onEvent(event) {
      switch (event.type) {
        case 'planned':
          tally.plan(event.total, event.stored, event.workers);
          print(
            `${event.total} jobs, ${event.stored} already done; ${event.workers} worker(s) × ${event.threads} thread(s)`,
          );
          break;
        case 'started':
          if (options.isTty) options.write(`\r\x1b[2K${bar()}`);
          break;
        case 'finished': {
          tally.finish(event.spec, event.status, event.wallSeconds);
          const where = event.elsewhere
            ? ' (by another runner)'
            : ` ${formatDuration(event.wallSeconds)}`;
          const reason = event.reason === undefined ? '' : `\n    ${event.reason}`;
          print(
            `${paint(event.status, event.status.padEnd(8))} ${describeJob(event.spec)}${where}${reason}`,
          );
          break;
        }
        case 'retrying':
          print(`retry    ${describeJob(event.spec)} (attempt ${event.attempt}): ${event.reason}`);
          break;
        case 'waiting':
          print(`waiting  ${describeJob(event.spec)}: another runner holds it`);
          break;
        case 'draining':
          print(
            `stopping: no new jobs; waiting for ${event.running} running job(s). Press Ctrl-C again to stop them now.`,
          );
          break;
        case 'killing':
          print(`stopping now: killing ${event.running} running job(s)`);
          break;
      }
    },
    stop() {
      if (timer) clearInterval(timer);
      if (options.isTty) options.write(`\r\x1b[2K${bar()}\n`);
    },
  };
}

/** One line saying how the sweep ended. */
export function describeSummary(summary: SweepSummary): string {
  const parts = [
    `${summary.done} done`,
    `${summary.failed} failed`,
    `${summary.diverged} diverged`,
    `${summary.stored} kept from earlier runs`,
  ];
  if (summary.unfinished > 0) parts.push(`${summary.unfinished} not finished`);
  return `${summary.interrupted ? 'Interrupted' : 'Finished'}: ${parts.join(', ')} (${summary.total} jobs).`;
}
