/**
 * The one entry point from a train job to a fitted method: looks the method up in the map
 * (runner/training/methods/index.ts) and fits it on the dataset.
 */
import type { MethodConfig } from '../config/types.ts';
import type { Dataset } from '../data/episode.ts';
import type { TrainJobSpec } from '../plan/job-spec.ts';
import type { FitHooks, FitResult } from './method.ts';
import { methods } from './methods/index.ts';

export type { FitHooks, FitResult } from './method.ts';

/**
 * Fits `method` on `dataset` as `spec` describes. Returns status 'diverged' (never throws)
 * when the loss becomes NaN or infinite; throws TrainingError (with a code) on bad input.
 */
export function fitMethod(
  method: MethodConfig,
  dataset: Dataset,
  spec: TrainJobSpec,
  hooks: FitHooks,
): Promise<FitResult> {
  return methods[method.name]({ method, dataset, spec, hooks });
}
