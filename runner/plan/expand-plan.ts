import { listSeeds } from '../config/count-jobs.ts';
import { writeAtPath } from '../config/config-paths.ts';
import { isEvalInput, isTrainInput, METHOD_INPUTS } from '../config/method-inputs.ts';
import type { ExperimentConfig, MethodConfig } from '../config/types.ts';
import { hashJob } from './hash-job.ts';
import type { DigestOf } from './input-files.ts';
import { fileDigester, filesReadBy } from './input-files.ts';
import type { EvalJobSpec, JobSpec, Setting, TrainJobSpec } from './job-spec.ts';
import { labelAxisValues } from './label-axis-values.ts';
import { assertPlanSize } from './plan-size.ts';

/** One axis of the product with its values per path; a `together` group has several paths. */
interface PlanAxis {
  paths: string[];
  /** values[path][i]: the i-th value of each path. */
  values: Record<string, unknown[]>;
  labels: Record<string, unknown[]>;
  length: number;
}

function listPlanAxes(config: ExperimentConfig): PlanAxis[] {
  const groups = [
    ...Object.entries(config.sweep.axes).map(([path, values]) => ({ [path]: values })),
    ...config.sweep.together,
  ];
  return groups.map((group) => {
    const paths = Object.keys(group);
    const labels = Object.fromEntries(paths.map((p) => [p, labelAxisValues(group[p] ?? [])]));
    return { paths, values: group, labels, length: group[paths[0] ?? '']?.length ?? 0 };
  });
}

/** Every combination of axis indices, the first axis varying slowest. */
function* iterateIndices(lengths: readonly number[]): Generator<number[]> {
  const index = lengths.map(() => 0);
  if (lengths.some((n) => n === 0)) return;
  for (;;) {
    yield [...index];
    let k = lengths.length - 1;
    while (k >= 0 && (index[k] = (index[k] ?? 0) + 1) === lengths[k]) index[k--] = 0;
    if (k < 0) return;
  }
}

/** The config of one combination: the file's values with each axis value written in. */
function applyCombination(
  config: ExperimentConfig,
  axes: PlanAxis[],
  combo: number[],
): ExperimentConfig {
  const out = structuredClone(config) as unknown as Record<string, unknown>;
  axes.forEach((axis, a) => {
    for (const path of axis.paths)
      writeAtPath(out, path.split('.'), axis.values[path]?.[combo[a] ?? 0]);
  });
  return out as unknown as ExperimentConfig;
}

/** The setting columns of a job: the axis paths that are inputs to it, with their labels. */
function describeSetting(
  axes: PlanAxis[],
  combo: number[],
  keep: (path: string) => boolean,
): Setting {
  const setting: Setting = {};
  axes.forEach((axis, a) => {
    if (!axis.paths.some(keep)) return;
    for (const path of axis.paths) setting[path] = axis.labels[path]?.[combo[a] ?? 0];
  });
  return setting;
}

/** What determines a train job's output, per METHOD_INPUTS; only this is hashed into its id. */
function trainInputs(
  method: MethodConfig,
  seed: number,
  cfg: ExperimentConfig,
  files: Record<string, string> | undefined,
): Record<string, unknown> {
  const uses = METHOD_INPUTS[method.name];
  const inputs: Record<string, unknown> = { kind: 'train', method: method.name, data: cfg.data };
  if (uses.path) inputs.path = method.path;
  if (files !== undefined) inputs.files = files;
  if (uses.seed) inputs.seed = seed;
  if (uses.dim) inputs.dim = cfg.dim;
  if (uses.trains) Object.assign(inputs, { encoder: cfg.encoder, train: cfg.train });
  return inputs;
}

/**
 * Expands a resolved config into its jobs: train jobs first, then evaluate jobs, each naming
 * its train job. Combinations run over the product of the axes (a `together` group is one
 * axis), then methods, then seeds. Jobs with equal ids are built once, so a baseline whose
 * output ignores an axis (pca and `train.discount`) or the seed gets one job, and an axis
 * over `eval.*` multiplies evaluate jobs only, reusing the trained encoders. A file a train
 * job reads enters its id by content (`digestOf`, SHA-256 from disk by default; input-files.ts).
 * Throws PlanTooLargeError above `run.maxJobs` (loadExperiment reports that first).
 */
export function expandPlan(
  config: ExperimentConfig,
  baseDir: string,
  digestOf: DigestOf = fileDigester(baseDir),
): JobSpec[] {
  assertPlanSize(config);
  const axes = listPlanAxes(config);
  const seeds = listSeeds(config.sweep.seeds);
  const trainJobs = new Map<string, TrainJobSpec>();
  const evalJobs = new Map<string, EvalJobSpec>();
  for (const combo of iterateIndices(axes.map((a) => a.length))) {
    const cfg = applyCombination(config, axes, combo);
    for (const method of config.methods) {
      const runSeeds = METHOD_INPUTS[method.name].seed ? seeds : seeds.slice(0, 1);
      for (const seed of runSeeds) {
        const paths = filesReadBy(method, cfg);
        const files =
          paths.length === 0 ? undefined : Object.fromEntries(paths.map((p) => [p, digestOf(p)]));
        const trainId = hashJob(trainInputs(method, seed, cfg, files));
        const trainSetting = describeSetting(axes, combo, (p) => isTrainInput(method.name, p));
        let train = trainJobs.get(trainId);
        if (!train) {
          train = {
            kind: 'train',
            id: trainId,
            experiment: config.name,
            setting: trainSetting,
            method,
            seed,
            data: cfg.data,
            encoder: cfg.encoder,
            dim: cfg.dim,
            train: cfg.train,
            baseDir,
            ...(files === undefined ? {} : { inputFiles: files }),
          };
          trainJobs.set(trainId, train);
        }
        const id = hashJob({ kind: 'evaluate', trainId, eval: cfg.eval });
        if (evalJobs.has(id)) continue;
        const setting = describeSetting(
          axes,
          combo,
          (p) => isTrainInput(method.name, p) || isEvalInput(p),
        );
        evalJobs.set(id, {
          kind: 'evaluate',
          id,
          trainId,
          experiment: config.name,
          setting,
          method,
          seed,
          train,
          eval: cfg.eval,
        });
      }
    }
  }
  return [...trainJobs.values(), ...evalJobs.values()];
}
