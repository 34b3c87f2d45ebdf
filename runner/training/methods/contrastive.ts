/**
 * The contrastive method: temporal InfoNCE with a Gaussian-marginal regulariser (MATH.md §1),
 * trained by the engine train.engine selects (runner/training/engine.ts). TF.js is loaded
 * only when the tfjs engine runs (engines.ts, tfBackendInfo), never for the native engine.
 */
import { initDenseParams } from '../../encoders/dense-layout.ts';
import { createRng } from '../../numeric/random.ts';
import {
  createEngine,
  nativeEncoderKinds,
  type EngineOptions,
  type StepEngine,
} from '../engine.ts';
import { loadEngines } from '../engines.ts';
import type { FitResult, MethodContext, MethodFit } from '../method.ts';
import { PairSampler } from '../pair-sampler.ts';
import { restoreRepresentation, type SerialisedRepresentation } from '../serialised.ts';
import { runTrainingLoop } from '../train-loop.ts';
import { TrainingError } from '../training-error.ts';

/** Engine options of a train job. */
export function engineOptions(context: MethodContext): EngineOptions {
  const { dataset, spec, hooks } = context;
  return {
    encoder: spec.encoder,
    obsDim: dataset.obsDim,
    dim: spec.dim,
    train: spec.train,
    threads: hooks.threads,
    baseDir: spec.baseDir,
    seed: spec.seed,
    ...(dataset.imageShape === undefined ? {} : { imageShape: dataset.imageShape }),
  };
}

async function openEngine(context: MethodContext, options: EngineOptions): Promise<StepEngine> {
  await loadEngines();
  try {
    return await createEngine(context.spec.train.engine, options, (line) =>
      context.hooks.log(line),
    );
  } catch (error) {
    if (error instanceof TrainingError) throw error;
    throw new TrainingError('engine-unavailable', (error as Error).message, 'train.engine');
  }
}

/** The serialised form of trained parameters (encoder variables, then A when learned). */
export function serialiseTrained(
  context: MethodContext,
  options: EngineOptions,
  params: Float32Array[],
): SerialisedRepresentation {
  const { spec, method } = context;
  const learnedA = spec.train.critic !== 'distance-identity';
  const encoderParams = learnedA ? params.slice(0, -1) : params;
  const arrays: SerialisedRepresentation['arrays'] = {};
  encoderParams.forEach((p, i) => (arrays[`p${i}`] = { shape: [p.length], data: p }));
  if (learnedA) arrays.A = { shape: [spec.dim, spec.dim], data: params[params.length - 1]! };
  return {
    method: method.name,
    label: method.label,
    dim: spec.dim,
    obsDim: options.obsDim,
    model: {
      kind: 'encoder',
      encoder: spec.encoder,
      seed: spec.seed,
      baseDir: spec.baseDir,
      ...(options.imageShape === undefined ? {} : { imageShape: options.imageShape }),
    },
    arrays,
    critic: { kind: spec.train.critic, c: spec.train.scale },
    meta: { train: spec.train },
  };
}

/** The TF.js backend of a tfjs engine (already selected by it), for the result's info. */
async function tfBackendInfo(engine: StepEngine): Promise<Record<string, unknown>> {
  if (engine.name !== 'tfjs') return {};
  const { selectBackend } = await import('../../encoders/backend.ts');
  const backend = await selectBackend();
  return { tfBackend: backend.name, simd: backend.simd };
}

/** The 'contrastive' method. */
export const fitContrastive: MethodFit = async (context): Promise<FitResult> => {
  const { dataset, spec, hooks } = context;
  const options = engineOptions(context);
  const engine = await openEngine(context, options);
  try {
    if (nativeEncoderKinds.includes(spec.encoder.kind)) {
      engine.init(
        initDenseParams(
          spec.encoder,
          dataset.obsDim,
          spec.dim,
          spec.train.critic,
          createRng(spec.seed).fork('init'),
        ),
      );
    }
    const train = new PairSampler(dataset.train, spec.train.discount, 'data (training episodes)');
    const val = dataset.val.some((e) => e.steps > 1)
      ? new PairSampler(dataset.val, spec.train.discount)
      : train;
    if (val === train)
      hooks.log('no validation episode with 2+ steps: validation curve uses training episodes');
    const loop = await runTrainingLoop(
      engine,
      spec.train,
      { train, val },
      createRng(spec.seed).fork('training'),
      hooks,
    );
    const serialised = serialiseTrained(context, options, engine.getParams());
    return {
      status: loop.status,
      ...(loop.reason === undefined ? {} : { reason: loop.reason }),
      representation: await restoreRepresentation(serialised),
      curves: loop.curves,
      info: {
        ...(await tfBackendInfo(engine)),
        engine: engine.name,
        kernel: engine.kernel ?? engine.name,
        threads: engine.threads,
        steps: loop.steps,
        stepsPerSecond: loop.stepsPerSecond,
        ...(loop.final === undefined ? {} : { final: loop.final }),
      },
      serialised,
    };
  } finally {
    engine.dispose();
  }
};
