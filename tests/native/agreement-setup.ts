/**
 * Shared setup of the native-vs-TF.js agreement tests: a small training problem (structured
 * pairs y = x M + noise, so the loss falls), the same initial parameters and the same batches
 * for both engines, and the loss curve each produces.
 */
import type { EncoderConfig, TrainConfig } from '../../runner/config/types.ts';
import { initDenseParams } from '../../runner/encoders/dense-layout.ts';
import { createRng } from '../../runner/numeric/random.ts';
import type { EngineOptions, StepEngine } from '../../runner/training/engine.ts';

/** One pair batch: x, y [batch, obsDim]. */
export interface Batch {
  x: Float32Array;
  y: Float32Array;
}

export const obsDim = 6;
export const dim = 4;
export const batchSize = 16;

/** Engine options for one combination (small sizes keep 300 TF.js steps fast). */
export function agreementOptions(
  encoder: Partial<EncoderConfig>,
  train: Partial<TrainConfig>,
): EngineOptions {
  return {
    encoder: {
      kind: 'mlp',
      widths: [12, 10],
      activation: 'relu',
      layerNorm: false,
      channels: [],
      options: {},
      ...encoder,
    },
    obsDim,
    dim,
    threads: 1,
    seed: 3,
    train: {
      steps: 300,
      batch: batchSize,
      lr: 3e-3,
      discount: 0.9,
      critic: 'distance',
      loss: 'symmetric',
      regulariser: 'penalty',
      weight: 0.5,
      scale: 1,
      clip: 1,
      logEvery: 100,
      engine: 'tfjs',
      ...train,
    },
  };
}

/** `count` batches of pairs y = x M + 0.3 ε from a fixed seed: [batch, obsDim] each. */
export function makeBatches(count: number, seed: number): Batch[] {
  const rng = createRng(seed);
  const mix = Float32Array.from(
    { length: obsDim * obsDim },
    () => rng.normal() / Math.sqrt(obsDim),
  );
  const batches: Batch[] = [];
  for (let b = 0; b < count; b++) {
    const x = Float32Array.from({ length: batchSize * obsDim }, () => rng.normal());
    const y = new Float32Array(x.length);
    for (let i = 0; i < batchSize; i++) {
      for (let j = 0; j < obsDim; j++) {
        let s = 0;
        for (let k = 0; k < obsDim; k++) s += x[i * obsDim + k]! * mix[k * obsDim + j]!;
        y[i * obsDim + j] = s + 0.3 * rng.normal();
      }
    }
    batches.push({ x, y });
  }
  return batches;
}

/** Initial parameters in the shared layout (runner/training/engine.ts). */
export function initialParams(options: EngineOptions, seed: number): Float32Array[] {
  return initDenseParams(options.encoder, obsDim, dim, options.train.critic, createRng(seed));
}

/** Loss (before each update) of every step. */
export function lossCurve(engine: StepEngine, params: Float32Array[], batches: Batch[]): number[] {
  engine.init(params);
  return batches.map((b) => engine.step(b.x, b.y, batchSize).loss);
}

/**
 * Largest relative gap between two loss curves, max_t |a_t − b_t| / (1 + |a_t|), and the
 * step where it occurs.
 */
export function curveGap(a: number[], b: number[]): { gap: number; step: number } {
  let gap = 0;
  let step = -1;
  a.forEach((v, t) => {
    const g = Math.abs(v - b[t]!) / (1 + Math.abs(v));
    if (!(g <= gap)) {
      gap = g;
      step = t;
    }
  });
  return { gap, step };
}

/**
 * Tolerance of the agreement tests, relative to 1 + |loss|, for smooth activations (tanh,
 * gelu, elu: continuous first derivative). Both engines compute in float32 (unit roundoff
 * 6e-8) but sum in different orders (blocked sgemm vs the wasm kernels, fused vs separate
 * reductions), so single-step losses differ by about 1e-7..1e-6 and Adam carries the
 * difference forward. Measured over 300 steps: at most 3e-5 over all 27 critic × loss ×
 * regulariser combinations (docs/native.md); 2e-4 leaves a ≈7× margin, while a 5 %
 * learning-rate error (the power test) moves the curve by more than this.
 */
export const curveTolerance = 2e-4;

/**
 * Tolerance for relu. Its derivative jumps at 0, so when float32 noise puts one
 * pre-activation on the other side of 0 in one engine, that sample's gradient through the
 * unit differs by O(1) and the curves part at the 1e-3 level (measured: up to 5e-3 over
 * 300 steps; with tanh in the same runs, 3e-5). The smooth-activation tests carry the precise
 * check; this one bounds relu curves at 2e-2.
 */
export const kinkedCurveTolerance = 2e-2;
