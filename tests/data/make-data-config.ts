import type { DataConfig } from '../../runner/config/types.ts';

/** A resolved DataConfig with the defaults documented in runner/config/types.ts. */
export function makeDataConfig(overrides: Partial<DataConfig> = {}): DataConfig {
  return {
    source: 'linear-gaussian',
    seed: 0,
    episodes: 200,
    steps: 64,
    obsDim: 32,
    noise: 0.05,
    stateDim: 4,
    map: 'linear',
    layout: 'open-hall',
    image: 16,
    dt: 0,
    split: { train: 0.7, val: 0.1, test: 0.2 },
    standardise: true,
    ...overrides,
  };
}
