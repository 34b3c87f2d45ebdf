/**
 * Builds the evaluation context: encodes the episodes once, fits the transition models and
 * the state decoders, and computes the NMSE normaliser.
 */
import type { EvalConfig } from '../config/types.ts';
import type { Dataset, Episode } from '../data/episode.ts';
import type { Representation } from '../training/representation.ts';
import type { EncodedEpisode, EvalContext } from './context.ts';
import { buildStateDecoders } from './decoders.ts';
import { EvaluationError } from './evaluation-error.ts';
import { poolRows, traceCovariance } from './moments.ts';
import { buildSourceModels } from './transitions.ts';

export interface ContextSettings {
  config: EvalConfig;
  /** γ of the training config. */
  discount: number;
  /** Target variance c of the training config (the critic's c wins when present). */
  scale: number;
}

/** Encodes the test and training episodes and prepares everything the suites share. */
export function buildContext(
  representation: Representation,
  dataset: Dataset,
  settings: ContextSettings,
): EvalContext {
  const dim = representation.dim;
  const test = dataset.test.map((e, i) => encodeEpisode(representation, e, `test episode ${i}`));
  const train = dataset.train.map((e, i) => encodeEpisode(representation, e, `train episode ${i}`));
  const pooled = poolRows(
    test.map((e) => ({ data: e.codes, rows: e.steps })),
    dim,
  );
  const spread = traceCovariance(pooled.data, pooled.rows, dim);
  const { config, discount } = settings;
  const { models, notes } = buildSourceModels({
    representation,
    dataset,
    config,
    discount,
    train,
    test,
  });
  if (!(spread > 0)) notes.push('test encodings have no spread: every NMSE is undefined (NaN)');
  const decoders = buildStateDecoders(train, test, dim, dataset.stateDim, {
    ridge: config.ridge,
    seed: config.seed,
  });
  return {
    representation,
    dataset,
    config,
    dim,
    discount,
    scale: representation.critic?.c ?? settings.scale,
    test,
    train,
    spread,
    models,
    ...(decoders === undefined ? {} : { decoders }),
    notes,
  };
}

/** Encodes one episode, checking the shape the representation returns. */
export function encodeEpisode(
  rep: Representation,
  episode: Episode,
  where: string,
): EncodedEpisode {
  const codes = rep.encode(episode.obs, episode.steps);
  if (codes.length !== episode.steps * rep.dim) {
    throw new EvaluationError(
      'encode-shape',
      `${rep.method}.encode on ${where}: expected [${episode.steps}, ${rep.dim}] = ${episode.steps * rep.dim} values, got ${codes.length}`,
      'the encoder must return dim values per observation; retrain or fix the plugin',
    );
  }
  for (let i = 0; i < codes.length; i++) {
    if (!Number.isFinite(codes[i])) {
      throw new EvaluationError(
        'encode-non-finite',
        `${rep.method}.encode on ${where}: expected finite values, got ${codes[i]} at step ${Math.floor(i / rep.dim)}, dimension ${i % rep.dim}`,
        'the encoder diverged or the observations hold NaN; check the train job log',
      );
    }
  }
  const out: EncodedEpisode = { codes: Float64Array.from(codes), steps: episode.steps };
  if (episode.state !== undefined) out.state = episode.state;
  return out;
}
