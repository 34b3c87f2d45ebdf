import * as tf from '@tensorflow/tfjs';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildEncoder } from '../../runner/encoders/index.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { encoderConfig } from '../training/fixtures.ts';
import { setupBackend } from '../training/tf-setup.ts';

beforeAll(async () => {
  await setupBackend();
});

describe('conv encoder', () => {
  it('equals tf.conv2d (3×3, stride 2, zero padding 1) followed by ReLU and a dense map', async () => {
    // Oracle: TF.js's own conv2d forward kernel with explicit padding 1, an independent
    // implementation of the same convolution (Dumoulin & Visin, 2016, §2.4, relation 6).
    const [h, w] = [7, 6];
    const encoder = await buildEncoder(
      {
        config: encoderConfig({ kind: 'conv', channels: [2, 3] }),
        obsDim: h * w,
        dim: 4,
        imageShape: [h, w],
        seed: 0,
      },
      createRng(3),
    );
    const rng = createRng(9);
    const x = tf.tensor2d(
      Array.from({ length: 5 * h * w }, () => rng.normal()),
      [5, h * w],
    );
    const [k1, c1, k2, c2, wd, bd] = encoder.variables;
    const expected = tf.tidy(() => {
      let t: tf.Tensor4D = tf.reshape(x, [5, h, w, 1]);
      t = tf.relu(tf.add(tf.conv2d(t, tf.reshape(k1!, [3, 3, 1, 2]), 2, 1), c1!)) as tf.Tensor4D;
      t = tf.relu(tf.add(tf.conv2d(t, tf.reshape(k2!, [3, 3, 2, 3]), 2, 1), c2!)) as tf.Tensor4D;
      return tf.add(tf.matMul(tf.reshape(t, [5, -1]), wd!), bd!).arraySync() as number[][];
    });
    const got = tf.tidy(() => encoder.apply(x).arraySync());
    got.forEach((row, i) => row.forEach((v, j) => expect(v).toBeCloseTo(expected[i]![j]!, 4)));
    expect(wd!.shape).toEqual([2 * 2 * 3, 4]); // 7×6 → 4×3 → 2×2 positions, 3 channels
    x.dispose();
    encoder.dispose();
  });

  it('trains on the wasm backend (gradients flow through every parameter)', async () => {
    const encoder = await buildEncoder(
      {
        config: encoderConfig({ kind: 'conv', channels: [2] }),
        obsDim: 16,
        dim: 2,
        imageShape: [4, 4],
        seed: 0,
      },
      createRng(1),
    );
    const x = tf.randomNormal<tf.Rank.R2>([3, 16], 0, 1, 'float32', 2);
    const { grads } = tf.variableGrads(
      () => tf.sum(tf.square(encoder.apply(x))),
      encoder.variables,
    );
    for (const v of encoder.variables)
      expect(tf.sum(tf.abs(grads[v.name]!)).dataSync()[0]).toBeGreaterThan(0);
    tf.dispose([x, ...Object.values(grads)]);
    encoder.dispose();
  });

  it('refuses a dataset without images, with a code', async () => {
    await expect(
      buildEncoder(
        { config: encoderConfig({ kind: 'conv' }), obsDim: 10, dim: 2, seed: 0 },
        createRng(0),
      ),
    ).rejects.toMatchObject({ code: 'encoder-needs-images' });
  });
});
