/** Linear encoder ψ(x) = x W + b: the dense stack with no hidden layer. */
import type { EncoderDefinition } from './encoder.ts';
import { buildDenseEncoder } from './mlp.ts';

/** The 'linear' entry of the encoder map (hidden widths are ignored). */
export const linearEncoder: EncoderDefinition = {
  build: (context, rng) =>
    Promise.resolve(
      buildDenseEncoder({ ...context, config: { ...context.config, kind: 'linear' } }, rng),
    ),
};
