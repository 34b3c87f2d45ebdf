/**
 * Splits episodes into train / validation / test by whole episodes (no episode is shared
 * between splits), shuffled by the given stream so the split depends only on the seed.
 */
import type { Rng } from '../numeric/random.ts';
import { DataError } from './data-error.ts';

/** Split fractions as in DataConfig.split. */
export interface SplitFractions {
  train: number;
  val: number;
  test: number;
}

/** Episode indices of each split, each in increasing order. */
export interface SplitIndices {
  train: number[];
  val: number[];
  test: number[];
}

/**
 * Shuffles 0..count-1 (Fisher–Yates; Knuth, TAOCP vol. 2, Algorithm P) and cuts it by the
 * fractions: train gets round(train·count), val round(val·count), test the rest. Every
 * split with a positive fraction must get at least one episode, else 'too-few-episodes'.
 */
export function splitEpisodes(
  count: number,
  fractions: SplitFractions,
  rng: Rng,
  file?: string,
): SplitIndices {
  const order = Array.from({ length: count }, (_, i) => i);
  for (let i = count - 1; i > 0; i--) {
    const j = rng.int(i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  const nTrain = Math.round(fractions.train * count);
  const nVal = Math.min(Math.round(fractions.val * count), count - nTrain);
  const sizes = { train: nTrain, val: nVal, test: count - nTrain - nVal };
  const needed = (['train', 'val', 'test'] as const).filter((k) => fractions[k] > 0);
  const empty = needed.filter((k) => sizes[k] < 1);
  if (empty.length > 0) {
    const minimum = Math.max(...needed.map((k) => Math.ceil(0.5 / fractions[k])));
    throw new DataError({
      code: 'too-few-episodes',
      ...(file !== undefined ? { file } : {}),
      index: `split ${empty.join(', ')}`,
      message: `expected at least one episode in every split (${needed.join(' / ')}), got ${count} episode${count === 1 ? '' : 's'} leaving ${empty.join(' and ')} empty`,
      hint: `provide at least ${Math.max(minimum, needed.length)} episodes, or set a split fraction to 0 (data.split)`,
    });
  }
  const sorted = (xs: number[]): number[] => xs.sort((a, b) => a - b);
  return {
    train: sorted(order.slice(0, nTrain)),
    val: sorted(order.slice(nTrain, nTrain + nVal)),
    test: sorted(order.slice(nTrain + nVal)),
  };
}
