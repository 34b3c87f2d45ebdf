/**
 * The encoder interface: a TF.js forward function ψ over trainable variables. One file per
 * kind (linear.ts, mlp.ts, conv.ts, plugin.ts), gathered in the name → implementation map of
 * index.ts. The model is kept apart from the loop that trains it (STYLE.md §2).
 */
import type * as tf from '@tensorflow/tfjs';
import type { EncoderConfig } from '../config/types.ts';
import type { Rng } from '../numeric/random.ts';

/** What an encoder is built for. */
export interface EncoderContext {
  config: EncoderConfig;
  obsDim: number;
  /** Representation dimension d. */
  dim: number;
  /** [height, width] when observations are images (conv). */
  imageShape?: [number, number];
  /** Directory the experiment file lives in (plugins resolve from here). */
  baseDir?: string;
  /** Seed handed to plugin factories (built-in kinds draw from `rng`). */
  seed: number;
}

/** A built encoder. Tensors it creates inside `apply` belong to the caller's tidy scope. */
export interface TfEncoder {
  readonly kind: string;
  /** Trainable variables, in the parameter layout of runner/training/engine.ts for linear/MLP. */
  readonly variables: tf.Variable[];
  /** ψ: [n, obsDim] → [n, dim]. */
  apply(x: tf.Tensor2D): tf.Tensor2D;
  /** Frees the variables and any constants. */
  dispose(): void;
}

/** One encoder kind. `build` is async because plugins import a module. */
export interface EncoderDefinition {
  build(context: EncoderContext, rng: Rng): Promise<TfEncoder>;
}
