/**
 * The train job: load the dataset, fit the method (train an encoder or fit a baseline), save
 * its artifacts (representation, curves.json, spec.json) and report the training metrics.
 * A NaN or infinite loss ends the job as 'diverged' with its reason; it is never a crash.
 * The training code is imported when the handler runs, so a worker that runs an evaluate job
 * (jobs/index.ts imports both handlers) does not load it.
 */
import { readFile, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { loadDataset } from '../../data/load-dataset.ts';
import type { MetricRow } from '../../evaluation/metric.ts';
import { assertInputFilesUnchanged } from '../../plan/input-files.ts';
import type { TrainJobSpec } from '../../plan/job-spec.ts';
import type { FitResult } from '../../training/fit-method.ts';
import type { JobHandler } from '../job-handler.ts';
import { saveRepresentation } from './representation-files.ts';

/** Metrics of suite 'training' from the last curve point (none for closed-form baselines). */
export function trainingMetrics(result: FitResult): MetricRow[] {
  const last = result.curves[result.curves.length - 1];
  if (last === undefined) return [];
  const row = (metric: string, value: number): MetricRow => ({
    suite: 'training',
    metric,
    level: 'all',
    source: '',
    value,
  });
  return [
    row('final_train_loss', last.trainLoss),
    row('final_val_loss', last.valLoss),
    row('final_train_accuracy', last.trainAccuracy),
    row('final_val_accuracy', last.valAccuracy),
  ];
}

/** A readable backend label for provenance, e.g. "tfjs-wasm-simd (1 thread)". */
function backendLabel(info: Record<string, unknown>): string {
  const engine = typeof info.engine === 'string' ? info.engine : 'js';
  const kernel = typeof info.kernel === 'string' && info.kernel !== engine ? `-${info.kernel}` : '';
  const threads = typeof info.threads === 'number' ? info.threads : 1;
  return `${engine}${kernel} (${threads} thread${threads === 1 ? '' : 's'})`;
}

/** The handler of 'train' jobs. */
export const trainJob: JobHandler<TrainJobSpec> = async (spec, ctx) => {
  assertInputFilesUnchanged(spec.inputFiles, spec.baseDir);
  const dataset = await loadDataset(spec.data, spec.baseDir);
  ctx.log(
    `${spec.method.label}: ${dataset.name}, ${dataset.train.length} training episodes, obsDim ${dataset.obsDim}, d ${spec.dim}`,
  );
  const { fitMethod } = await import('../../training/fit-method.ts');
  const result = await fitMethod(spec.method, dataset, spec, {
    log: (line) => ctx.log(line),
    signal: ctx.signal,
    threads: ctx.threads,
    readFile: async (path) => new Uint8Array(await readFile(path)),
  });
  const files = await saveRepresentation(ctx.artifactsDir, result.serialised);
  await writeFile(
    join(ctx.artifactsDir, 'curves.json'),
    `${JSON.stringify(result.curves, null, 2)}\n`,
  );
  await writeFile(join(ctx.artifactsDir, 'spec.json'), `${JSON.stringify(spec, null, 2)}\n`);
  const info = {
    ...result.info,
    backend: backendLabel(result.info),
    artifacts: [...files, 'curves.json', 'spec.json'],
  };
  const metrics = trainingMetrics(result);
  if (result.status === 'diverged') {
    return {
      status: 'diverged',
      metrics,
      info,
      reason: result.reason ?? 'the loss became NaN or infinite',
    };
  }
  return { status: 'done', metrics, info };
};
