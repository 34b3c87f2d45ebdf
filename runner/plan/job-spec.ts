/**
 * CONTRACT — the job spec: plain JSON and the only thing a worker sees (STYLE.md §3).
 * Produced by the plan stage from a resolved config; consumed by execute/ handlers.
 */
import type {
  DataConfig,
  EncoderConfig,
  EvalConfig,
  MethodConfig,
  TrainConfig,
} from '../config/types.ts';

/** The axis values that distinguish this job's setting, as dotted path → value (table columns). */
export type Setting = Record<string, unknown>;

/** Fits one method (trains an encoder, or fits a baseline) and stores it as artifacts. */
export interface TrainJobSpec {
  kind: 'train';
  /** Content hash of everything that determines the output (method, seed, data, encoder, dim, train). */
  id: string;
  experiment: string;
  setting: Setting;
  method: MethodConfig;
  seed: number;
  data: DataConfig;
  encoder: EncoderConfig;
  dim: number;
  train: TrainConfig;
  /** Directory of the experiment file: relative paths (data files, plugins) resolve from here. */
  baseDir: string;
  /**
   * SHA-256 of each file the job reads (data file, plugin module, precomputed embeddings),
   * by path as written; part of the id, so editing a file reruns its jobs. Absent when the
   * job reads no file. 'unreadable' when the file could not be read at planning time.
   */
  inputFiles?: Record<string, string>;
}

/** Evaluates one trained representation; depends on its train job (reused by id). */
export interface EvalJobSpec {
  kind: 'evaluate';
  /** Hash of the train job id and the eval settings: changing eval reruns only these. */
  id: string;
  trainId: string;
  experiment: string;
  setting: Setting;
  method: MethodConfig;
  seed: number;
  /** The train job this evaluates (data, dim, train.scale and so on are read from it). */
  train: TrainJobSpec;
  eval: EvalConfig;
}

export type JobSpec = TrainJobSpec | EvalJobSpec;
export type JobKind = JobSpec['kind'];
