/**
 * The evaluate job: load the dataset and the representation its train job saved, run the
 * evaluation suites, write their plot data as JSON artifacts and return the metrics.
 * The evaluation code is imported when the handler runs, so a worker that runs a train job
 * (jobs/index.ts imports both handlers) does not load it.
 */
import { writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { loadDataset } from '../../data/load-dataset.ts';
import { requiredSteps } from '../../data/required-steps.ts';
import { assertInputFilesUnchanged } from '../../plan/input-files.ts';
import type { EvalJobSpec } from '../../plan/job-spec.ts';
import type { JobHandler } from '../job-handler.ts';
import { loadRepresentation } from './representation-files.ts';

/** Runs one evaluation; artifacts land in `<suite>.json` files under ctx.artifactsDir. */
export const evaluateJob: JobHandler<EvalJobSpec> = async (spec, ctx) => {
  const started = Date.now();
  assertInputFilesUnchanged(spec.train.inputFiles, spec.train.baseDir);
  const dataset = await loadDataset(spec.train.data, spec.train.baseDir, {
    minSteps: requiredSteps(spec.eval),
  });
  ctx.log(`dataset ${dataset.name}: ${dataset.test.length} test episodes`);
  const rep = await loadRepresentation(ctx.artifactsOf(spec.trainId));
  ctx.log(`representation ${rep.method}, dim ${rep.dim}${rep.critic ? ', with critic' : ''}`);
  if (ctx.signal.aborted) throw new Error('evaluation stopped before it began');
  const { evaluateRepresentation } = await import('../../evaluation/evaluate.ts');
  const { metrics, artifacts } = await evaluateRepresentation(rep, dataset, spec);
  const files: string[] = [];
  for (const [name, value] of Object.entries(artifacts)) {
    const file = `${name}.json`;
    await writeFile(join(ctx.artifactsDir, file), JSON.stringify(value));
    files.push(file);
  }
  const notes = (artifacts.diagnostics as { notes?: string[] } | undefined)?.notes ?? [];
  for (const note of notes) ctx.log(`note: ${note}`);
  return {
    status: 'done',
    metrics,
    info: {
      artifacts: files,
      notes,
      seconds: (Date.now() - started) / 1000,
      suites: spec.eval.suites,
    },
  };
};
