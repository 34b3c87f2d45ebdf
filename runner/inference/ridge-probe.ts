/**
 * Ridge probe from representations to the true state (MATH.md §4, decoding): W minimises
 * ‖Y_c − X_c W‖² + λ‖W‖² on centred data, W = (X_cᵀX_c + λI)⁻¹ X_cᵀY_c, with an unpenalised
 * bias ȳ − x̄ W (Hastie, Tibshirani & Friedman, Elements of Statistical Learning, 2nd ed.,
 * eq. 3.44 and §3.4.1 on centring). The caller passes training episodes only.
 */
import type { Mat } from '../numeric/matrix.ts';
import { multiplyTransA } from '../numeric/linalg/multiply.ts';
import { solveSpd } from '../numeric/linalg/spd.ts';
import { centreRows, checkFinite, checkInteger, checkLength, checkNumber } from './validate.ts';

/** A fitted ridge probe: W [dIn, dOut], bias [dOut]. */
export interface RidgeProbe {
  W: Mat;
  bias: Float64Array;
  /** Predictions [count, dOut] for inputs X [count, dIn]. */
  predict(X: ArrayLike<number>, count: number): Float64Array;
}

/** Fits the probe on X [count, dIn] → Y [count, dOut] with penalty λ ≥ 0. */
export function fitRidgeProbe(
  X: ArrayLike<number>,
  Y: ArrayLike<number>,
  count: number,
  dIn: number,
  dOut: number,
  lambda: number,
): RidgeProbe {
  checkInteger('fitRidgeProbe: count', count, 1);
  checkInteger('fitRidgeProbe: dIn', dIn, 1);
  checkInteger('fitRidgeProbe: dOut', dOut, 1);
  checkLength('fitRidgeProbe: X', X.length, count * dIn, `[${count}, ${dIn}]`);
  checkLength('fitRidgeProbe: Y', Y.length, count * dOut, `[${count}, ${dOut}]`);
  checkFinite('fitRidgeProbe: X', X, dIn);
  checkFinite('fitRidgeProbe: Y', Y, dOut);
  checkNumber(
    'fitRidgeProbe: lambda',
    lambda,
    (v) => v >= 0,
    'a penalty λ ≥ 0 (use λ > 0 when inputs are collinear)',
  );

  const xMean = columnMean(X, count, dIn);
  const yMean = columnMean(Y, count, dOut);
  const xc: Mat = { rows: count, cols: dIn, data: centreRows(X, count, dIn, xMean) };
  const yc: Mat = { rows: count, cols: dOut, data: centreRows(Y, count, dOut, yMean) };
  const gram = multiplyTransA(xc, xc); // [dIn, dIn]
  for (let i = 0; i < dIn; i++) gram.data[i * dIn + i] = gram.data[i * dIn + i]! + lambda;
  const W = solveSpd(gram, multiplyTransA(xc, yc), 'ridge probe XᵀX + λI'); // [dIn, dOut]
  const bias = Float64Array.from(yMean);
  for (let i = 0; i < dIn; i++) {
    for (let j = 0; j < dOut; j++) bias[j] = bias[j]! - xMean[i]! * W.data[i * dOut + j]!;
  }

  const predict = (Xn: ArrayLike<number>, n: number): Float64Array => {
    checkInteger('ridge probe predict: count', n, 0);
    checkLength('ridge probe predict: X', Xn.length, n * dIn, `[${n}, ${dIn}]`);
    const out = new Float64Array(n * dOut); // [n, dOut]
    for (let r = 0; r < n; r++) {
      const o = r * dOut;
      out.set(bias, o);
      for (let i = 0; i < dIn; i++) {
        const x = Xn[r * dIn + i]!;
        for (let j = 0; j < dOut; j++) out[o + j] = out[o + j]! + x * W.data[i * dOut + j]!;
      }
    }
    return out;
  };
  return { W, bias, predict };
}

function columnMean(values: ArrayLike<number>, count: number, dim: number): Float64Array {
  const mean = new Float64Array(dim);
  for (let r = 0; r < count; r++)
    for (let j = 0; j < dim; j++) mean[j] = mean[j]! + values[r * dim + j]!;
  for (let j = 0; j < dim; j++) mean[j] = mean[j]! / count;
  return mean;
}
