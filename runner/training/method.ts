/**
 * The method interface: every row of a comparison table (the contrastive encoder and each
 * baseline) is fitted through it and hands evaluation a Representation. One file per method
 * under runner/training/methods/, gathered in methods/index.ts.
 */
import type { MethodConfig } from '../config/types.ts';
import type { Dataset } from '../data/episode.ts';
import type { TrainJobSpec } from '../plan/job-spec.ts';
import type { CurvePoint, Representation } from './representation.ts';
import type { SerialisedRepresentation } from './serialised.ts';

/** What the caller (a worker) provides. */
export interface FitHooks {
  log(line: string): void;
  signal: AbortSignal;
  threads: number;
  /**
   * Reads a user file (absolute path). Only the 'precomputed' method needs it; the core stays
   * free of file-system code, so the job handler passes this in.
   */
  readFile?: (path: string) => Promise<Uint8Array>;
}

/** A fitted method. */
export interface FitResult {
  status: 'done' | 'diverged';
  /** Diverged only: step, last finite loss and the term that blew up. */
  reason?: string;
  representation: Representation;
  curves: CurvePoint[];
  /** backend, engine, threads, stepsPerSecond, final losses, anything worth recording. */
  info: Record<string, unknown>;
  serialised: SerialisedRepresentation;
}

/** Everything a method's fit receives. */
export interface MethodContext {
  method: MethodConfig;
  dataset: Dataset;
  spec: TrainJobSpec;
  hooks: FitHooks;
}

/** One method. */
export type MethodFit = (context: MethodContext) => Promise<FitResult>;
