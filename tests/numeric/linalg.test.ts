/**
 * The dense Float64Array kernels against ml-matrix as an independent oracle (its
 * CholeskyDecomposition, solve, mmul, inverse and EigenvalueDecomposition), on random
 * symmetric positive definite matrices drawn by fast-check.
 */
import fc from 'fast-check';
import {
  CholeskyDecomposition,
  EigenvalueDecomposition,
  Matrix,
  determinant,
  inverse,
  solve,
} from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import type { Mat } from '../../runner/numeric/matrix.ts';
import {
  NumericError,
  cholesky,
  inverseSpd,
  logDetSpd,
  multiply,
  multiplyTransA,
  multiplyTransB,
  solveLower,
  solveLowerRowsInPlace,
  solveLowerTranspose,
  solveLowerTransposeRowsInPlace,
  solveSpd,
  solveUpperRowsInPlace,
  transpose,
  symmetricEigen,
} from '../../runner/numeric/linalg/index.ts';
import { createRng } from '../../runner/numeric/random.ts';

const toMl = (m: Mat): Matrix =>
  new Matrix(
    Array.from({ length: m.rows }, (_, i) =>
      Array.from(m.data.subarray(i * m.cols, (i + 1) * m.cols)),
    ),
  );
const maxDiff = (a: ArrayLike<number>, b: ArrayLike<number>): number => {
  let e = 0;
  for (let i = 0; i < a.length; i++) e = Math.max(e, Math.abs(a[i]! - b[i]!));
  return e;
};
const flat = (m: Matrix): Float64Array => Float64Array.from(m.to1DArray());

function randomMat(rows: number, cols: number, seed: number): Mat {
  const rng = createRng(seed);
  return { rows, cols, data: Float64Array.from({ length: rows * cols }, () => rng.normal()) };
}

/** B Bᵀ + n I: symmetric positive definite and well conditioned. */
function randomSpd(n: number, seed: number): Mat {
  const b = randomMat(n, n, seed);
  const s = multiplyTransB(b, b);
  for (let i = 0; i < n; i++) s.data[i * n + i] = s.data[i * n + i]! + n;
  return s;
}

const sizes = fc.record({
  n: fc.integer({ min: 1, max: 24 }),
  k: fc.integer({ min: 1, max: 7 }),
  seed: fc.integer(),
});

describe('dense kernels vs ml-matrix', () => {
  it('cholesky matches ml-matrix CholeskyDecomposition and reproduces A = L Lᵀ', () => {
    fc.assert(
      fc.property(sizes, ({ n, seed }) => {
        const a = randomSpd(n, seed);
        const l = cholesky(a);
        const ref = new CholeskyDecomposition(toMl(a)).lowerTriangularMatrix;
        expect(maxDiff(l.data, flat(ref))).toBeLessThan(1e-10 * n);
        expect(maxDiff(multiplyTransB(l, l).data, a.data)).toBeLessThan(1e-9 * n);
      }),
      { numRuns: 40 },
    );
  });

  it('triangular solves (columns and rows layouts) match ml-matrix solve', () => {
    fc.assert(
      fc.property(sizes, ({ n, k, seed }) => {
        const l = cholesky(randomSpd(n, seed));
        const b = randomMat(n, k, seed + 1);
        const lower = toMl(l);
        expect(maxDiff(solveLower(l, b).data, flat(solve(lower, toMl(b))))).toBeLessThan(1e-9);
        expect(
          maxDiff(solveLowerTranspose(l, b).data, flat(solve(lower.transpose(), toMl(b)))),
        ).toBeLessThan(1e-9);
        // Rows layout: each row of Bᵀ [k, n] is one right-hand side.
        const rows = Float64Array.from(toMl(b).transpose().to1DArray());
        solveLowerRowsInPlace(l.data, n, rows, k);
        expect(maxDiff(rows, flat(solve(lower, toMl(b)).transpose()))).toBeLessThan(1e-9);
        const rowsT = Float64Array.from(toMl(b).transpose().to1DArray());
        solveLowerTransposeRowsInPlace(l.data, n, rowsT, k);
        expect(maxDiff(rowsT, flat(solve(lower.transpose(), toMl(b)).transpose()))).toBeLessThan(
          1e-9,
        );
        // Upper factor stored explicitly (U = Lᵀ), rows layout.
        const rowsU = Float64Array.from(toMl(b).transpose().to1DArray());
        solveUpperRowsInPlace(transpose(l).data, n, rowsU, k);
        expect(maxDiff(rowsU, flat(solve(lower.transpose(), toMl(b)).transpose()))).toBeLessThan(
          1e-9,
        );
      }),
      { numRuns: 40 },
    );
  });

  it('products A B, Aᵀ B, A Bᵀ match ml-matrix mmul', () => {
    fc.assert(
      fc.property(sizes, ({ n, k, seed }) => {
        const a = randomMat(n, k, seed);
        const b = randomMat(k, n + 1, seed + 2);
        const c = randomMat(n, n + 1, seed + 3);
        expect(maxDiff(multiply(a, b).data, flat(toMl(a).mmul(toMl(b))))).toBeLessThan(
          1e-12 * (k + 1) * 10,
        );
        expect(
          maxDiff(multiplyTransA(a, c).data, flat(toMl(a).transpose().mmul(toMl(c)))),
        ).toBeLessThan(1e-11 * n);
        expect(
          maxDiff(multiplyTransB(c, c).data, flat(toMl(c).mmul(toMl(c).transpose()))),
        ).toBeLessThan(1e-11 * n);
      }),
      { numRuns: 40 },
    );
  });

  it('SPD solve, inverse and log-determinant match ml-matrix', () => {
    fc.assert(
      fc.property(sizes, ({ n, k, seed }) => {
        const a = randomSpd(n, seed);
        const b = randomMat(n, k, seed + 5);
        expect(maxDiff(solveSpd(a, b).data, flat(solve(toMl(a), toMl(b))))).toBeLessThan(1e-10);
        expect(maxDiff(inverseSpd(a).data, flat(inverse(toMl(a))))).toBeLessThan(1e-10);
        // log det against ml-matrix's determinant (LU pivots).
        expect(logDetSpd(a)).toBeCloseTo(Math.log(determinant(toMl(a))), 8);
      }),
      { numRuns: 40 },
    );
  });

  it('symmetricEigen: descending values equal ml-matrix EVD and A V = V diag(λ)', () => {
    fc.assert(
      fc.property(sizes, ({ n, seed }) => {
        const a = randomSpd(n, seed);
        const { values, vectors } = symmetricEigen(a);
        const ref = new EigenvalueDecomposition(toMl(a), {
          assumeSymmetric: true,
        }).realEigenvalues.sort((x, y) => y - x);
        expect(maxDiff(values, ref)).toBeLessThan(1e-9 * n);
        for (let i = 1; i < n; i++) expect(values[i]!).toBeLessThanOrEqual(values[i - 1]!);
        const av = multiply(a, vectors);
        const vl = { ...vectors, data: vectors.data.map((v, i) => v * values[i % n]!) };
        expect(maxDiff(av.data, vl.data)).toBeLessThan(1e-8 * n * n);
      }),
      { numRuns: 25 },
    );
  });

  it('rejects a matrix that is not positive definite with code and shape', () => {
    const indefinite: Mat = { rows: 2, cols: 2, data: Float64Array.from([1, 2, 2, 1]) };
    const error = (() => {
      try {
        cholesky(indefinite, 'Q');
      } catch (e) {
        return e;
      }
      return null;
    })();
    expect(error).toBeInstanceOf(NumericError);
    expect((error as NumericError).code).toBe('not-positive-definite');
    expect((error as NumericError).message).toContain('2×2');
    expect(() => multiply(randomMat(2, 3, 1), randomMat(2, 3, 2))).toThrow(/2×3 and 2×3/);
  });
});
