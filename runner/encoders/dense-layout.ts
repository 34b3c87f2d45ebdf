/**
 * The documented parameter layout of linear and MLP encoders (runner/training/engine.ts)
 * and its seeded initialisation, as plain arrays: every engine starts from these values.
 */
import type { CriticKind, EncoderConfig } from '../config/types.ts';
import type { Rng } from '../numeric/random.ts';

/** Shape of one parameter array. */
export interface ParamSpec {
  name: string;
  shape: number[];
  init: 'glorot' | 'zeros' | 'ones' | 'identity';
}

/** Layer sizes [in, out] of the dense stack; a linear encoder is one layer. */
export function denseSizes(config: EncoderConfig, obsDim: number, dim: number): [number, number][] {
  const widths = config.kind === 'linear' ? [] : config.widths;
  const sizes: [number, number][] = [];
  let input = obsDim;
  for (const w of [...widths, dim]) {
    sizes.push([input, w]);
    input = w;
  }
  return sizes;
}

/** The layout of the encoder's parameters (no critic matrix). */
export function denseLayout(config: EncoderConfig, obsDim: number, dim: number): ParamSpec[] {
  const sizes = denseSizes(config, obsDim, dim);
  const specs: ParamSpec[] = [];
  sizes.forEach(([input, output], l) => {
    specs.push({ name: `W${l + 1}`, shape: [input, output], init: 'glorot' });
    specs.push({ name: `b${l + 1}`, shape: [output], init: 'zeros' });
    if (config.kind === 'mlp' && config.layerNorm && l < sizes.length - 1) {
      specs.push({ name: `g${l + 1}`, shape: [output], init: 'ones' });
      specs.push({ name: `beta${l + 1}`, shape: [output], init: 'zeros' });
    }
  });
  return specs;
}

/** The critic matrix spec, when A is learned (distance, inner); undefined for A = I fixed. */
export function criticSpec(critic: CriticKind, dim: number): ParamSpec | undefined {
  return critic === 'distance-identity'
    ? undefined
    : { name: 'A', shape: [dim, dim], init: 'identity' };
}

/**
 * Draws one parameter: Glorot uniform U(−r, r), r = √(6/(in+out)) (Glorot & Bengio, 2010,
 * eq. 16) for weights; zeros, ones or the identity otherwise. Consumes `rng` only for Glorot.
 */
export function initParam(spec: ParamSpec, rng: Rng): Float32Array {
  const size = spec.shape.reduce((a, b) => a * b, 1);
  const out = new Float32Array(size);
  if (spec.init === 'glorot') {
    const fanIn = spec.shape.slice(0, -1).reduce((a, b) => a * b, 1);
    const fanOut = spec.shape[spec.shape.length - 1] ?? 1;
    const r = Math.sqrt(6 / (fanIn + fanOut));
    for (let i = 0; i < size; i++) out[i] = (2 * rng.next() - 1) * r;
  } else if (spec.init === 'ones') {
    out.fill(1);
  } else if (spec.init === 'identity') {
    const n = spec.shape[0] ?? 0;
    for (let i = 0; i < n; i++) out[i * n + i] = 1;
  }
  return out;
}

/** Initial parameters of a linear/MLP encoder plus A, in the engine layout. */
export function initDenseParams(
  config: EncoderConfig,
  obsDim: number,
  dim: number,
  critic: CriticKind,
  rng: Rng,
): Float32Array[] {
  const specs = denseLayout(config, obsDim, dim);
  const a = criticSpec(critic, dim);
  return [...specs, ...(a === undefined ? [] : [a])].map((s) => initParam(s, rng));
}
