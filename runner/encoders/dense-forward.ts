/**
 * The forward pass ψ of a linear or MLP encoder over plain Float32Arrays, in the parameter
 * layout of runner/training/engine.ts (see also dense-layout.ts): for each dense layer
 * W [in, out], b [out], then, with layer norm on a hidden layer, gain g [out] and shift β [out].
 * A hidden layer computes act(LN(x W + b)); the output layer is affine.
 *
 * Evaluation encodes reloaded linear/MLP representations with this instead of TF.js, so an
 * evaluate job never loads TF.js for them. Sums run in float64 and each layer's output is
 * rounded to float32 (the precision TF.js stores), so results match the TF.js encoder
 * within float32 rounding (tests/encoders/dense-forward.test.ts).
 */
import type { EncoderConfig } from '../config/types.ts';
import { denseLayout, denseSizes } from './dense-layout.ts';

/** ψ: `count` rows of obs [count, obsDim] → [count, dim]. */
export type DenseForward = (obs: Float32Array, count: number) => Float32Array;

interface DenseLayer {
  input: number;
  output: number;
  w: Float32Array; // [input, output]
  b: Float32Array; // [output]
  norm?: { gain: Float32Array; shift: Float32Array }; // [output] each
}

const geluScale = Math.sqrt(2 / Math.PI);

/** The activation on one value; gelu is the tanh form (Hendrycks & Gimpel, 2016, §2). */
function activateValue(v: number, kind: EncoderConfig['activation']): number {
  switch (kind) {
    case 'relu':
      return v > 0 ? v : 0;
    case 'tanh':
      return Math.tanh(v);
    case 'elu':
      // Clevert, Unterthiner & Hochreiter (2016), eq. 1 with α = 1 (TF.js's elu).
      return v > 0 ? v : Math.expm1(v);
    case 'gelu':
      return 0.5 * v * (1 + Math.tanh(geluScale * (v + 0.044715 * v * v * v)));
  }
}

/** Layer normalisation of one row in place (Ba, Kiros & Hinton, 2016, eq. 4), ε = 1e-5. */
function normaliseRow(row: Float64Array, gain: Float32Array, shift: Float32Array): void {
  const n = row.length;
  let mean = 0;
  for (let j = 0; j < n; j++) mean += row[j]!;
  mean /= n;
  let variance = 0;
  for (let j = 0; j < n; j++) variance += (row[j]! - mean) ** 2;
  variance /= n; // biased, as TF.js's moments
  const inv = 1 / Math.sqrt(variance + 1e-5);
  for (let j = 0; j < n; j++) row[j] = (row[j]! - mean) * inv * gain[j]! + shift[j]!;
}

/** Splits the flat parameter list into layers, checking every length against the layout. */
function layersOf(
  config: EncoderConfig,
  obsDim: number,
  dim: number,
  params: Float32Array[],
): DenseLayer[] {
  const specs = denseLayout(config, obsDim, dim);
  if (params.length !== specs.length) {
    throw new RangeError(
      `expected ${specs.length} parameter arrays (runner/training/engine.ts layout), got ${params.length}`,
    );
  }
  specs.forEach((s, i) => {
    const want = s.shape.reduce((a, b) => a * b, 1);
    if (params[i]!.length !== want) {
      throw new RangeError(
        `parameter ${s.name}: expected ${want} values, got ${params[i]!.length}`,
      );
    }
  });
  const hasNorm = config.kind === 'mlp' && config.layerNorm;
  const sizes = denseSizes(config, obsDim, dim);
  const layers: DenseLayer[] = [];
  let at = 0;
  sizes.forEach(([input, output], l) => {
    const layer: DenseLayer = { input, output, w: params[at]!, b: params[at + 1]! };
    at += 2;
    if (hasNorm && l < sizes.length - 1) {
      layer.norm = { gain: params[at]!, shift: params[at + 1]! };
      at += 2;
    }
    layers.push(layer);
  });
  return layers;
}

/** One dense layer on one row: out = x W + b [output], summed in float64. */
function applyLayer(x: Float64Array, layer: DenseLayer, out: Float64Array): void {
  const { input, output, w, b } = layer;
  for (let j = 0; j < output; j++) out[j] = b[j]!;
  for (let k = 0; k < input; k++) {
    const v = x[k]!;
    if (v === 0) continue;
    const base = k * output;
    for (let j = 0; j < output; j++) out[j] = out[j]! + v * w[base + j]!;
  }
}

/**
 * The encoder ψ of a linear or MLP config with the given parameters (layout above; the
 * critic matrix A is not part of it). Throws RangeError when the arrays do not fit the layout.
 */
export function createDenseForward(
  config: EncoderConfig,
  obsDim: number,
  dim: number,
  params: Float32Array[],
): DenseForward {
  const layers = layersOf(config, obsDim, dim, params);
  const activation = config.activation;
  const last = layers.length - 1;
  return (obs, count) => {
    const out = new Float32Array(count * dim);
    const buffers = layers.map((l) => new Float64Array(l.output));
    const input = new Float64Array(obsDim);
    for (let i = 0; i < count; i++) {
      for (let k = 0; k < obsDim; k++) input[k] = obs[i * obsDim + k]!;
      let x = input;
      layers.forEach((layer, l) => {
        const y = buffers[l]!;
        applyLayer(x, layer, y);
        if (l < last) {
          if (layer.norm !== undefined) normaliseRow(y, layer.norm.gain, layer.norm.shift);
          // Round to float32 per layer: the precision the TF.js encoder carries between layers.
          for (let j = 0; j < y.length; j++) y[j] = Math.fround(activateValue(y[j]!, activation));
        }
        x = y;
      });
      out.set(x, i * dim);
    }
    return out;
  };
}
