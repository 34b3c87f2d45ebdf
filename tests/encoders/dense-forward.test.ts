/**
 * The plain Float32Array forward pass of linear/MLP encoders (runner/encoders/dense-forward.ts)
 * against the TF.js encoder, the reference: the same saved parameters reloaded both ways
 * must encode the same rows within float32 rounding.
 *
 * Tolerance: both sides compute in (at least) float32 from float32 parameters; a dot product
 * of K terms in float32 has a relative error bound of about K·u with u = 2⁻²⁴ ≈ 6e-8 (Higham,
 * Accuracy and Stability of Numerical Algorithms, 2002, §3.1), i.e. ≈ 2e-6 for K = 32 per
 * layer, compounded over three layers and a layer norm. Observed: ≤ 6e-7 over the cases
 * below; allowed: 5e-6 · (1 + |ψ|). An error in the layout or an activation (e.g. a swapped
 * gain and shift) is O(0.1).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import type { EncoderConfig } from '../../runner/config/types.ts';
import { createDenseForward } from '../../runner/encoders/dense-forward.ts';
import { initDenseParams } from '../../runner/encoders/dense-layout.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { restoreRepresentation } from '../../runner/training/serialised.ts';
import { restoreTfEncoder } from '../../runner/training/tf-restore.ts';
import { encoderConfig } from '../training/fixtures.ts';
import { setupBackend } from '../training/tf-setup.ts';

const OBS = 7;
const DIM = 3;
const ROWS = 50;

/** Random parameters in the engine layout, with non-trivial biases, gains and shifts. */
function randomParams(config: EncoderConfig, seed: number): Float32Array[] {
  const rng = createRng(seed);
  const params = initDenseParams(config, OBS, DIM, 'distance-identity', rng.fork('init'));
  const jitter = rng.fork('jitter');
  // Perturb every array (zeros and ones too), so biases and layer-norm gains matter.
  return params.map((p) => p.map((v) => v + 0.3 * (2 * jitter.next() - 1)));
}

function randomRows(seed: number): Float32Array {
  const rng = createRng(seed);
  return Float32Array.from({ length: ROWS * OBS }, () => 2 * rng.normal());
}

function maxScaledGap(a: Float32Array, ref: Float32Array): number {
  let worst = 0;
  for (let i = 0; i < ref.length; i++)
    worst = Math.max(worst, Math.abs(a[i]! - ref[i]!) / (1 + Math.abs(ref[i]!)));
  return worst;
}

const cases: [string, EncoderConfig][] = [
  ['linear', encoderConfig({ kind: 'linear', widths: [] })],
  ...(['relu', 'tanh', 'gelu', 'elu'] as const).flatMap((activation): [string, EncoderConfig][] =>
    [false, true].map((layerNorm) => [
      `mlp ${activation}${layerNorm ? ' + layer norm' : ''}`,
      encoderConfig({ widths: [32, 16], activation, layerNorm }),
    ]),
  ),
];

describe('dense forward pass (no TF.js) against the TF.js encoder', () => {
  beforeAll(async () => {
    await setupBackend();
  });

  it.each(cases)('%s agrees within float32 rounding', async (_name, config) => {
    const params = randomParams(config, 11);
    const rows = randomRows(12);
    const reference = (
      await restoreTfEncoder({
        encoder: config,
        obsDim: OBS,
        dim: DIM,
        seed: 0,
        variables: params,
        label: 'test',
      })
    )(rows, ROWS);
    const plain = createDenseForward(config, OBS, DIM, params)(rows, ROWS);
    expect(plain.length).toBe(ROWS * DIM);
    expect(maxScaledGap(plain, reference)).toBeLessThan(5e-6);
    // Power check: the outputs are far from trivial, so the agreement above means something.
    expect(Math.max(...Array.from(reference, Math.abs))).toBeGreaterThan(0.1);
  });

  it('rejects arrays that do not fit the layout, naming the parameter', () => {
    const config = encoderConfig({ widths: [4] });
    const params = randomParams(config, 1);
    expect(() => createDenseForward(config, OBS, DIM, params.slice(1))).toThrow(
      /expected 4 parameter arrays/,
    );
    params[2] = new Float32Array(5);
    expect(() => createDenseForward(config, OBS, DIM, params)).toThrow(/parameter W2: expected 12/);
  });

  it('a saved MLP representation with a mismatched layout is a representation-file error', async () => {
    const config = encoderConfig({ widths: [4] });
    const params = randomParams(config, 2);
    const arrays = Object.fromEntries(
      params.slice(0, 3).map((p, i) => [`p${i}`, { shape: [p.length], data: p }]),
    );
    await expect(
      restoreRepresentation({
        method: 'contrastive',
        label: 'contrastive',
        dim: DIM,
        obsDim: OBS,
        model: { kind: 'encoder', encoder: config, seed: 0 },
        arrays,
        meta: {},
      }),
    ).rejects.toMatchObject({ code: 'representation-file' });
  });
});
