/**
 * The method map: name → fit. Adding a method is one file here and one entry below.
 * The autoencoder is imported when first fitted: it trains with TF.js, and loading TF.js
 * (≈ 2 s) should not tax the closed-form baselines or the native contrastive engine.
 */
import type { MethodName } from '../../config/types.ts';
import type { MethodFit } from '../method.ts';
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
  autoencoder: async (context) => (await import('./autoencoder.ts')).fitAutoencoder(context),
  precomputed: fitPrecomputed,
};
