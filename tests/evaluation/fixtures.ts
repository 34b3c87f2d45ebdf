/**
 * Test fixtures for evaluation: a linear-Gaussian chain observed directly (obs = state), a
 * representation that returns its input, and an evaluation job spec with small settings.
 */
import type { EvalConfig } from '../../runner/config/types.ts';
import type { Dataset, Episode } from '../../runner/data/episode.ts';
import {
  drawLinearSystem,
  simulateLinearSystem,
} from '../../runner/data/sources/linear-gaussian.ts';
import { identity } from '../../runner/numeric/matrix.ts';
import { createRng } from '../../runner/numeric/random.ts';
import type { EvalJobSpec, TrainJobSpec } from '../../runner/plan/job-spec.ts';
import type { Representation } from '../../runner/training/representation.ts';

/** Episodes of a stationary linear-Gaussian chain whose observation is the state itself. */
export function stateDataset(options: {
  stateDim: number;
  steps: number;
  train: number;
  test: number;
  seed: number;
}): Dataset {
  const rng = createRng(options.seed);
  const sys = drawLinearSystem(options.stateDim, rng.fork('system'));
  const sim = rng.fork('episodes');
  const episode = (): Episode => {
    const states = Float32Array.from(simulateLinearSystem(sys, options.steps, sim)); // [steps, n]
    return {
      obs: states,
      steps: options.steps,
      obsDim: options.stateDim,
      state: states,
      stateDim: options.stateDim,
    };
  };
  return {
    name: 'state-chain',
    description: 'linear-Gaussian chain observed without noise',
    obsDim: options.stateDim,
    stateDim: options.stateDim,
    train: Array.from({ length: options.train }, episode),
    val: [],
    test: Array.from({ length: options.test }, episode),
    model: { stateDim: options.stateDim, F: sys.F, Q: sys.Q, stationary: sys.P },
  };
}

/** ψ(x) = x, optionally with a critic A = aI and target variance c. */
export function identityRepresentation(
  dim: number,
  critic?: { a: number; c: number },
): Representation {
  const rep: Representation = {
    method: 'identity',
    dim,
    encode: (obs, count) => Float32Array.from(obs.subarray(0, count * dim)),
  };
  if (critic !== undefined) rep.critic = { A: identity(dim, critic.a), c: critic.c };
  return rep;
}

/** ψ(x) = x W for a fixed random W (a different "method" on the same data). */
export function linearRepresentation(obsDim: number, dim: number, seed: number): Representation {
  const rng = createRng(seed);
  const W = Float64Array.from({ length: obsDim * dim }, () => rng.normal());
  return {
    method: 'random-linear',
    dim,
    encode: (obs, count) => {
      const out = new Float32Array(count * dim);
      for (let i = 0; i < count; i++) {
        for (let j = 0; j < dim; j++) {
          let s = 0;
          for (let k = 0; k < obsDim; k++) s += obs[i * obsDim + k]! * W[k * dim + j]!;
          out[i * dim + j] = s;
        }
      }
      return out;
    },
  };
}

export function evalConfig(overrides: Partial<EvalConfig> = {}): EvalConfig {
  return {
    suites: ['forecast', 'bridge', 'calibration'],
    horizons: [1, 3],
    jumps: [1, 2],
    waypoints: [1, 3],
    transitions: ['critic', 'fitted', 'true'],
    fit: 'geometric',
    ridge: 0.001,
    queries: 200,
    subsample: 300,
    planning: { tasks: 12, budget: 3 },
    projection: 'pca',
    seed: 0,
    ...overrides,
  };
}

/** An evaluation spec around `config`; the train part only supplies γ, c and ids. */
export function evalSpec(config: EvalConfig, trainSeed = 0, method = 'contrastive'): EvalJobSpec {
  const train = {
    kind: 'train',
    id: `train-${method}-${trainSeed}`,
    experiment: 'greenhouse-test',
    setting: {},
    method: { name: 'contrastive', label: method },
    seed: trainSeed,
    data: {} as TrainJobSpec['data'],
    encoder: {} as TrainJobSpec['encoder'],
    dim: 3,
    train: { discount: 0.8, scale: 1 } as TrainJobSpec['train'],
    baseDir: '.',
  } satisfies TrainJobSpec;
  return {
    kind: 'evaluate',
    id: `eval-${method}-${trainSeed}`,
    trainId: train.id,
    experiment: 'greenhouse-test',
    setting: {},
    method: train.method,
    seed: trainSeed,
    train,
    eval: config,
  };
}
