/**
 * Native engine vs the TF.js reference engine (runner/training/tfjs-engine.ts), every
 * critic × loss direction × regulariser combination on a tanh MLP encoder: from the same
 * initial parameters and the same 300 batches, the loss curves agree within curveTolerance
 * (its justification is in agreement-setup.ts). The reference is an independent
 * implementation: TF.js ops and TF.js automatic differentiation.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { CriticKind, LossDirection, RegulariserKind } from '../../runner/config/types.ts';
import { createNativeEngine } from '../../runner/training/native-engine.ts';
import { createTfjsEngine } from '../../runner/training/tfjs-engine.ts';
import {
  agreementOptions,
  curveGap,
  curveTolerance,
  initialParams,
  lossCurve,
  makeBatches,
  type Batch,
} from './agreement-setup.ts';
import { nativeAddonForTests } from './native-required.ts';

const critics: CriticKind[] = ['distance', 'distance-identity', 'inner'];
const losses: LossDirection[] = ['forward', 'backward', 'symmetric'];
const regularisers: RegulariserKind[] = ['none', 'penalty', 'kl'];
const combos = critics.flatMap((critic) =>
  losses.flatMap((loss) => regularisers.map((regulariser) => ({ critic, loss, regulariser }))),
);

describe.skipIf(nativeAddonForTests() === undefined)('native vs TF.js: objectives', () => {
  let batches: Batch[] = [];
  beforeAll(() => {
    batches = makeBatches(300, 11);
  });

  it.each(combos)('$critic / $loss / $regulariser: 300-step loss curves agree', async (train) => {
    const options = agreementOptions({ kind: 'mlp', activation: 'tanh' }, train);
    const params = initialParams(options, 5);
    const reference = await createTfjsEngine(options);
    const native = await createNativeEngine(options);
    const expected = lossCurve(reference, params, batches);
    const actual = lossCurve(native, params, batches);
    reference.dispose();
    native.dispose();
    // The curve must actually move, or agreement would say little.
    expect(expected[0]! - expected[299]!).toBeGreaterThan(0.1);
    expect(curveGap(expected, actual).gap).toBeLessThan(curveTolerance);
  });

  it('has the power to see a 5 % learning-rate error', async () => {
    const options = agreementOptions({ kind: 'mlp', activation: 'tanh' }, {});
    const wrong = agreementOptions(
      { kind: 'mlp', activation: 'tanh' },
      { lr: options.train.lr * 1.05 },
    );
    const params = initialParams(options, 5);
    const reference = await createTfjsEngine(options);
    const native = await createNativeEngine(wrong);
    const gap = curveGap(lossCurve(reference, params, batches), lossCurve(native, params, batches));
    reference.dispose();
    native.dispose();
    expect(gap.gap).toBeGreaterThan(curveTolerance);
  });
});
