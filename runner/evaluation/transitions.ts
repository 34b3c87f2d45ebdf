/**
 * The transition models a representation is evaluated with, one per requested source
 * (MATH.md §2): critic-derived (F = mA, Q = mI; one transition = one jump), fitted by least
 * squares on training pairs (one step or one jump, as eval.fit says), and the dataset's true
 * model when the representation is an affine function of the true state. A source that does
 * not apply is skipped with a note.
 */
import type { EvalConfig } from '../config/types.ts';
import type { Dataset } from '../data/episode.ts';
import { criticTransition, fitTransition } from '../inference/index.ts';
import type { Representation } from '../training/representation.ts';
import type { EncodedEpisode, SourceModel } from './context.ts';
import { alignTrueModel } from './state-alignment.ts';
import { taskRng } from './tasks.ts';

export interface SourceModelInput {
  representation: Representation;
  dataset: Dataset;
  config: EvalConfig;
  discount: number;
  train: readonly EncodedEpisode[];
  test: readonly EncodedEpisode[];
}

/** Builds the models of `config.transitions`, in that order, with notes for skipped ones. */
export function buildSourceModels(input: SourceModelInput): {
  models: SourceModel[];
  notes: string[];
} {
  const { representation: rep, config } = input;
  const models: SourceModel[] = [];
  const notes: string[] = [];
  for (const source of config.transitions) {
    switch (source) {
      case 'critic':
        if (rep.critic === undefined)
          notes.push(`critic: skipped, ${rep.method} has no distance critic`);
        else
          models.push({
            source,
            unit: 'jump',
            model: criticTransition(rep.critic.A, rep.critic.c),
          });
        break;
      case 'fitted': {
        const model = fitOnTraining(input);
        if (model === null) notes.push('fitted: skipped, fewer than 2 training pairs');
        else models.push(model);
        break;
      }
      case 'true': {
        if (input.dataset.model === undefined) {
          notes.push(`true: skipped, ${input.dataset.name} has no known model`);
          break;
        }
        const aligned = alignTrueModel(input.dataset.model, input.test, rep.dim);
        if ('reason' in aligned) notes.push(`true: skipped, ${aligned.reason}`);
        else models.push({ source, unit: 'step', model: aligned.model });
        break;
      }
    }
  }
  for (const m of models) for (const note of m.model.notes) notes.push(`${m.source}: ${note}`);
  return { models, notes };
}

/** Least-squares transition on consecutive or geometric pairs of training encodings. */
function fitOnTraining(input: SourceModelInput): SourceModel | null {
  const { config, discount, train } = input;
  const dim = input.representation.dim;
  const unit = config.fit === 'consecutive' ? 'step' : 'jump';
  const rng = taskRng(config.seed, `fit:${config.fit}:g${discount}`);
  const from: number[] = [];
  const to: number[] = [];
  for (const e of train) {
    for (let t = 0; t + 1 < e.steps; t++) {
      // Geometric offset truncated to the episode: inversion of the conditional law, which is
      // the same as redrawing until it fits (MATH.md §1), in one draw.
      const room = e.steps - 1 - t;
      const u = rng.next() * (1 - discount ** room);
      const k =
        unit === 'step'
          ? 1
          : Math.min(room, Math.max(1, Math.ceil(Math.log1p(-u) / Math.log(discount))));
      for (let j = 0; j < dim; j++) {
        from.push(e.codes[t * dim + j]!);
        to.push(e.codes[(t + k) * dim + j]!);
      }
    }
  }
  const count = from.length / dim;
  if (count < 2) return null;
  const model = fitTransition(from, to, count, dim, {
    ridge: config.ridge,
    centre: true,
    source: 'fitted',
  });
  return { source: 'fitted', unit, model };
}
