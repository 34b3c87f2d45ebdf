/**
 * Transition models: the critic-derived form of MATH.md §2, recovery of a simulated
 * linear-Gaussian chain by fitTransition within sampling error (least-squares standard
 * errors, Bishop PRML §3.1; Wishart variance of a sample covariance, Anderson, An
 * Introduction to Multivariate Statistical Analysis, 3rd ed., §7.2), and the repair of
 * singular fits.
 */
import { describe, expect, it } from 'vitest';
import {
  NumericError,
  criticTransition,
  fitTransition,
  trueTransition,
} from '../../runner/inference/index.ts';
import {
  cholesky,
  inverseSpd,
  multiplyTransA,
  symmetricEigen,
} from '../../runner/numeric/linalg/index.ts';
import type { Mat } from '../../runner/numeric/matrix.ts';
import { identity } from '../../runner/numeric/matrix.ts';
import { simulatePairs } from './helpers/simulate-chain.ts';

const F: Mat = {
  rows: 3,
  cols: 3,
  data: Float64Array.from([0.7, 0.2, 0, -0.1, 0.5, 0.3, 0.05, 0, 0.6]),
};
const Q: Mat = {
  rows: 3,
  cols: 3,
  data: Float64Array.from([0.5, 0.1, 0, 0.1, 0.4, -0.05, 0, -0.05, 0.3]),
};

describe('criticTransition (MATH.md §2)', () => {
  it('is F = mA, Q = mI with m = c/(c+1) and a zero mean', () => {
    const A: Mat = { rows: 2, cols: 2, data: Float64Array.from([1, 2, 3, 4]) };
    const model = criticTransition(A, 3);
    expect(Array.from(model.F.data)).toEqual([0.75, 1.5, 2.25, 3]);
    expect(Array.from(model.Q.data)).toEqual([0.75, 0, 0, 0.75]);
    expect(Array.from(model.mean)).toEqual([0, 0]);
    expect(model.source).toBe('critic');
    expect(() => criticTransition(A, 0)).toThrow(NumericError);
  });
});

describe('fitTransition recovers a simulated linear-Gaussian chain', () => {
  const count = 20_000;
  const mean = Float64Array.from([2, -1, 0.5]);
  const { from, to } = simulatePairs(F, Q, count, 31, mean);
  const model = fitTransition(from, to, count, 3, { ridge: 0, centre: true });

  it('F̂ within 5 standard errors, SE(F̂_ij)² = Q_ii (C₀₀⁻¹)_jj / n (common practice: 5σ bound)', () => {
    const x: Mat = { rows: count, cols: 3, data: from.map((v, i) => v - mean[i % 3]!) };
    const c00 = multiplyTransA(x, x);
    c00.data.forEach((_, i) => (c00.data[i] = c00.data[i]! / count));
    const c00inv = inverseSpd(c00);
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        const se = Math.sqrt((Q.data[i * 3 + i]! * c00inv.data[j * 3 + j]!) / count);
        expect(Math.abs(model.F.data[i * 3 + j]! - F.data[i * 3 + j]!)).toBeLessThan(5 * se);
      }
  });

  it('Q̂ within 5 standard errors, Var(Q̂_ij) = (Q_ii Q_jj + Q_ij²)/n (Wishart)', () => {
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        const qij = Q.data[i * 3 + j]!;
        const se = Math.sqrt((Q.data[i * 3 + i]! * Q.data[j * 3 + j]! + qij * qij) / count);
        expect(Math.abs(model.Q.data[i * 3 + j]! - qij)).toBeLessThan(5 * se);
      }
  });

  it('estimates the mean and records no repairs', () => {
    for (let i = 0; i < 3; i++) expect(Math.abs(model.mean[i]! - mean[i]!)).toBeLessThan(0.1);
    expect(model.notes).toEqual([]);
    expect(model.source).toBe('fitted');
  });
});

describe('fitTransition regularises singular fits and says so', () => {
  it('a noiseless coordinate gives a singular Q̂: clipped to condition 1e6, noted, finite', () => {
    const count = 500;
    const { from, to } = simulatePairs(F, Q, count, 41);
    // Coordinate 2 of `to` is an exact linear function of `from`: zero residual variance.
    for (let n = 0; n < count; n++) to[n * 3 + 2] = 0.5 * from[n * 3]! - from[n * 3 + 1]!;
    const model = fitTransition(from, to, count, 3, { ridge: 0, centre: false, source: 'fitted' });
    expect(model.notes.some((n) => n.startsWith('Q regularised: condition number'))).toBe(true);
    expect(model.Q.data.every(Number.isFinite)).toBe(true);
    const { values } = symmetricEigen(model.Q);
    expect(values[0]! / values[2]!).toBeLessThan(1e6 * 1.0001);
    expect(() => cholesky(model.Q)).not.toThrow();
  });

  it('identical inputs (singular C₀₀, ridge 0) get an extra ridge, noted, never NaN', () => {
    const count = 50;
    const from = new Float64Array(count * 2).fill(1);
    const to = Float64Array.from({ length: count * 2 }, (_, i) => i % 7);
    const model = fitTransition(from, to, count, 2, { ridge: 0, centre: true });
    expect(model.notes.some((n) => n.startsWith('C₀₀ singular'))).toBe(true);
    expect([...model.F.data, ...model.Q.data].every(Number.isFinite)).toBe(true);
  });

  it('trueTransition with a singular Q is regularised and noted', () => {
    const Qs: Mat = { rows: 2, cols: 2, data: Float64Array.from([1, 0, 0, 0]) };
    const model = trueTransition(identity(2, 0.9), Qs);
    expect(model.source).toBe('true');
    expect(model.notes).toHaveLength(1);
    expect(() => cholesky(model.Q)).not.toThrow();
  });

  it('rejects mismatched shapes and NaN with codes', () => {
    const err = (f: () => unknown): NumericError => {
      try {
        f();
      } catch (e) {
        if (e instanceof NumericError) return e;
      }
      throw new Error('expected a NumericError');
    };
    expect(
      err(() => fitTransition([1, 2, 3], [1, 2, 3, 4], 2, 2, { ridge: 0, centre: true })).code,
    ).toBe('shape-mismatch');
    const nan = err(() =>
      fitTransition([1, 2, 3, 4], [1, NaN, 3, 4], 2, 2, { ridge: 0, centre: true }),
    );
    expect(nan.code).toBe('non-finite-input');
    expect(nan.message).toContain('row 0, column 1');
    expect(
      err(() => fitTransition([1, 2, 3, 4], [1, 2, 3, 4], 2, 2, { ridge: -1, centre: true })).code,
    ).toBe('invalid-argument');
  });
});
