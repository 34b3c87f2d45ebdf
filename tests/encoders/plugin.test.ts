import * as path from 'node:path';
import * as tf from '@tensorflow/tfjs';
import { beforeAll, describe, expect, it } from 'vitest';
import { buildEncoder } from '../../runner/encoders/index.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { encoderConfig } from '../training/fixtures.ts';
import { setupBackend } from '../training/tf-setup.ts';

const fixtures = path.resolve(import.meta.dirname, '../fixtures/plugins');

beforeAll(async () => {
  await setupBackend();
});

function build(plugin: string) {
  return buildEncoder(
    {
      config: encoderConfig({ kind: 'plugin', plugin }),
      obsDim: 6,
      dim: 3,
      seed: 1,
      baseDir: fixtures,
    },
    createRng(0),
  );
}

describe('plugin encoders', () => {
  it('loads a module relative to the experiment directory and trains its variables', async () => {
    const encoder = await build('./affine-encoder.js');
    expect(encoder.variables).toHaveLength(2);
    const shape = tf.tidy(() => encoder.apply(tf.ones([5, 6])).shape);
    expect(shape).toEqual([5, 3]);
    encoder.dispose();
  });

  const failures: [string, string][] = [
    ['./does-not-exist.js', 'plugin-not-found'],
    ['./fails-to-load.js', 'plugin-load-failed'],
    ['./no-factory.js', 'plugin-bad-export'],
    ['./throws-on-create.js', 'plugin-factory-failed'],
    ['./wrong-shape.js', 'plugin-bad-output'],
  ];
  for (const [file, code] of failures) {
    it(`reports ${code} for ${file}`, async () => {
      await expect(build(file)).rejects.toMatchObject({ code, where: 'encoder.plugin' });
    });
  }

  it('says what shape it expected and got', async () => {
    await expect(build('./wrong-shape.js')).rejects.toThrow(/expected .*\[2, 3\].*got \[2, 4\]/);
  });
});
