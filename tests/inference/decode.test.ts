/**
 * Decoding (MATH.md §4): exact k-nearest neighbours against the definition (brute-force
 * ‖a − b‖² by differences, no expansion trick), and the ridge probe against its normal
 * equations solved by mathjs (Hastie, Tibshirani & Friedman, ESL 2nd ed., eq. 3.44).
 */
import fc from 'fast-check';
import * as math from 'mathjs';
import { describe, expect, it } from 'vitest';
import { NumericError, fitRidgeProbe, knnDecode } from '../../runner/inference/index.ts';
import { createRng } from '../../runner/numeric/random.ts';
import { maxDiff } from './helpers/dense-oracle.ts';

/** k nearest by the definition, sorting (distance, index) pairs. */
function bruteForceKnn(
  bank: ArrayLike<number>,
  n: number,
  query: ArrayLike<number>,
  dim: number,
  k: number,
): number[] {
  const pairs = Array.from({ length: n }, (_, b) => {
    let s = 0;
    for (let j = 0; j < dim; j++) s += (bank[b * dim + j]! - query[j]!) ** 2;
    return { s, b };
  });
  pairs.sort((x, y) => x.s - y.s || x.b - y.b);
  return pairs.slice(0, k).map((p) => p.b);
}

describe('knnDecode', () => {
  it('equals brute-force nearest neighbours (Float32 and Float64 banks, odd sizes)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1300 }),
        fc.integer({ min: 0, max: 11 }),
        fc.integer({ min: 1, max: 9 }),
        fc.integer({ min: 1, max: 5 }),
        fc.boolean(),
        fc.integer(),
        (bankCount, queryCount, dim, kWanted, single, seed) => {
          const rng = createRng(seed);
          const k = Math.min(kWanted, bankCount);
          const raw = Array.from({ length: bankCount * dim }, () => rng.normal());
          const bank = single ? Float32Array.from(raw) : Float64Array.from(raw);
          const queries = Float64Array.from({ length: queryCount * dim }, () => rng.normal());
          const got = knnDecode(bank, bankCount, queries, queryCount, dim, k);
          expect(got.length).toBe(queryCount * k);
          for (let q = 0; q < queryCount; q++) {
            const want = bruteForceKnn(
              bank,
              bankCount,
              queries.subarray(q * dim, (q + 1) * dim),
              dim,
              k,
            );
            expect(Array.from(got.subarray(q * k, (q + 1) * k))).toEqual(want);
          }
        },
      ),
      { numRuns: 30 },
    );
  });

  it('breaks exact ties by the lower bank index and finds an exact copy first', () => {
    const bank = Float64Array.from([1, 0, 0, 1, -1, 0, 0, -1, 0, 0]); // 5 points in 2-D
    const got = knnDecode(bank, 5, [0, 0, 1, 0], 2, 2, 3);
    expect(Array.from(got.subarray(0, 3))).toEqual([4, 0, 1]);
    expect(got[3]).toBe(0);
  });

  it('rejects k > bankCount and a ragged bank with codes', () => {
    expect(() => knnDecode(new Float64Array(4), 2, [0, 0], 1, 2, 3)).toThrow(NumericError);
    try {
      knnDecode(new Float64Array(5), 2, [0, 0], 1, 2, 1);
    } catch (e) {
      expect((e as NumericError).code).toBe('shape-mismatch');
    }
  });
});

describe('fitRidgeProbe', () => {
  const count = 60;
  const dIn = 4;
  const dOut = 2;
  const rng = createRng(71);
  const X = Float64Array.from({ length: count * dIn }, () => rng.normal() + 1);
  const Y = Float64Array.from({ length: count * dOut }, () => rng.normal());

  it('solves the centred normal equations (XᵀX + λI) W = XᵀY, bias ȳ − x̄W (mathjs oracle)', () => {
    const lambda = 3;
    const probe = fitRidgeProbe(X, Y, count, dIn, dOut, lambda);
    const rows = (a: Float64Array, c: number): number[][] =>
      Array.from({ length: count }, (_, i) => Array.from(a.subarray(i * c, (i + 1) * c)));
    const xm = math.mean(rows(X, dIn), 0) as unknown as number[];
    const ym = math.mean(rows(Y, dOut), 0) as unknown as number[];
    const xc = rows(X, dIn).map((r) => r.map((v, j) => v - xm[j]!));
    const yc = rows(Y, dOut).map((r) => r.map((v, j) => v - ym[j]!));
    const gram = math.add(
      math.multiply(math.transpose(xc), xc),
      math.multiply(lambda, math.identity(dIn)),
    );
    const gramArray = (gram as math.Matrix).toArray() as number[][];
    const W = math.multiply<number[]>(
      math.inv(gramArray),
      math.multiply<number[]>(math.transpose(xc), yc),
    );
    expect(maxDiff(probe.W.data, W.flat())).toBeLessThan(1e-10);
    const bias = ym.map((v, j) => v - xm.reduce((s, x, i) => s + x * W[i]![j]!, 0));
    expect(maxDiff(probe.bias, bias)).toBeLessThan(1e-10);
    const pred = probe.predict(X.subarray(0, dIn), 1);
    const want = [0, 1].map(
      (j) => bias[j]! + X.subarray(0, dIn).reduce((s, x, i) => s + x * W[i]![j]!, 0),
    );
    expect(maxDiff(pred, want)).toBeLessThan(1e-10);
  });

  it('with λ = 0 recovers an exact affine map', () => {
    const Wtrue = [0.5, -1, 2, 0, 0, 1, -0.3, 0.7]; // [dIn, dOut]
    const Yexact = new Float64Array(count * dOut);
    for (let n = 0; n < count; n++)
      for (let j = 0; j < dOut; j++) {
        let s = j === 0 ? 4 : -2;
        for (let i = 0; i < dIn; i++) s += X[n * dIn + i]! * Wtrue[i * dOut + j]!;
        Yexact[n * dOut + j] = s;
      }
    const probe = fitRidgeProbe(X, Yexact, count, dIn, dOut, 0);
    expect(maxDiff(probe.W.data, Wtrue)).toBeLessThan(1e-10);
    expect(maxDiff(probe.bias, [4, -2])).toBeLessThan(1e-10);
  });
});
