/**
 * A probe run in its own process by tfjs-lazy-load.test.ts: runs one scenario through the
 * real job handlers, then reports on stdout (one JSON line) whether TF.js was loaded.
 *
 *   node --import tsx tests/training/tfjs-load-probe.ts <scenario> <dir>
 *
 * Scenarios: `native` (a contrastive train job on the native engine), `baselines` (train
 * jobs of pca, sfa, raw and random), `evaluate` (an evaluate job of the representation saved
 * in <dir>/train), `tfjs` (a contrastive train job on TF.js: the control, which must load it).
 *
 * How "loaded" is detected, two ways that must agree: TF.js is a CommonJS package, so
 * importing it from ESM puts its files in the CommonJS module cache (`require.cache`, shared
 * by every loader in the process); and tfjs-core registers its engine as the global
 * `_tfengine` when it first runs.
 */
import { mkdir } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { MethodName } from '../../runner/config/types.ts';
import { evaluateJob } from '../../runner/execute/jobs/evaluate-job.ts';
import { trainJob } from '../../runner/execute/jobs/train-job.ts';
import type { JobContext } from '../../runner/execute/job-handler.ts';
import { evalConfig, evalSpec } from '../evaluation/fixtures.ts';
import { encoderConfig, smallData, trainConfig, trainSpec } from './fixtures.ts';

/** The data of every scenario (the greenhouse sensor array, small). */
export const probeData = smallData({ episodes: 12, steps: 24, obsDim: 6, stateDim: 2 });

function context(artifactsDir: string, trainDir: string): JobContext {
  return {
    artifactsDir,
    artifactsOf: () => trainDir,
    threads: 1,
    log: () => undefined,
    signal: new AbortController().signal,
  };
}

async function train(dir: string, name: MethodName, engine: 'native' | 'tfjs'): Promise<string> {
  const out = join(dir, name);
  await mkdir(out, { recursive: true });
  const spec = trainSpec({
    method: { name, label: name },
    data: probeData,
    encoder: encoderConfig({ widths: [8] }),
    train: trainConfig({ steps: 10, batch: 16, logEvery: 5, engine }),
    dim: 2,
  });
  const outcome = await trainJob(spec, context(out, out));
  const engineName = outcome.info?.engine;
  return `${name}:${outcome.status}:${typeof engineName === 'string' ? engineName : ''}`;
}

async function evaluate(dir: string): Promise<string> {
  const out = join(dir, 'eval');
  await mkdir(out, { recursive: true });
  const spec = evalSpec(evalConfig({ suites: ['forecast', 'assumptions'], queries: 10 }));
  spec.train.data = probeData;
  const outcome = await evaluateJob(spec, context(out, join(dir, 'train')));
  return `evaluate:${outcome.status}:${outcome.metrics.length}`;
}

async function runScenario(scenario: string, dir: string): Promise<string[]> {
  switch (scenario) {
    case 'native':
      return [await train(dir, 'contrastive', 'native')];
    case 'tfjs':
      return [await train(dir, 'contrastive', 'tfjs')];
    case 'baselines': {
      const names: MethodName[] = ['pca', 'sfa', 'raw', 'random'];
      const done: string[] = [];
      for (const name of names) done.push(await train(dir, name, 'tfjs'));
      return done;
    }
    case 'evaluate':
      return [await evaluate(dir)];
    default:
      throw new Error(`unknown scenario '${scenario}'`);
  }
}

/** Runs the scenario named on the command line and prints the report. */
async function main(): Promise<void> {
  const [scenario = '', dir = ''] = process.argv.slice(2);
  const ran = await runScenario(scenario, dir);
  const cached = Object.keys(createRequire(import.meta.url).cache).filter((k) =>
    k.includes('/node_modules/@tensorflow/'),
  );
  const engineGlobal = (globalThis as { _tfengine?: unknown })._tfengine !== undefined;
  console.log(JSON.stringify({ ran, tfjsFiles: cached.length, tfjsEngine: engineGlobal }));
}

// Run only as a script (the test imports probeData from here).
if (process.argv[1] !== undefined && fileURLToPath(import.meta.url) === resolve(process.argv[1])) {
  await main();
}
