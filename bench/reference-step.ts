/**
 * The reference training step every speed comparison uses (issues 5 and 10): MLP
 * 64→256→256→16, batch 256, learned A in the distance critic, symmetric InfoNCE with the
 * penalty regulariser, Adam with clipping. One definition, so the TF.js, native and PyTorch
 * columns of the benches measure the same work.
 */
import type { TrainConfig, TrainEngine } from '../runner/config/types.ts';
import type { EngineOptions } from '../runner/training/engine.ts';

export const BATCH = 256;
export const OBS = 64;
export const WIDTHS = [256, 256];
export const DIM = 16;

/** The reference step's training settings, with the engine and logging interval asked for. */
export function referenceTrain(engine: TrainEngine, logEvery = 1_000_000): TrainConfig {
  return {
    steps: 0,
    batch: BATCH,
    lr: 1e-3,
    discount: 0.9,
    critic: 'distance',
    loss: 'symmetric',
    regulariser: 'penalty',
    weight: 1,
    scale: 1,
    clip: 1,
    logEvery,
    engine,
  };
}

/** Engine options of the reference step (one thread, seed 0). */
export function referenceOptions(train: TrainConfig): EngineOptions {
  return {
    encoder: {
      kind: 'mlp',
      widths: WIDTHS,
      activation: 'relu',
      layerNorm: false,
      channels: [],
      options: {},
    },
    obsDim: OBS,
    dim: DIM,
    threads: 1,
    seed: 0,
    train,
  };
}
