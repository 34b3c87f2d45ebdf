/** The encoder map: kind → implementation. Adding an encoder is one file and one entry here. */
import type { EncoderKind } from '../config/types.ts';
import type { Rng } from '../numeric/random.ts';
import { convEncoder } from './conv.ts';
import type { EncoderContext, EncoderDefinition, TfEncoder } from './encoder.ts';
import { linearEncoder } from './linear.ts';
import { mlpEncoder } from './mlp.ts';
import { pluginEncoder } from './plugin.ts';

/** Every built-in encoder kind. */
export const encoders: Record<EncoderKind, EncoderDefinition> = {
  linear: linearEncoder,
  mlp: mlpEncoder,
  conv: convEncoder,
  plugin: pluginEncoder,
};

/** Builds the encoder named by `context.config.kind`. */
export function buildEncoder(context: EncoderContext, rng: Rng): Promise<TfEncoder> {
  return encoders[context.config.kind].build(context, rng);
}
