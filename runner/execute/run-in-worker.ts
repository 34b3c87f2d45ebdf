/**
 * Runs one job attempt in a fresh worker process and classifies how it ended. The worker
 * is forked through tsx (the project runs TypeScript sources, see bin/midpath.mjs) with a
 * V8 heap limit, so runaway memory ends that worker with "out of memory" instead of
 * taking the machine down; a timer enforces the time limit of the job's kind.
 */
import { fork } from 'node:child_process';
import { closeSync, openSync, writeSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { JobOutcome } from './job-handler.ts';
import { LogTail } from './log-tail.ts';
import type { FromWorker, RunRequest } from './worker-protocol.ts';
import { THREADS_ENV } from './worker-protocol.ts';

/** Why an attempt failed; the runner retries `threw`, `exited` and `killed` only. */
export type CrashCause = 'threw' | 'exited' | 'killed' | 'timeout' | 'out-of-memory';

export type AttemptResult =
  | { kind: 'outcome'; outcome: JobOutcome; peakRssBytes: number; wallSeconds: number }
  | { kind: 'crash'; cause: CrashCause; reason: string; logTail: string; wallSeconds: number }
  | { kind: 'cancelled' };

export interface WorkerLaunch {
  request: Omit<RunRequest, 'type'>;
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

/** Forks a worker for one attempt; resolves when the worker has exited and its output is in. */
export function startWorker(launch: WorkerLaunch): WorkerHandle {
  const started = performance.now();
  const tail = new LogTail();
  const logFd = openSync(launch.logPath, 'w');
  let logOpen = true;
  const write = (text: string): void => {
    tail.append(text);
    if (logOpen) writeSync(logFd, text);
  };
  const child = fork(workerEntry, [], {
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
  let message: FromWorker | undefined;
  let timedOut = false;
  let cancelled = false;
  child.stdout?.on('data', (chunk: Buffer) => write(chunk.toString('utf8')));
  child.stderr?.on('data', (chunk: Buffer) => write(chunk.toString('utf8')));
  child.on('message', (received: FromWorker) => {
    if (received.type === 'log') write(`${received.line}\n`);
    else message = received;
  });
  const timer = setTimeout(() => {
    timedOut = true;
    if (child.connected) child.send({ type: 'abort', reason: 'time limit exceeded' });
    setTimeout(() => child.kill('SIGKILL'), launch.killGraceMs).unref();
  }, launch.timeLimitMs);
  const result = new Promise<AttemptResult>((settle) => {
    const finish = (code: number | null, signal: NodeJS.Signals | null): void => {
      clearTimeout(timer);
      const wallSeconds = (performance.now() - started) / 1000;
      if (cancelled) return settle({ kind: 'cancelled' });
      if (message?.type === 'outcome' && !timedOut) {
        return settle({
          kind: 'outcome',
          outcome: message.outcome,
          peakRssBytes: message.peakRssBytes,
          wallSeconds,
        });
      }
      if (message?.type === 'threw' && !timedOut) {
        write(`${message.stack}\n`);
        return settle({
          kind: 'crash',
          cause: 'threw',
          reason: `the job threw: ${message.message}`,
          logTail: tail.lastLines(),
          wallSeconds,
        });
      }
      const crash = describeCrash(launch, tail, { code, signal, timedOut });
      settle({ kind: 'crash', ...crash, logTail: tail.lastLines(), wallSeconds });
    };
    child.on('close', (code, signal) => {
      finish(code, signal);
      logOpen = false;
      closeSync(logFd);
    });
    child.on('error', (error) => write(`worker error: ${error.message}\n`));
  });
  child.send({ type: 'run', ...launch.request });
  return {
    result,
    cancel: () => {
      cancelled = true;
      child.kill('SIGKILL');
    },
  };
}
