/**
 * The seam between the training loop and the code that performs one optimiser step.
 *
 * The loop (runner/training/train-loop.ts) owns everything that must be identical across
 * engines: the initial parameters (drawn from createRng), the batches (geometric pairs drawn
 * from createRng), logging, divergence detection and the curve. An engine owns only the
 * forward pass, the gradient, clipping and the Adam update. Two engines are planned:
 * 'tfjs' (runner/training/tfjs-engine.ts, any encoder kind) and 'native'
 * (runner/training/native-engine.ts, linear and MLP encoders), which registers itself with
 * `registerEngine('native', factory)` when runner/training/engines.ts loads it (loadEngines()
 * imports that file if it exists, so the loop never depends on it). Because both start from the same parameters and see
 * the same batches, their loss curves can be compared step by step.
 *
 * ## Parameter layout (linear and MLP encoders, shared by every engine)
 *
 * `params` is a flat list of Float32Array, row-major, in this order:
 *
 *   for each dense layer l = 1..L (hidden layers first, then the output layer of width d):
 *     W_l  [in_l, out_l]   — the layer computes x @ W_l + b_l (rows are inputs)
 *     b_l  [out_l]
 *     if encoder.layerNorm and l < L:
 *       g_l  [out_l]  layer-norm gain (init 1)
 *       β_l  [out_l]  layer-norm shift (init 0)
 *   A    [d, d]  — only when the critic is 'distance' or 'inner' (learned); row-major as in
 *                  MATH.md §1, so the distance critic uses u = ψ(x) Aᵀ. Absent for
 *                  'distance-identity' (A = I is fixed and not a parameter).
 *
 * A hidden layer computes h = act(LN(x @ W + b)) (layer norm, when enabled, before the
 * activation; ε = 1e-5, biased variance over the features). The output layer is affine, no
 * activation. A linear encoder is the case L = 1. `gelu` is the tanh approximation
 * (Hendrycks & Gimpel, 2016, §2).
 *
 * ## Step semantics (what every engine must compute)
 *
 *   ψx = ψ(batchX) [B, d], ψy = ψ(batchY) [B, d]
 *   logits L_ij = f(x_i, y_j) [B, B] (MATH.md §1; distance: −½‖A ψx_i − ψy_j‖²,
 *                 inner: ψx_iᵀ A ψy_j)
 *   InfoNCE per train.loss (forward rows / backward columns / symmetric mean of both)
 *   regulariser on the 2B encodings [ψx; ψy]: penalty λ (mean_i ‖ψ_i‖²/d − c)² or
 *   moment KL λ · ½[tr Σ̂/c + ‖μ̂‖²/c − d − log det Σ̂ + d log c] (Σ̂ biased, /2B)
 *   total = infonce + regulariser
 *   gradient of total; global-norm clip to train.clip when clip > 0 (norm over every param);
 *   Adam (Kingma & Ba, 2015, Algorithm 1) with β1 0.9, β2 0.999, ε 1e-7 added to √v̂
 *   (TF.js's float32 default), bias-corrected, learning rate train.lr.
 *
 * `StepStats` report the values *before* the update (the loss of the parameters the
 * gradient was taken at).
 */
import type { EncoderConfig, TrainConfig, TrainEngine } from '../config/types.ts';

/** Everything an engine needs to build its model; plain data. */
export interface EngineOptions {
  encoder: EncoderConfig;
  obsDim: number;
  /** Representation dimension d. */
  dim: number;
  /** Image shape [height, width] for the conv encoder. */
  imageShape?: [number, number];
  /** Objective and optimiser settings (critic, loss, regulariser, weight, scale, clip, lr). */
  train: TrainConfig;
  /** Compute threads the engine may use. */
  threads: number;
  /** Directory the experiment file lives in (plugin encoders resolve from here). */
  baseDir?: string;
  /** Job seed; engines that initialise their own parameters (conv, plugin) fork 'init' from it. */
  seed: number;
}

/** Loss terms and retrieval accuracy of one batch, measured before the update. */
export interface StepStats {
  /** infonce + regulariser */
  loss: number;
  infonce: number;
  /** The weighted regulariser term (λ times the penalty or KL). */
  regulariser: number;
  /** Top-1 retrieval accuracy of the positive among the batch (direction(s) of train.loss). */
  accuracy: number;
  /** Global gradient norm before clipping (NaN from `evaluate`). */
  gradNorm: number;
}

/** One training-step engine. Synchronous per step so the loop's timing is honest. */
export interface StepEngine {
  /** 'tfjs' | 'native' */
  readonly name: string;
  /** What runs the arithmetic, e.g. 'wasm-simd', 'cpu', 'openblas'. */
  readonly kernel?: string;
  readonly threads: number;
  /** Loads the parameters (layout above; copied, not retained) and resets Adam. */
  init(params: Float32Array[]): void;
  /** One optimiser step on B pairs; batchX and batchY are [B, obsDim]. */
  step(batchX: Float32Array, batchY: Float32Array, batchSize: number): StepStats;
  /**
   * The same step computed off the JavaScript event loop (the native engine runs it on the
   * libuv thread pool), so progress, time limits and Ctrl-C keep working during training.
   * The loop prefers it when present; results equal `step`.
   */
  stepAsync?(batchX: Float32Array, batchY: Float32Array, batchSize: number): Promise<StepStats>;
  /** The same quantities without updating anything (validation). */
  evaluate(batchX: Float32Array, batchY: Float32Array, batchSize: number): StepStats;
  /** Current parameters in the layout above (fresh copies). */
  getParams(): Float32Array[];
  /** Frees native memory / tensors. The engine is unusable afterwards. */
  dispose(): void;
}

/** Builds an engine for the options, or throws an Error whose message says why it cannot. */
export type EngineFactory = (options: EngineOptions) => Promise<StepEngine>;

/** Concrete engine names ('auto' picks one of these). */
export type EngineName = Exclude<TrainEngine, 'auto'>;

const factories = new Map<EngineName, EngineFactory>();

/** Registers (or replaces) the factory of an engine; each engine file calls this once. */
export function registerEngine(name: EngineName, factory: EngineFactory): void {
  factories.set(name, factory);
}

/** The factory registered under a name, if any. */
export function getEngineFactory(name: EngineName): EngineFactory | undefined {
  return factories.get(name);
}

/** Encoder kinds the native engine can train (the parameter layout above). */
export const nativeEncoderKinds: readonly string[] = ['linear', 'mlp'];

/**
 * Picks the engine for train.engine:
 * - 'tfjs' and 'native' are taken literally (an unavailable native engine is an error the
 *   caller reports with code engine-unavailable);
 * - 'auto' prefers 'native' when it is registered and the encoder is linear or MLP, else
 *   'tfjs'. If building the native engine fails, 'auto' falls back to 'tfjs' and says so
 *   through `onFallback`.
 */
export async function createEngine(
  preference: TrainEngine,
  options: EngineOptions,
  onFallback: (why: string) => void = () => undefined,
): Promise<StepEngine> {
  const wantNative =
    preference === 'native' ||
    (preference === 'auto' &&
      factories.has('native') &&
      nativeEncoderKinds.includes(options.encoder.kind));
  if (wantNative) {
    const native = factories.get('native');
    if (native === undefined) {
      throw new Error(
        "train.engine is 'native' but the native engine is not built; run `npm ci` with a C++ toolchain, or set train.engine to 'auto'",
      );
    }
    if (preference === 'native') return native(options);
    try {
      return await native(options);
    } catch (error) {
      onFallback(`native engine unavailable (${(error as Error).message}); using tfjs`);
    }
  }
  const tfjs = factories.get('tfjs');
  if (tfjs === undefined) throw new Error('the tfjs engine is not registered');
  return tfjs(options);
}
