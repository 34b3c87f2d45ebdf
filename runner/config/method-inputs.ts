import type { MethodName } from './types.ts';

/**
 * Which parts of the resolved config determine what a method's train job produces. The
 * plan stage hashes only these into job ids, so a baseline that does not train keeps its id
 * (and its stored result) when only `train.*` or `encoder.*` change. `data` always matters.
 */
export interface MethodInputs {
  /** Uses `encoder.*` and `train.*` (it runs an optimiser). */
  trains: boolean;
  /** Uses the representation dimension `dim`. */
  dim: boolean;
  /** Depends on the training seed (random initialisation or sampling). */
  seed: boolean;
  /** Reads the method's own `path` (precomputed embeddings). */
  path: boolean;
}

export const METHOD_INPUTS: Record<MethodName, MethodInputs> = {
  contrastive: { trains: true, dim: true, seed: true, path: false },
  autoencoder: { trains: true, dim: true, seed: true, path: false },
  // Principal components: deterministic given the training observations.
  pca: { trains: false, dim: true, seed: false, path: false },
  // Slow feature analysis (Wiskott & Sejnowski, 2002): a generalised eigenproblem, deterministic.
  sfa: { trains: false, dim: true, seed: false, path: false },
  // A seeded random linear projection to `dim` dimensions.
  random: { trains: false, dim: true, seed: true, path: false },
  // The (standardised) observations themselves: no dimension, no seed.
  raw: { trains: false, dim: false, seed: false, path: false },
  precomputed: { trains: false, dim: false, seed: false, path: true },
};

/** True when the value at dotted `path` changes what `method`'s train job produces. */
export function isTrainInput(method: MethodName, path: string): boolean {
  const root = path.split('.')[0];
  const inputs = METHOD_INPUTS[method];
  if (root === 'data') return true;
  if (root === 'encoder' || root === 'train') return inputs.trains;
  if (root === 'dim') return inputs.dim;
  return false;
}

/** True when the value at dotted `path` only changes evaluation. */
export function isEvalInput(path: string): boolean {
  return path.split('.')[0] === 'eval';
}
