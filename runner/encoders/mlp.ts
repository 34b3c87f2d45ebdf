/**
 * Multilayer perceptron encoder: hidden layers h = act(LN(x W + b)) (layer norm optional),
 * affine output of width d. Parameters follow the layout of runner/training/engine.ts.
 */
import type * as tf from '@tensorflow/tfjs';
import type { Rng } from '../numeric/random.ts';
import { denseLayout, initParam } from './dense-layout.ts';
import type { EncoderContext, EncoderDefinition, TfEncoder } from './encoder.ts';
import { activate, dense, layerNorm, toVariables } from './layers.ts';

/** Builds the dense stack (MLP, or linear when `config.kind` is 'linear'). */
export function buildDenseEncoder(context: EncoderContext, rng: Rng): TfEncoder {
  const { config, obsDim, dim } = context;
  const specs = denseLayout(config, obsDim, dim);
  const variables = toVariables(
    specs.map((s) => initParam(s, rng)),
    specs.map((s) => s.shape),
  );
  const hasNorm = config.kind === 'mlp' && config.layerNorm;
  const perLayer = hasNorm ? 4 : 2;
  const hidden = config.kind === 'linear' ? 0 : config.widths.length;
  const apply = (x: tf.Tensor2D): tf.Tensor2D => {
    let h = x;
    for (let l = 0; l < hidden; l++) {
      const at = l * perLayer;
      h = dense(h, variables[at]!, variables[at + 1]!);
      if (hasNorm) h = layerNorm(h, variables[at + 2]!, variables[at + 3]!);
      h = activate(h, config.activation);
    }
    const at = hidden * perLayer;
    return dense(h, variables[at]!, variables[at + 1]!);
  };
  return {
    kind: config.kind,
    variables,
    apply,
    dispose: () => variables.forEach((v) => v.dispose()),
  };
}

/** The 'mlp' entry of the encoder map. */
export const mlpEncoder: EncoderDefinition = {
  build: (context, rng) => Promise.resolve(buildDenseEncoder(context, rng)),
};
