/**
 * The training loop shared by every engine: batches from createRng, logging every
 * train.logEvery steps into a curve, divergence detection, cancellation. The engine does the
 * arithmetic (runner/training/engine.ts).
 */
import type { TrainConfig } from '../config/types.ts';
import type { Rng } from '../numeric/random.ts';
import type { StepEngine, StepStats } from './engine.ts';
import type { PairBatch, PairSampler } from './pair-sampler.ts';
import type { CurvePoint } from './representation.ts';
import { TrainingError } from './training-error.ts';

/** What the loop needs from its caller. */
export interface LoopHooks {
  log(line: string): void;
  signal: AbortSignal;
}

/** Outcome of a training run. */
export interface LoopResult {
  status: 'done' | 'diverged';
  /** Step, last finite loss and the term that blew up (diverged only). */
  reason?: string;
  curves: CurvePoint[];
  /** Optimiser steps taken (the diverging step excluded: its update is never applied). */
  steps: number;
  /** Steps per second of the loop itself (sampling + step), validation excluded. */
  stepsPerSecond: number;
  /** The last logged training and validation statistics. */
  final?: { train: StepStats; val: StepStats };
}

function describeBlowUp(stats: StepStats): string {
  if (!Number.isFinite(stats.infonce)) return `the InfoNCE term is ${stats.infonce}`;
  if (!Number.isFinite(stats.regulariser)) return `the regulariser term is ${stats.regulariser}`;
  return `the gradient norm is ${stats.gradNorm}`;
}

const yieldToEventLoop = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

/** Mean of a list of step statistics. */
function meanStats(list: StepStats[]): StepStats {
  const mean = (f: (s: StepStats) => number): number =>
    list.reduce((a, s) => a + f(s), 0) / Math.max(1, list.length);
  return {
    loss: mean((s) => s.loss),
    infonce: mean((s) => s.infonce),
    regulariser: mean((s) => s.regulariser),
    accuracy: mean((s) => s.accuracy),
    gradNorm: mean((s) => s.gradNorm),
  };
}

/**
 * Runs train.steps optimiser steps. The training loss of a curve point is the mean over the
 * steps since the previous point; the validation loss is measured on one fixed validation
 * batch (drawn once, so points are comparable).
 */
export async function runTrainingLoop(
  engine: StepEngine,
  train: TrainConfig,
  samplers: { train: PairSampler; val: PairSampler },
  rng: Rng,
  hooks: LoopHooks,
): Promise<LoopResult> {
  const batchRng = rng.fork('batches');
  const valBatch: PairBatch = samplers.val.sample(rng.fork('val'), train.batch);
  const curves: CurvePoint[] = [];
  let window: StepStats[] = [];
  let lastFinite = Number.NaN;
  let busy = 0;
  let final: LoopResult['final'];
  for (let step = 1; step <= train.steps; step++) {
    if (hooks.signal.aborted) {
      throw new TrainingError('training-aborted', `stopped at step ${step} of ${train.steps}`);
    }
    const started = performance.now();
    const batch = samplers.train.sample(batchRng, train.batch);
    const stats = engine.stepAsync
      ? await engine.stepAsync(batch.x, batch.y, batch.size)
      : engine.step(batch.x, batch.y, batch.size);
    busy += performance.now() - started;
    if (!Number.isFinite(stats.loss) || !Number.isFinite(stats.gradNorm)) {
      const reason = `step ${step}: ${describeBlowUp(stats)}; last finite loss ${lastFinite}`;
      hooks.log(`diverged at ${reason}`);
      return finish('diverged', curves, step - 1, busy, final, reason);
    }
    lastFinite = stats.loss;
    window.push(stats);
    if (step % train.logEvery === 0 || step === train.steps) {
      const trainStats = meanStats(window);
      const val = engine.evaluate(valBatch.x, valBatch.y, valBatch.size);
      window = [];
      final = { train: trainStats, val };
      curves.push({
        step,
        trainLoss: trainStats.loss,
        valLoss: val.loss,
        trainAccuracy: trainStats.accuracy,
        valAccuracy: val.accuracy,
      });
      hooks.log(
        `step ${step}/${train.steps} loss ${trainStats.loss.toFixed(4)} (nce ${trainStats.infonce.toFixed(4)}, reg ${trainStats.regulariser.toFixed(4)}) val ${val.loss.toFixed(4)} acc ${trainStats.accuracy.toFixed(3)}/${val.accuracy.toFixed(3)}`,
      );
      await yieldToEventLoop(); // lets an abort from the runner arrive
    }
  }
  return finish('done', curves, train.steps, busy, final);
}

function finish(
  status: LoopResult['status'],
  curves: CurvePoint[],
  steps: number,
  busyMs: number,
  final: LoopResult['final'],
  reason?: string,
): LoopResult {
  return {
    status,
    curves,
    steps,
    stepsPerSecond: rate(steps, busyMs),
    ...(reason === undefined ? {} : { reason }),
    ...(final === undefined ? {} : { final }),
  };
}

function rate(steps: number, ms: number): number {
  return ms > 0 ? (steps * 1000) / ms : 0;
}
