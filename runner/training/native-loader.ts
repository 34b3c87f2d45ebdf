/**
 * Loads the compiled native training engine (native/, built by scripts/build-native.mjs at
 * `npm ci`) and describes what it offers. Loading never throws: when the addon is missing or
 * broken the result says why, and training falls back to TF.js.
 *
 * Environment:
 * - MIDPATH_NATIVE_ADDON: path of the `.node` file to load instead of the built one.
 * - MIDPATH_NATIVE=off: behave as if the addon were not built.
 * - MIDPATH_NATIVE_KERNEL=auto|portable|avx2|avx512: the sgemm variant new engines use.
 */
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';

/** sgemm variants, slowest first. */
export type NativeKernel = 'portable' | 'avx2' | 'avx512';

/** Options of the addon's Engine constructor (names as native/src/addon.cc reads them). */
export interface NativeEngineConfig {
  inDim: number;
  /** Hidden widths; empty for a linear encoder. */
  widths: number[];
  dim: number;
  activation: 'relu' | 'tanh' | 'gelu' | 'elu';
  layerNorm: boolean;
  critic: 'distance' | 'distance-identity' | 'inner';
  loss: 'forward' | 'backward' | 'symmetric';
  regulariser: 'none' | 'penalty' | 'kl';
  weight: number;
  scale: number;
  clip: number;
  lr: number;
  /** 'auto' (default) or a variant name; an unsupported variant throws. */
  kernel?: string;
}

/** Loss terms as the addon reports them (same fields as StepStats). */
export interface NativeStats {
  loss: number;
  infonce: number;
  regulariser: number;
  accuracy: number;
  gradNorm: number;
}

/** One native engine instance (native/src/addon.cc, class Engine). */
export interface NativeEngineHandle {
  readonly kernel: NativeKernel;
  /** Lengths of the parameter arrays in the layout of runner/training/engine.ts. */
  layout(): number[];
  setParams(flat: Float32Array): void;
  getParams(): Float32Array;
  stepSync(x: Float32Array, y: Float32Array, batch: number): NativeStats;
  evaluateSync(x: Float32Array, y: Float32Array, batch: number): NativeStats;
  /** The same step on the libuv thread pool: the event loop stays free while it runs. */
  step(x: Float32Array, y: Float32Array, batch: number): Promise<NativeStats>;
  evaluate(x: Float32Array, y: Float32Array, batch: number): Promise<NativeStats>;
  /** ψ of n rows x [n, inDim] → [n, dim]. */
  encode(x: Float32Array, n: number): Float32Array;
  dispose(): void;
}

/** The addon's exports. */
export interface NativeAddon {
  Engine: new (config: NativeEngineConfig) => NativeEngineHandle;
  /** C = alpha·op(A)·op(B) + beta·C in place, row-major (tests and bench). */
  sgemm(
    kernel: NativeKernel,
    transA: boolean,
    transB: boolean,
    m: number,
    n: number,
    k: number,
    alpha: number,
    a: Float32Array,
    lda: number,
    b: Float32Array,
    ldb: number,
    beta: number,
    c: Float32Array,
    ldc: number,
  ): void;
  kernels(): { best: NativeKernel; supported: NativeKernel[] };
}

/** The addon, or why it cannot be used. */
export type NativeStatus =
  { ok: true; addon: NativeAddon; path: string } | { ok: false; why: string };

/** Where `npm ci` puts the addon. */
export const builtAddonPath = fileURLToPath(
  new URL('../../native/build/Release/midpath_native.node', import.meta.url),
);

let cached: NativeStatus | undefined;

function loadFrom(path: string): NativeStatus {
  if (!existsSync(path)) {
    return {
      ok: false,
      why: `the addon is not built (${path} is missing; run \`npm ci\` with a C++ toolchain)`,
    };
  }
  try {
    const addon = createRequire(import.meta.url)(path) as NativeAddon;
    return { ok: true, addon, path };
  } catch (error) {
    return { ok: false, why: `the addon at ${path} does not load: ${(error as Error).message}` };
  }
}

/** Loads the addon once per process (see the environment variables above). */
export function loadNativeAddon(): NativeStatus {
  if (cached !== undefined) return cached;
  if (process.env.MIDPATH_NATIVE === 'off') {
    cached = { ok: false, why: 'MIDPATH_NATIVE=off is set' };
  } else {
    cached = loadFrom(process.env.MIDPATH_NATIVE_ADDON ?? builtAddonPath);
  }
  return cached;
}

/** The kernel requested through MIDPATH_NATIVE_KERNEL ('auto' when unset). */
export function requestedKernel(): string {
  return process.env.MIDPATH_NATIVE_KERNEL ?? 'auto';
}
