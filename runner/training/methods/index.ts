/** The method map: name → fit. Adding a method is one file here and one entry below. */
import type { MethodName } from '../../config/types.ts';
import type { MethodFit } from '../method.ts';
import { fitAutoencoder } from './autoencoder.ts';
import { fitContrastive } from './contrastive.ts';
import { fitPca } from './pca.ts';
import { fitPrecomputed } from './precomputed.ts';
import { fitRandom } from './random.ts';
import { fitRaw } from './raw.ts';
import { fitSfa } from './sfa.ts';

/** Every method a config can list. */
export const methods: Record<MethodName, MethodFit> = {
  contrastive: fitContrastive,
  pca: fitPca,
  random: fitRandom,
  raw: fitRaw,
  sfa: fitSfa,
  autoencoder: fitAutoencoder,
  precomputed: fitPrecomputed,
};
