/**
 * Native engine vs the TF.js reference engine across encoder variants: linear, and MLPs with
 * every activation, with and without layer norm, each under a different critic / loss /
 * regulariser so every option meets a second one. Same initial parameters and batches; loss
 * curves over 300 steps agree within the tolerances justified in agreement-setup.ts.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { EncoderConfig, TrainConfig } from '../../runner/config/types.ts';
import { createNativeEngine } from '../../runner/training/native-engine.ts';
import { createTfjsEngine } from '../../runner/training/tfjs-engine.ts';
import {
  agreementOptions,
  curveGap,
  curveTolerance,
  initialParams,
  kinkedCurveTolerance,
  lossCurve,
  makeBatches,
  type Batch,
} from './agreement-setup.ts';
import { nativeAddonForTests } from './native-required.ts';

interface Variant {
  name: string;
  encoder: Partial<EncoderConfig>;
  train: Partial<TrainConfig>;
}

const variants: Variant[] = [
  { name: 'linear, distance, kl', encoder: { kind: 'linear' }, train: { regulariser: 'kl' } },
  {
    name: 'linear, inner, penalty',
    encoder: { kind: 'linear' },
    train: { critic: 'inner', loss: 'forward' },
  },
  {
    name: 'tanh + layer norm',
    encoder: { activation: 'tanh', layerNorm: true },
    train: { critic: 'inner', regulariser: 'kl' },
  },
  { name: 'gelu', encoder: { activation: 'gelu' }, train: { loss: 'backward' } },
  {
    name: 'gelu + layer norm',
    encoder: { activation: 'gelu', layerNorm: true },
    train: { critic: 'distance-identity' },
  },
  {
    name: 'elu',
    encoder: { activation: 'elu' },
    train: { critic: 'inner', loss: 'backward', regulariser: 'none' },
  },
  {
    name: 'elu + layer norm',
    encoder: { activation: 'elu', layerNorm: true },
    train: { loss: 'forward', regulariser: 'kl' },
  },
  { name: 'relu', encoder: { activation: 'relu' }, train: {} },
  {
    name: 'relu + layer norm',
    encoder: { activation: 'relu', layerNorm: true },
    train: { critic: 'inner', regulariser: 'kl' },
  },
];

describe.skipIf(nativeAddonForTests() === undefined)('native vs TF.js: encoders', () => {
  let batches: Batch[] = [];
  beforeAll(() => {
    batches = makeBatches(300, 12);
  });

  it.each(variants)('$name: 300-step loss curves agree', async ({ encoder, train }) => {
    const options = agreementOptions(encoder, train);
    const params = initialParams(options, 6);
    const reference = await createTfjsEngine(options);
    const native = await createNativeEngine(options);
    const expected = lossCurve(reference, params, batches);
    const actual = lossCurve(native, params, batches);
    reference.dispose();
    native.dispose();
    expect(expected[0]! - expected[299]!).toBeGreaterThan(0.1);
    const kinked = options.encoder.kind === 'mlp' && options.encoder.activation === 'relu';
    expect(curveGap(expected, actual).gap).toBeLessThan(
      kinked ? kinkedCurveTolerance : curveTolerance,
    );
  });
});
