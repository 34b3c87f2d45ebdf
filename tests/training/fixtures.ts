/** Shared builders of small configs and specs for the training tests (plain data). */
import type {
  DataConfig,
  EncoderConfig,
  MethodConfig,
  TrainConfig,
} from '../../runner/config/types.ts';
import type { TrainJobSpec } from '../../runner/plan/job-spec.ts';
import type { FitHooks } from '../../runner/training/method.ts';
import { makeDataConfig } from '../data/make-data-config.ts';

/** A small linear-Gaussian data config (the greenhouse sensor array). */
export function smallData(overrides: Partial<DataConfig> = {}): DataConfig {
  return makeDataConfig({ seed: 1, episodes: 40, steps: 48, obsDim: 12, ...overrides });
}

/** Encoder config defaults as the schema resolves them, with overrides. */
export function encoderConfig(overrides: Partial<EncoderConfig> = {}): EncoderConfig {
  return {
    kind: 'mlp',
    widths: [32],
    activation: 'relu',
    layerNorm: false,
    channels: [4, 8],
    options: {},
    ...overrides,
  };
}

/** Train config defaults, small budget. */
export function trainConfig(overrides: Partial<TrainConfig> = {}): TrainConfig {
  return {
    steps: 50,
    batch: 32,
    lr: 0.003,
    discount: 0.8,
    critic: 'distance',
    loss: 'symmetric',
    regulariser: 'penalty',
    weight: 1,
    scale: 1,
    clip: 1,
    logEvery: 25,
    engine: 'tfjs',
    ...overrides,
  };
}

/** A train job spec around the pieces above. */
export function trainSpec(
  parts: {
    method?: MethodConfig;
    data?: DataConfig;
    encoder?: EncoderConfig;
    train?: TrainConfig;
    dim?: number;
    seed?: number;
    baseDir?: string;
  } = {},
): TrainJobSpec {
  return {
    kind: 'train',
    id: 'test',
    experiment: 'test',
    setting: {},
    method: parts.method ?? { name: 'contrastive', label: 'contrastive' },
    seed: parts.seed ?? 0,
    data: parts.data ?? smallData(),
    encoder: parts.encoder ?? encoderConfig(),
    dim: parts.dim ?? 4,
    train: parts.train ?? trainConfig(),
    baseDir: parts.baseDir ?? '.',
  };
}

/** Hooks that collect log lines. */
export function quietHooks(lines: string[] = []): FitHooks {
  return { log: (l) => lines.push(l), signal: new AbortController().signal, threads: 1 };
}
