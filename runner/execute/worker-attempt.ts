/**
 * One job attempt on a worker process: sends the request, routes the worker's output into
 * the job's log up to the end marker on each pipe (end-marker.ts), enforces the time limit,
 * and classifies how the attempt ended. The pool (worker-pool.ts) owns the processes.
 */
import type { ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { closeSync, openSync, writeSync } from 'node:fs';
import { EndMarkerScanner } from './end-marker.ts';
import type { JobOutcome } from './job-handler.ts';
import { LogTail } from './log-tail.ts';
import { DISK_FULL_CODES, SweepStop } from './sweep-stop.ts';
import type { FromWorker, RunRequest } from './worker-protocol.ts';

/**
 * Why an attempt failed; the runner retries `threw`, `exited` and `killed` only, and a
 * `disk-full` (the job threw ENOSPC or EDQUOT) stops the sweep.
 */
export type CrashCause = 'threw' | 'exited' | 'killed' | 'timeout' | 'out-of-memory' | 'disk-full';

export type AttemptResult =
  | {
      kind: 'outcome';
      outcome: JobOutcome;
      peakRssBytes: number;
      wallSeconds: number;
      /** The worker's process id and how many jobs it had run before this one. */
      workerPid: number;
      jobsBefore: number;
    }
  | { kind: 'crash'; cause: CrashCause; reason: string; logTail: string; wallSeconds: number }
  | { kind: 'cancelled' };

export interface WorkerLaunch {
  request: Omit<RunRequest, 'type' | 'endMarker'>;
  logPath: string;
  /** Wall-clock limit; the worker is asked to abort, then killed after `killGraceMs`. */
  timeLimitMs: number;
  killGraceMs: number;
  /** V8 old-space limit of the worker (--max-old-space-size). */
  heapLimitMb: number;
  /** Extra environment for the worker. */
  env: NodeJS.ProcessEnv;
}

export interface WorkerHandle {
  result: Promise<AttemptResult>;
  /** Kills the worker now (second Ctrl-C); the attempt resolves as `cancelled`. */
  cancel(): void;
}

/** Where one attempt's output and messages go while it runs. */
export interface AttemptSink {
  output(stream: 'stdout' | 'stderr', text: string): void;
  message(received: FromWorker): void;
  closed(code: number | null, signal: NodeJS.Signals | null): void;
}

/** What an attempt needs of the process it runs on. */
export interface AttemptHost {
  readonly child: ChildProcess;
  jobsRun: number;
  /** Routes the process's output to `sink`; returns what it printed since the last attempt. */
  attach(sink: AttemptSink): string;
  /** Keeps output that belongs to no attempt (after an end marker) for the next one. */
  keepStray(text: string): void;
  retire(): void;
}

const OUT_OF_MEMORY = /heap out of memory|Reached heap limit|Allocation failed/;

function describeCrash(
  launch: WorkerLaunch,
  tail: LogTail,
  exit: { code: number | null; signal: NodeJS.Signals | null; timedOut: boolean },
): { cause: CrashCause; reason: string } {
  const ms = launch.timeLimitMs;
  const limit = ms < 60_000 ? `${ms / 1000} s` : `${Number((ms / 60_000).toPrecision(3))} min`;
  if (exit.timedOut) {
    const kind = launch.request.spec.kind;
    return {
      cause: 'timeout',
      reason: `time limit exceeded: ran past ${limit} (raise run.timeout.${kind} in the experiment file)`,
    };
  }
  if (tail.matches(OUT_OF_MEMORY)) {
    return {
      cause: 'out-of-memory',
      reason: `out of memory: the worker reached its heap limit of ${launch.heapLimitMb} MB (use fewer --workers to give each more memory)`,
    };
  }
  if (exit.signal) return { cause: 'killed', reason: `worker killed by ${exit.signal}` };
  return {
    cause: 'exited',
    reason: `worker exited with code ${exit.code ?? 'unknown'} before reporting a result`,
  };
}

/** Opens a job's log file; a full disk stops the sweep (every later job would need one too). */
export function openLog(path: string): number {
  try {
    return openSync(path, 'w');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    if (code !== undefined && DISK_FULL_CODES.has(code)) {
      throw new SweepStop(
        'disk-full',
        `cannot create ${path}: ${(error as Error).message}. Free space or choose another directory with --out; results already written are kept, and running again resumes`,
      );
    }
    throw error;
  }
}

/** A job's log file and the tail of its output kept for result.json. */
class JobLog {
  readonly tail = new LogTail();
  private open = true;

  constructor(private readonly fd: number) {}

  write(text: string): void {
    if (text === '') return;
    this.tail.append(text);
    if (!this.open) return;
    try {
      writeSync(this.fd, text);
    } catch (error) {
      // The disk filled up (or the file went away) mid-job: keep the tail for result.json,
      // stop writing the file, and let the job finish; storing its result reports the disk.
      this.close();
      this.tail.append(`\n[log.txt could not be written further: ${(error as Error).message}]\n`);
    }
  }

  close(): void {
    if (!this.open) return;
    this.open = false;
    closeSync(this.fd);
  }
}

/**
 * One attempt. It settles once the outcome has arrived and the end marker has come through
 * both pipes (the worker is then handed back), or once the process has exited and its
 * output is in.
 */
class WorkerAttempt implements AttemptSink {
  readonly result: Promise<AttemptResult>;
  private readonly started = performance.now();
  private readonly endMarker = `\n::midpath end of job ${randomUUID()}::\n`;
  private readonly scanners = {
    stdout: new EndMarkerScanner(this.endMarker),
    stderr: new EndMarkerScanner(this.endMarker),
  };
  private readonly ended = { stdout: false, stderr: false };
  private readonly log: JobLog;
  private readonly jobsBefore: number;
  private readonly timer: NodeJS.Timeout;
  private reported: FromWorker | undefined;
  private timedOut = false;
  private cancelled = false;
  private settled = false;
  private resolve: (result: AttemptResult) => void = () => undefined;

  constructor(
    private readonly host: AttemptHost,
    private readonly launch: WorkerLaunch,
    logFd: number,
    private readonly handBack: (reusable: boolean) => void,
  ) {
    this.log = new JobLog(logFd);
    this.jobsBefore = host.jobsRun;
    host.jobsRun += 1;
    this.result = new Promise((resolve) => (this.resolve = resolve));
    const stray = host.attach(this);
    if (stray !== '') {
      const pid = host.child.pid ?? '?';
      this.log.write(`[worker ${pid} printed this after its previous job ended]\n${stray}`);
    }
    this.timer = setTimeout(() => this.timeOut(), launch.timeLimitMs);
    const request: RunRequest = { type: 'run', ...launch.request, endMarker: this.endMarker };
    host.child.send(request);
  }

  /** Kills the worker now (second Ctrl-C); the attempt resolves as `cancelled`. */
  cancel(): void {
    // Once settled, the process may already serve another attempt: leave it alone.
    if (this.settled) return;
    this.cancelled = true;
    this.host.retire();
  }

  output(stream: 'stdout' | 'stderr', text: string): void {
    if (this.ended[stream]) return this.host.keepStray(text);
    const { before, found, after } = this.scanners[stream].feed(text);
    this.log.write(before);
    if (!found) return;
    this.ended[stream] = true;
    if (after !== '') this.host.keepStray(after);
    this.finishIfClean();
  }

  message(received: FromWorker): void {
    if (received.type === 'log') return this.log.write(`${received.line}\n`);
    this.reported = received;
    this.finishIfClean();
  }

  closed(code: number | null, signal: NodeJS.Signals | null): void {
    if (this.settled) return;
    const { reported: message, timedOut } = this;
    if (this.cancelled) return this.settle({ kind: 'cancelled' });
    if (message?.type === 'outcome' && !timedOut) {
      // The job finished but the process ended before its marker came through: keep the outcome.
      return this.settle(this.outcomeOf(message));
    }
    const wallSeconds = this.wallSeconds();
    if (message?.type === 'threw' && !timedOut) {
      this.log.write(`${message.stack}\n`);
      const diskFull = message.code !== undefined && DISK_FULL_CODES.has(message.code);
      return this.settle({
        kind: 'crash',
        cause: diskFull ? 'disk-full' : 'threw',
        reason: `the job threw: ${message.message}`,
        logTail: this.log.tail.lastLines(),
        wallSeconds,
      });
    }
    const crash = describeCrash(this.launch, this.log.tail, { code, signal, timedOut });
    this.settle({ kind: 'crash', ...crash, logTail: this.log.tail.lastLines(), wallSeconds });
  }

  /** The clean ending: outcome in hand, both pipes past the marker; the worker goes back. */
  private finishIfClean(): void {
    const { reported: message } = this;
    if (this.settled || this.timedOut || this.cancelled || message?.type !== 'outcome') return;
    if (!this.ended.stdout || !this.ended.stderr) return;
    this.settle(this.outcomeOf(message), message.reusable);
  }

  private outcomeOf(message: Extract<FromWorker, { type: 'outcome' }>): AttemptResult {
    return {
      kind: 'outcome',
      outcome: message.outcome,
      peakRssBytes: message.peakRssBytes,
      wallSeconds: this.wallSeconds(),
      workerPid: this.host.child.pid ?? 0,
      jobsBefore: this.jobsBefore,
    };
  }

  /** Closes the log, hands the worker back when the attempt ended cleanly, and resolves. */
  private settle(result: AttemptResult, reusable?: boolean): void {
    if (this.settled) return;
    this.settled = true;
    clearTimeout(this.timer);
    for (const stream of ['stdout', 'stderr'] as const) {
      this.log.write(this.scanners[stream].flush());
    }
    this.log.close();
    if (reusable !== undefined) this.handBack(reusable);
    this.resolve(result);
  }

  private timeOut(): void {
    this.timedOut = true;
    const { child } = this.host;
    if (child.connected) child.send({ type: 'abort', reason: 'time limit exceeded' });
    setTimeout(() => this.host.retire(), this.launch.killGraceMs).unref();
  }

  private wallSeconds(): number {
    return (performance.now() - this.started) / 1000;
  }
}

/** Runs one attempt of `launch` on `host`, writing its log to `logFd` (closed when it ends). */
export function startAttempt(
  host: AttemptHost,
  launch: WorkerLaunch,
  logFd: number,
  handBack: (reusable: boolean) => void,
): WorkerHandle {
  const attempt = new WorkerAttempt(host, launch, logFd, handBack);
  return { result: attempt.result, cancel: () => attempt.cancel() };
}
