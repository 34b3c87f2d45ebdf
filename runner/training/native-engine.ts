/**
 * The native training-step engine: the whole contrastive step (encoder forward/backward,
 * critic, InfoNCE, regulariser, clipping, Adam) in compiled C++ over float32 buffers, on one
 * thread, for linear and MLP encoders (native/, docs/native.md). Registers itself as
 * 'native' (runner/training/engine.ts); its factory throws, with the reason, when the addon
 * is not built or the encoder is not supported, so 'auto' falls back to TF.js.
 */
import {
  nativeEncoderKinds,
  registerEngine,
  type EngineOptions,
  type StepEngine,
  type StepStats,
} from './engine.ts';
import {
  loadNativeAddon,
  requestedKernel,
  type NativeEngineConfig,
  type NativeEngineHandle,
} from './native-loader.ts';

/** The addon's configuration for engine options (throws when the encoder is unsupported). */
export function nativeConfig(options: EngineOptions, kernel: string): NativeEngineConfig {
  const { encoder, train } = options;
  if (!nativeEncoderKinds.includes(encoder.kind)) {
    throw new Error(
      `the native engine trains linear and MLP encoders, not '${encoder.kind}'; set train.engine to 'tfjs' or 'auto'`,
    );
  }
  const mlp = encoder.kind === 'mlp';
  return {
    inDim: options.obsDim,
    widths: mlp ? [...encoder.widths] : [],
    dim: options.dim,
    activation: encoder.activation,
    layerNorm: mlp && encoder.layerNorm,
    critic: train.critic,
    loss: train.loss,
    regulariser: train.regulariser,
    weight: train.weight,
    scale: train.scale,
    clip: train.clip,
    lr: train.lr,
    kernel,
  };
}

/** A StepEngine over one addon Engine; `stepAsync` runs the step off the event loop. */
export class NativeEngine implements StepEngine {
  readonly name = 'native';
  readonly threads = 1;
  private readonly sizes: number[];

  constructor(private readonly handle: NativeEngineHandle) {
    this.sizes = handle.layout();
  }

  /** 'avx512' | 'avx2' | 'portable': the sgemm variant in use. */
  get kernel(): string {
    return this.handle.kernel;
  }

  init(params: Float32Array[]): void {
    if (params.length !== this.sizes.length) {
      throw new RangeError(
        `expected ${this.sizes.length} parameter arrays (runner/training/engine.ts layout), got ${params.length}`,
      );
    }
    const flat = new Float32Array(this.sizes.reduce((a, b) => a + b, 0));
    let at = 0;
    params.forEach((p, i) => {
      const want = this.sizes[i]!;
      if (p.length !== want) {
        throw new RangeError(`parameter ${i}: expected ${want} values, got ${p.length}`);
      }
      flat.set(p, at);
      at += want;
    });
    this.handle.setParams(flat);
  }

  step(batchX: Float32Array, batchY: Float32Array, batchSize: number): StepStats {
    return this.handle.stepSync(batchX, batchY, batchSize);
  }

  /** The same step on the libuv thread pool; the caller must await it before the next call. */
  stepAsync(batchX: Float32Array, batchY: Float32Array, batchSize: number): Promise<StepStats> {
    return this.handle.step(batchX, batchY, batchSize);
  }

  evaluate(batchX: Float32Array, batchY: Float32Array, batchSize: number): StepStats {
    return { ...this.handle.evaluateSync(batchX, batchY, batchSize), gradNorm: Number.NaN };
  }

  /** ψ of n observations [n, obsDim] → [n, dim] with the current parameters. */
  encode(x: Float32Array, n: number): Float32Array {
    return this.handle.encode(x, n);
  }

  getParams(): Float32Array[] {
    const flat = this.handle.getParams();
    const out: Float32Array[] = [];
    let at = 0;
    for (const size of this.sizes) {
      out.push(flat.slice(at, at + size));
      at += size;
    }
    return out;
  }

  dispose(): void {
    this.handle.dispose();
  }
}

/**
 * Builds a native engine. `kernel` defaults to MIDPATH_NATIVE_KERNEL, else the fastest
 * variant the CPU runs. Throws an Error saying why when the engine cannot be built.
 */
export function createNativeEngine(
  options: EngineOptions,
  kernel = requestedKernel(),
): Promise<StepEngine> {
  try {
    const status = loadNativeAddon();
    if (!status.ok) throw new Error(status.why);
    const config = nativeConfig(options, kernel);
    return Promise.resolve(new NativeEngine(new status.addon.Engine(config)));
  } catch (error) {
    return Promise.reject(error instanceof Error ? error : new Error(String(error)));
  }
}

registerEngine('native', (options) => createNativeEngine(options));
