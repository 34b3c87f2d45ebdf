/**
 * Multilayer perceptron encoder: hidden layers h = act(LN(x W + b)) (layer norm optional),
 * affine output of width d. Parameters follow the layout of runner/training/engine.ts.
 */
import type * as tf from '@tensorflow/tfjs';
import type { Rng } from '../numeric/random.ts';
import { denseLayout, initParam } from './dense-layout.ts';
import type { EncoderContext, EncoderDefinition, TfEncoder } from './encoder.ts';
import { activate, dense, denseLayer, layerNorm, toVariables } from './layers.ts';

/**
 * Builds the dense stack (MLP, or linear when `config.kind` is 'linear'). `inputIsData`
 * false keeps the input gradient of the first layer (a decoder fed by an encoder needs it).
 */
export function buildDenseEncoder(
  context: EncoderContext,
  rng: Rng,
  inputIsData = true,
): TfEncoder {
  const { config, obsDim, dim } = context;
  const specs = denseLayout(config, obsDim, dim);
  const variables = toVariables(
    specs.map((s) => initParam(s, rng)),
    specs.map((s) => s.shape),
  );
  const hasNorm = config.kind === 'mlp' && config.layerNorm;
  const perLayer = hasNorm ? 4 : 2;
  const hidden = config.kind === 'linear' ? 0 : config.widths.length;
  // ReLU without layer norm folds into the fused dense op (layers.ts), the fast path.
  const fuseRelu = !hasNorm && config.activation === 'relu';
  const apply = (x: tf.Tensor2D): tf.Tensor2D => {
    let h = x;
    for (let l = 0; l < hidden; l++) {
      const at = l * perLayer;
      if (fuseRelu) {
        h = denseLayer(h, variables[at]!, variables[at + 1]!, 'relu', inputIsData && l === 0);
        continue;
      }
      h = dense(h, variables[at]!, variables[at + 1]!);
      if (hasNorm) h = layerNorm(h, variables[at + 2]!, variables[at + 3]!);
      h = activate(h, config.activation);
    }
    const at = hidden * perLayer;
    return denseLayer(h, variables[at]!, variables[at + 1]!, 'linear', inputIsData && hidden === 0);
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
