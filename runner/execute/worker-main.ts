/**
 * Entry point of a worker process (forked by worker-pool.ts through tsx). It runs the jobs
 * the runner sends, one at a time, and reports each outcome over IPC. After a job it prints
 * the request's end marker on stdout and stderr, so the runner can cut the piped output
 * into per-job logs, and waits for the next request. A job that throws ends the process:
 * whatever state it left behind never reaches another job.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { getHeapStatistics } from 'node:v8';
import type { JobContext, JobHandler } from './job-handler.ts';
import type { JobKind } from '../plan/job-spec.ts';
import type { FromWorker, RunRequest, ToWorker } from './worker-protocol.ts';
import { HANDLERS_MODULE_ENV } from './worker-protocol.ts';

type Lookup = (kind: JobKind) => JobHandler;

/** A job leaving more than this share of the heap limit in use retires its worker. */
const REUSE_HEAP_SHARE = 0.5;

/** Loads the handler map: the built-in one, or the test-only replacement named in the env. */
async function loadLookup(): Promise<Lookup> {
  const replacement = process.env[HANDLERS_MODULE_ENV];
  const url = replacement
    ? pathToFileURL(resolve(replacement)).href
    : new URL('./jobs/index.ts', import.meta.url).href;
  const module = (await import(url)) as { handlerFor?: Lookup };
  if (typeof module.handlerFor !== 'function') {
    throw new Error(`${url}: expected an exported function handlerFor(kind), got none`);
  }
  return module.handlerFor;
}

let lookup: Promise<Lookup> | undefined;

function send(message: FromWorker): Promise<void> {
  return new Promise((done) => {
    if (!process.send) return done();
    process.send(message, undefined, {}, () => done());
  });
}

function write(stream: NodeJS.WriteStream, text: string): Promise<void> {
  return new Promise((done) => stream.write(text, () => done()));
}

/**
 * Starts a fresh peak-memory window for the next job. On Linux, writing 5 to
 * /proc/self/clear_refs resets the process's peak resident set (proc(5)), which is what
 * getrusage(2) reports as maxrss. Elsewhere the figure stays the worker's lifetime peak,
 * an upper bound of the job's own.
 */
function resetPeakRss(): void {
  try {
    writeFileSync('/proc/self/clear_refs', '5');
  } catch {
    // Not Linux, or not allowed: keep the lifetime peak.
  }
}

function peakRssBytes(): number {
  try {
    // VmHWM is the peak resident set since the last reset, in kB (proc(5)).
    const match = /VmHWM:\s+(\d+)\s+kB/.exec(readFileSync('/proc/self/status', 'utf8'));
    if (match?.[1]) return Number(match[1]) * 1024;
  } catch {
    // Fall through to getrusage.
  }
  return process.resourceUsage().maxRSS * 1024; // getrusage(2) maxrss is in kilobytes
}

/**
 * Whether this process may run another job: its V8 heap is under half its limit and its
 * resident set (which also counts WebAssembly memory, such as TF.js's wasm backend, and
 * native buffers, neither of which ever shrinks) is under the heap limit.
 */
function memoryStaysSmall(): boolean {
  const heap = getHeapStatistics();
  return (
    heap.used_heap_size < REUSE_HEAP_SHARE * heap.heap_size_limit &&
    process.memoryUsage.rss() < heap.heap_size_limit
  );
}

async function runRequest(request: RunRequest, abort: AbortController): Promise<void> {
  resetPeakRss();
  const context: JobContext = {
    artifactsDir: request.artifactsDir,
    artifactsOf: (jobId) => {
      const dir = request.dependencies[jobId];
      if (dir === undefined)
        throw new Error(`job ${jobId} is not a dependency of ${request.spec.id}`);
      return dir;
    },
    threads: request.threads,
    log: (line) => void send({ type: 'log', line }),
    signal: abort.signal,
  };
  try {
    lookup ??= loadLookup();
    const handler = (await lookup)(request.spec.kind);
    const outcome = await handler(request.spec, context);
    await send({
      type: 'outcome',
      outcome,
      peakRssBytes: peakRssBytes(),
      reusable: memoryStaysSmall(),
    });
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const stack = error instanceof Error ? (error.stack ?? message) : message;
    const code = (error as { code?: unknown } | null)?.code;
    await send({
      type: 'threw',
      message,
      stack,
      peakRssBytes: peakRssBytes(),
      ...(typeof code === 'string' ? { code } : {}),
    });
    process.exit(1);
  }
  await Promise.all([
    write(process.stdout, request.endMarker),
    write(process.stderr, request.endMarker),
  ]);
}

let current: AbortController | undefined;
process.on('message', (message: ToWorker) => {
  switch (message.type) {
    case 'run':
      current = new AbortController();
      void runRequest(message, current);
      break;
    case 'abort':
      current?.abort(new Error(message.reason));
      break;
  }
});
// Ctrl-C reaches the whole terminal process group; the runner decides what stops (first
// Ctrl-C lets running jobs finish), so workers ignore it. SIGKILL still ends them.
process.on('SIGINT', () => undefined);
// The runner is gone (kill -9, crash) or retired this worker: stop at once.
process.on('disconnect', () => process.exit(1));
