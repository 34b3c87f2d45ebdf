import { isEvalInput, isTrainInput, METHOD_INPUTS } from './method-inputs.ts';
import type { ExperimentConfig } from './types.ts';

/** One axis of the product: a single path, or a `together` group that varies as one. */
export interface SweepAxis {
  paths: string[];
  length: number;
}

/** The axes of a sweep in product order: `axes` entries first, then each `together` group. */
export function listSweepAxes(sweep: ExperimentConfig['sweep']): SweepAxis[] {
  const single = Object.entries(sweep.axes).map(([path, values]) => ({
    paths: [path],
    length: values.length,
  }));
  const groups = sweep.together.map((group) => ({
    paths: Object.keys(group),
    length: Object.values(group)[0]?.length ?? 0,
  }));
  return [...single, ...groups];
}

/** The training seeds: `n` means 0..n-1. */
export function listSeeds(seeds: number | number[]): number[] {
  return typeof seeds === 'number' ? Array.from({ length: seeds }, (_, i) => i) : [...seeds];
}

/** Jobs of one kind per method, before any job is built. */
export interface JobCount {
  train: number;
  evaluate: number;
  total: number;
}

/**
 * Counts the distinct jobs a config expands to without building them. A method's train jobs
 * are the product of the axes that are inputs of its training (a paired group counts once),
 * times the seeds when its output depends on the seed; its evaluate jobs multiply that by the
 * axes over `eval.*` only. Axes irrelevant to a method (e.g. `train.discount` for pca) do not
 * multiply its jobs: those jobs would be identical and share one id.
 */
export function countJobs(config: Pick<ExperimentConfig, 'methods' | 'sweep'>): JobCount {
  const axes = listSweepAxes(config.sweep);
  const seedCount = listSeeds(config.sweep.seeds).length;
  let train = 0;
  let evaluate = 0;
  for (const method of config.methods) {
    let trainJobs = METHOD_INPUTS[method.name].seed ? seedCount : 1;
    let evalFactor = 1;
    for (const axis of axes) {
      if (axis.paths.some((p) => isTrainInput(method.name, p))) trainJobs *= axis.length;
      else if (axis.paths.some((p) => isEvalInput(p))) evalFactor *= axis.length;
    }
    train += trainJobs;
    evaluate += trainJobs * evalFactor;
  }
  return { train, evaluate, total: train + evaluate };
}
