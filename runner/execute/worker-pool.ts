/**
 * The worker processes of a sweep. Workers are forked through tsx (the project runs
 * TypeScript sources, see bin/midpath.mjs) with a V8 heap limit, so runaway memory ends that
 * worker with "out of memory" instead of taking the machine down.
 *
 * A worker whose job ended cleanly goes back to the pool and runs the next job with the
 * same launch settings, up to `jobsPerWorker` jobs: starting node and loading the sources
 * costs about half a second, longer than a small native training job. Any other ending (a
 * throw, an exit, a signal, a time-out, out of memory, a cancel) retires the process, so a
 * broken state never reaches another job. One attempt's handling is in worker-attempt.ts.
 */
import type { ChildProcess } from 'node:child_process';
import { fork } from 'node:child_process';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { AttemptHost, AttemptSink, WorkerHandle, WorkerLaunch } from './worker-attempt.ts';
import { openLog, startAttempt } from './worker-attempt.ts';
import type { FromWorker } from './worker-protocol.ts';
import { THREADS_ENV } from './worker-protocol.ts';

export type { AttemptResult, CrashCause, WorkerHandle, WorkerLaunch } from './worker-attempt.ts';

const workerEntry = fileURLToPath(new URL('./worker-main.ts', import.meta.url));
const tsxLoader = pathToFileURL(createRequire(import.meta.url).resolve('tsx')).href;

/** How much output printed between jobs is kept for the next job's log (the end of it). */
const STRAY_KEEP_CHARS = 65_536;

/** One worker process; runs attempts one at a time. */
class PooledWorker implements AttemptHost {
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
    return startAttempt(worker, launch, logFd, (reusable) => this.giveBack(worker, reusable));
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
