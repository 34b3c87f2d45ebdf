/**
 * The TF.js training-step engine: any encoder kind, on the backend chosen by
 * runner/encoders/backend.ts. Registers itself as 'tfjs' (runner/training/engine.ts).
 */
import * as tf from '@tensorflow/tfjs';
import { selectBackend } from '../encoders/backend.ts';
import type { TfEncoder } from '../encoders/encoder.ts';
import { buildEncoder } from '../encoders/index.ts';
import { createRng } from '../numeric/random.ts';
import { registerEngine, type EngineOptions, type StepEngine, type StepStats } from './engine.ts';
import { HostAdam } from './host-adam.ts';
import { criticLogits, infoNce, regulariser, retrievalAccuracy } from './objective.ts';

/** The loss terms of one batch, as tensors (inside a tidy or gradient scope). */
export function batchObjective(
  encoder: TfEncoder,
  a: tf.Variable | null,
  x: tf.Tensor2D,
  y: tf.Tensor2D,
  train: EngineOptions['train'],
): { total: tf.Scalar; infonce: tf.Scalar; regulariser: tf.Scalar; accuracy: tf.Scalar } {
  // One encoder pass over [x; y] [2B, obsDim]: half the ops and larger products than two.
  const z = encoder.apply(tf.concat([x, y], 0)); // [2B, d]
  const batch = x.shape[0];
  const zx = tf.slice(z, [0, 0], [batch, -1]); // [B, d]
  const zy = tf.slice(z, [batch, 0], [batch, -1]); // [B, d]
  const logits = criticLogits(zx, zy, a as tf.Tensor2D | null, train.critic);
  const nce = infoNce(logits, train.loss);
  const reg = regulariser(z, train.regulariser, train.weight, train.scale);
  return {
    total: tf.add(nce, reg),
    infonce: nce,
    regulariser: reg,
    accuracy: retrievalAccuracy(logits.logits, train.loss),
  };
}

class TfjsEngine implements StepEngine {
  readonly name = 'tfjs';
  readonly kernel: string;
  readonly threads: number;
  private readonly variables: tf.Variable[];
  private adam: HostAdam;

  constructor(
    private readonly encoder: TfEncoder,
    private readonly a: tf.Variable | null,
    private readonly options: EngineOptions,
    backend: { name: string; threads: number; simd: boolean },
  ) {
    this.kernel = backend.name === 'wasm' && backend.simd ? 'wasm-simd' : backend.name;
    this.threads = backend.threads;
    this.variables = a === null ? [...encoder.variables] : [...encoder.variables, a];
    this.adam = this.newOptimiser(this.getParams());
  }

  private newOptimiser(params: Float32Array[]): HostAdam {
    const { lr, clip } = this.options.train;
    return new HostAdam(params, { lr, beta1: 0.9, beta2: 0.999, epsilon: 1e-7, clip });
  }

  init(params: Float32Array[]): void {
    if (params.length !== this.variables.length) {
      throw new RangeError(
        `expected ${this.variables.length} parameter arrays, got ${params.length}`,
      );
    }
    this.variables.forEach((v, i) => {
      if (params[i]!.length !== v.size) {
        throw new RangeError(
          `parameter ${i}: expected ${v.size} values [${v.shape.join(', ')}], got ${params[i]!.length}`,
        );
      }
    });
    this.adam = this.newOptimiser(params.map((p) => Float32Array.from(p)));
    this.upload();
  }

  /** Copies the host parameters into the TF.js variables. */
  private upload(): void {
    this.variables.forEach((v, i) =>
      tf.tidy(() => v.assign(tf.tensor(this.adam.params[i]!, v.shape))),
    );
  }

  step(batchX: Float32Array, batchY: Float32Array, batchSize: number): StepStats {
    const { obsDim, train } = this.options;
    let values: Float32Array = new Float32Array(4);
    let grads: Float32Array[] = [];
    tf.tidy(() => {
      const x = tf.tensor2d(batchX, [batchSize, obsDim]);
      const y = tf.tensor2d(batchY, [batchSize, obsDim]);
      const kept: tf.Scalar[] = [];
      const result = tf.variableGrads(() => {
        const terms = batchObjective(this.encoder, this.a, x, y, train);
        kept.push(tf.keep(terms.infonce), tf.keep(terms.regulariser), tf.keep(terms.accuracy));
        return terms.total;
      }, this.variables);
      values = tf.stack([result.value, ...kept]).dataSync() as Float32Array;
      kept.forEach((t) => t.dispose());
      grads = this.variables.map((v) => result.grads[v.name]!.dataSync() as Float32Array);
    });
    const gradNorm = HostAdam.norm(grads);
    const stats = toStats([...values, gradNorm]);
    if (Number.isFinite(stats.loss) && Number.isFinite(gradNorm)) {
      this.adam.apply(grads, gradNorm);
      this.upload();
    }
    return stats;
  }

  evaluate(batchX: Float32Array, batchY: Float32Array, batchSize: number): StepStats {
    const { obsDim, train } = this.options;
    const values = tf.tidy(() => {
      const x = tf.tensor2d(batchX, [batchSize, obsDim]);
      const y = tf.tensor2d(batchY, [batchSize, obsDim]);
      const t = batchObjective(this.encoder, this.a, x, y, train);
      return tf.stack([t.total, t.infonce, t.regulariser, t.accuracy]).dataSync();
    });
    return toStats([...values, Number.NaN]);
  }

  getParams(): Float32Array[] {
    return this.variables.map((v) => Float32Array.from(v.dataSync()));
  }

  dispose(): void {
    this.encoder.dispose();
    this.a?.dispose();
  }
}

function toStats(v: ArrayLike<number>): StepStats {
  const at = (i: number): number => (i < v.length ? v[i]! : Number.NaN);
  return { loss: at(0), infonce: at(1), regulariser: at(2), accuracy: at(3), gradNorm: at(4) };
}

/** Builds a TF.js engine (backend chosen on first use). */
export async function createTfjsEngine(options: EngineOptions): Promise<StepEngine> {
  const backend = await selectBackend();
  const encoder = await buildEncoder(
    {
      config: options.encoder,
      obsDim: options.obsDim,
      dim: options.dim,
      seed: options.seed,
      ...(options.imageShape === undefined ? {} : { imageShape: options.imageShape }),
      ...(options.baseDir === undefined ? {} : { baseDir: options.baseDir }),
    },
    createRng(options.seed).fork('init'),
  );
  const a =
    options.train.critic === 'distance-identity'
      ? null
      : tf.tidy(() => tf.variable(tf.eye(options.dim), true));
  return new TfjsEngine(encoder, a, options, backend);
}

registerEngine('tfjs', createTfjsEngine);
