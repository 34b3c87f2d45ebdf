/**
 * Runs job attempts in worker processes and classifies how each ended. Workers are forked
 * through tsx (the project runs TypeScript sources, see bin/midpath.mjs) with a V8 heap
 * limit, so runaway memory ends that worker with "out of memory" instead of taking the
 * machine down; a timer enforces the time limit of the job's kind.
 *
 * A worker whose job ended cleanly goes back to the pool and runs the next job with the
 * same launch settings, up to `jobsPerWorker` jobs: starting node and loading the
 * sources costs about half a second, longer than a small native training job. Any other
 * ending (a throw, an exit, a signal, a time-out, out of memory, a cancel) retires the
 * process, so a broken state never reaches another job. Each attempt's output is cut from
 * the shared pipes at the end marker the worker prints (end-marker.ts).
 */
import type { ChildProcess } from 'node:child_process';
import { fork } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { closeSync, openSync, writeSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { EndMarkerScanner } from './end-marker.ts';
import type { JobOutcome } from './job-handler.ts';
import { LogTail } from './log-tail.ts';
import { DISK_FULL_CODES, SweepStop } from './sweep-stop.ts';
import type { FromWorker, RunRequest } from './worker-protocol.ts';
import { THREADS_ENV } from './worker-protocol.ts';

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

const OUT_OF_MEMORY = /heap out of memory|Reached heap limit|Allocation failed/;
const workerEntry = fileURLToPath(new URL('./worker-main.ts', import.meta.url));
const tsxLoader = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href;

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

/** How much output printed between jobs is kept for the next job's log (the end of it). */
const STRAY_KEEP_CHARS = 65_536;

/** Where one attempt's output and messages go while it runs. */
interface AttemptSink {
  output(stream: 'stdout' | 'stderr', text: string): void;
  message(received: FromWorker): void;
  closed(code: number | null, signal: NodeJS.Signals | null): void;
}

/** One worker process; runs attempts one at a time. */
class PooledWorker {
  readonly child: ChildProcess;
  jobsRun = 0;
  alive = true;
  /** Output printed while no attempt ran (a previous job's stray timer, say). */
  private strayOutput = '';
  private sink: AttemptSink | undefined;

  constructor(
    readonly key: string,
    launch: WorkerLaunch,
    onExit: (worker: PooledWorker) => void,
  ) {
    this.child = fork(workerEntry, [], {
      execArgv: ['--import', tsxLoader, `--max-old-space-size=${launch.heapLimitMb}`],
      env: {
        ...process.env,
        ...launch.env,
        [THREADS_ENV]: String(launch.request.threads),
        OMP_NUM_THREADS: String(launch.request.threads),
      },
      stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
      serialization: 'json',
    });
    const route = (stream: 'stdout' | 'stderr') => (chunk: Buffer) => {
      const text = chunk.toString('utf8');
      if (this.sink) this.sink.output(stream, text);
      else this.keepStray(text);
    };
    this.child.stdout?.on('data', route('stdout'));
    this.child.stderr?.on('data', route('stderr'));
    this.child.on('message', (received: FromWorker) => {
      if (this.sink) this.sink.message(received);
      else if (received.type === 'log') this.keepStray(`${received.line}\n`);
    });
    this.child.on('error', (error) =>
      this.sink?.output('stderr', `worker error: ${error.message}\n`),
    );
    this.child.on('close', (code, signal) => {
      this.alive = false;
      onExit(this);
      this.sink?.closed(code, signal);
    });
  }

  /** Hands the process to an attempt; returns output printed since the last attempt. */
  attach(sink: AttemptSink): string {
    this.sink = sink;
    const stray = this.strayOutput;
    this.strayOutput = '';
    return stray;
  }

  detach(): void {
    this.sink = undefined;
  }

  /** Output that arrives after an attempt's end marker is kept (its end) for the next attempt. */
  keepStray(text: string): void {
    this.strayOutput = (this.strayOutput + text).slice(-STRAY_KEEP_CHARS);
  }

  retire(): void {
    if (this.alive) this.child.kill('SIGKILL');
  }
}

export interface PoolOptions {
  /** Jobs a worker runs before it is replaced; 1 gives every attempt a fresh process. */
  jobsPerWorker: number;
}

/** Worker processes of one sweep; `close()` ends the idle ones when the sweep is over. */
export class WorkerPool {
  private readonly idle: PooledWorker[] = [];
  private closed = false;

  constructor(private readonly options: PoolOptions) {}

  /** Starts an attempt on an idle worker with the same launch settings, or on a new one. */
  start(launch: WorkerLaunch): WorkerHandle {
    const logFd = openLog(launch.logPath); // before taking a worker: a throw here leaks none
    const key = JSON.stringify([launch.heapLimitMb, launch.request.threads, launch.env]);
    const at = this.idle.findIndex((worker) => worker.key === key && worker.alive);
    const worker =
      at >= 0
        ? this.idle.splice(at, 1)[0]!
        : new PooledWorker(key, launch, (gone) => this.forget(gone));
    return runAttempt(worker, launch, logFd, (reusable) => this.giveBack(worker, reusable));
  }

  /** Ends every idle worker; later attempts still start fresh ones. */
  close(): void {
    this.closed = true;
    for (const worker of this.idle.splice(0)) worker.retire();
  }

  private giveBack(worker: PooledWorker, reusable: boolean): void {
    worker.detach();
    const keep =
      reusable && !this.closed && worker.alive && worker.jobsRun < this.options.jobsPerWorker;
    if (keep) this.idle.push(worker);
    else worker.retire();
  }

  private forget(worker: PooledWorker): void {
    const at = this.idle.indexOf(worker);
    if (at >= 0) this.idle.splice(at, 1);
  }
}

/** Opens a job's log file; a full disk stops the sweep (every later job would need one too). */
function openLog(path: string): number {
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

/**
 * Runs one attempt on `worker`. It resolves once the outcome has arrived and the end marker
 * has come through both pipes (the worker is then handed back), or once the process has
 * exited and its output is in.
 */
function runAttempt(
  worker: PooledWorker,
  launch: WorkerLaunch,
  logFd: number,
  handBack: (reusable: boolean) => void,
): WorkerHandle {
  const started = performance.now();
  const endMarker = `\n::midpath end of job ${randomUUID()}::\n`;
  const scanners = {
    stdout: new EndMarkerScanner(endMarker),
    stderr: new EndMarkerScanner(endMarker),
  };
  const ended = { stdout: false, stderr: false };
  const tail = new LogTail();
  let logOpen = true;
  const write = (text: string): void => {
    if (text === '') return;
    tail.append(text);
    if (!logOpen) return;
    try {
      writeSync(logFd, text);
    } catch (error) {
      // The disk filled up (or the file went away) mid-job: keep the tail for result.json,
      // stop writing the file, and let the job finish; storing its result reports the disk.
      logOpen = false;
      closeSync(logFd);
      tail.append(`\n[log.txt could not be written further: ${(error as Error).message}]\n`);
    }
  };
  const closeLog = (): void => {
    for (const stream of ['stdout', 'stderr'] as const) write(scanners[stream].flush());
    if (!logOpen) return;
    logOpen = false;
    closeSync(logFd);
  };
  let message: FromWorker | undefined;
  let timedOut = false;
  let cancelled = false;
  let settled = false;
  const jobsBefore = worker.jobsRun;
  worker.jobsRun += 1;

  let settle: (result: AttemptResult) => void = () => undefined;
  const result = new Promise<AttemptResult>((resolve) => {
    settle = (value) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      resolve(value);
    };
  });
  const wallSeconds = (): number => (performance.now() - started) / 1000;

  /** The clean ending: outcome in hand, both pipes past the marker; the worker goes back. */
  const finishIfClean = (): void => {
    if (settled || timedOut || cancelled || message?.type !== 'outcome') return;
    if (!ended.stdout || !ended.stderr) return;
    closeLog();
    handBack(message.reusable);
    settle({
      kind: 'outcome',
      outcome: message.outcome,
      peakRssBytes: message.peakRssBytes,
      wallSeconds: wallSeconds(),
      workerPid: worker.child.pid ?? 0,
      jobsBefore,
    });
  };

  const stray = worker.attach({
    output(stream, text) {
      if (ended[stream]) return worker.keepStray(text);
      const { before, found, after } = scanners[stream].feed(text);
      write(before);
      if (!found) return;
      ended[stream] = true;
      if (after !== '') worker.keepStray(after);
      finishIfClean();
    },
    message(received) {
      if (received.type === 'log') write(`${received.line}\n`);
      else {
        message = received;
        finishIfClean();
      }
    },
    closed(code, signal) {
      if (settled) return;
      const seconds = wallSeconds();
      if (cancelled) {
        closeLog();
        return settle({ kind: 'cancelled' });
      }
      if (message?.type === 'outcome' && !timedOut) {
        // The job finished but the process ended before its marker came through: keep the outcome.
        closeLog();
        return settle({
          kind: 'outcome',
          outcome: message.outcome,
          peakRssBytes: message.peakRssBytes,
          wallSeconds: seconds,
          workerPid: worker.child.pid ?? 0,
          jobsBefore,
        });
      }
      if (message?.type === 'threw' && !timedOut) {
        write(`${message.stack}\n`);
        const logTail = tail.lastLines();
        closeLog();
        const diskFull = message.code !== undefined && DISK_FULL_CODES.has(message.code);
        return settle({
          kind: 'crash',
          cause: diskFull ? 'disk-full' : 'threw',
          reason: `the job threw: ${message.message}`,
          logTail,
          wallSeconds: seconds,
        });
      }
      const crash = describeCrash(launch, tail, { code, signal, timedOut });
      const logTail = tail.lastLines();
      closeLog();
      settle({ kind: 'crash', ...crash, logTail, wallSeconds: seconds });
    },
  });
  if (stray !== '') {
    write(
      `[worker ${worker.child.pid ?? '?'} printed this after its previous job ended]\n${stray}`,
    );
  }

  const timer = setTimeout(() => {
    timedOut = true;
    if (worker.child.connected) worker.child.send({ type: 'abort', reason: 'time limit exceeded' });
    setTimeout(() => worker.retire(), launch.killGraceMs).unref();
  }, launch.timeLimitMs);

  const request: RunRequest = { type: 'run', ...launch.request, endMarker };
  worker.child.send(request);
  return {
    result,
    cancel: () => {
      cancelled = true;
      worker.retire();
    },
  };
}
