/**
 * Entry point of a worker process (forked by run-in-worker.ts through tsx). It waits for one
 * RunRequest, runs the job's handler and reports the outcome over IPC, then exits. Anything
 * the handler prints goes to the runner through the piped stdout/stderr and lands in the
 * job's log.
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { JobContext, JobHandler } from './job-handler.ts';
import type { JobKind } from '../plan/job-spec.ts';
import type { FromWorker, RunRequest, ToWorker } from './worker-protocol.ts';
import { HANDLERS_MODULE_ENV } from './worker-protocol.ts';

type Lookup = (kind: JobKind) => JobHandler;

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

function send(message: FromWorker): Promise<void> {
  return new Promise((done) => {
    if (!process.send) return done();
    process.send(message, undefined, {}, () => done());
  });
}

function peakRssBytes(): number {
  // resourceUsage().maxRSS is in kilobytes (getrusage(2)); this process ran only this job.
  return process.resourceUsage().maxRSS * 1024;
}

async function runRequest(request: RunRequest, abort: AbortController): Promise<void> {
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
    const handler = (await loadLookup())(request.spec.kind);
    const outcome = await handler(request.spec, context);
    await send({ type: 'outcome', outcome, peakRssBytes: peakRssBytes() });
    process.exit(0);
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const stack = error instanceof Error ? (error.stack ?? message) : message;
    await send({ type: 'threw', message, stack, peakRssBytes: peakRssBytes() });
    process.exit(1);
  }
}

const abort = new AbortController();
process.on('message', (message: ToWorker) => {
  switch (message.type) {
    case 'run':
      void runRequest(message, abort);
      break;
    case 'abort':
      abort.abort(new Error(message.reason));
      break;
  }
});
// Ctrl-C reaches the whole terminal process group; the runner decides what stops (first
// Ctrl-C lets running jobs finish), so workers ignore it. SIGKILL still ends them.
process.on('SIGINT', () => undefined);
// The runner is gone (kill -9, crash): stop at once so no orphan keeps computing.
process.on('disconnect', () => process.exit(1));
