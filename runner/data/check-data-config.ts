/**
 * Range checks of the data options a source relies on. The config stage validates the YAML
 * against its schema; these checks guard callers that build a DataConfig in code.
 */
import type { DataConfig } from '../config/types.ts';
import { DataError } from './data-error.ts';

/** Throws 'bad-config' naming the option when a value is out of range for config.source. */
export function checkDataConfig(config: DataConfig): void {
  const fail = (key: string, expected: string, got: unknown): never => {
    throw new DataError({
      code: 'bad-config',
      index: `data.${key}`,
      message: `expected data.${key} ${expected}, got ${JSON.stringify(got)}`,
      hint: `change data.${key} in the experiment file`,
    });
  };
  const int = (
    key: 'episodes' | 'steps' | 'obsDim' | 'stateDim' | 'image',
    min: number,
    max = Infinity,
  ): void => {
    const v = config[key];
    if (!Number.isInteger(v) || v < min || v > max) fail(key, `an integer in ${min}..${max}`, v);
  };
  if (!Number.isFinite(config.seed)) fail('seed', 'a finite integer', config.seed);
  const { train, val, test } = config.split;
  if ([train, val, test].some((f) => !(f >= 0)) || Math.abs(train + val + test - 1) > 1e-6) {
    fail('split', 'fractions ≥ 0 that sum to 1', config.split);
  }
  if (!(config.noise >= 0)) fail('noise', '≥ 0', config.noise);
  if (!(config.dt >= 0)) fail('dt', '≥ 0 (0 = the source default)', config.dt);
  if (config.source === 'file') {
    if (!config.file) fail('file', 'a block with at least `path` for source file', config.file);
    return;
  }
  if (config.source === 'seattle-weather') {
    int('steps', 2, 1461);
    return;
  }
  int('episodes', 1, 1_000_000);
  int('steps', 2, 1_000_000);
  if (config.source === 'swinging-lamp') int('image', 8, 64);
  else int('obsDim', 1, 4096);
  if (config.source === 'linear-gaussian') int('stateDim', 1, 256);
}
