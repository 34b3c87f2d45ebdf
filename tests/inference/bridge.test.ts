/**
 * Bridges (MATH.md §3) against independent references: dense joint-Gaussian conditioning
 * in mathjs (Bishop, PRML §2.3.1, eqs. 2.81–2.82), the linear-Gaussian posterior of
 * Bishop eqs. 2.116–2.117 for one waypoint, the AR(1) closed form of MATH.md §3 and its
 * interpolation limit, and property tests (fast-check).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  NumericError,
  criticTransition,
  prepareBridge,
  solveBridge,
  trueTransition,
} from '../../runner/inference/index.ts';
import { solveBridgeDense } from '../../runner/inference/dense-bridge.ts';
import { identity } from '../../runner/numeric/matrix.ts';
import {
  add,
  chainJointCovariance,
  col,
  conditionGaussian,
  eigenvalues,
  eye,
  inv,
  maxDiff,
  mm,
  randomMat,
  randomVec,
  toDense,
  tr,
} from './helpers/dense-oracle.ts';

const blockOf = (means: Float64Array, q: number, t: number, T: number, d: number): Float64Array =>
  means.subarray((q * T + t) * d, (q * T + t + 1) * d);

describe('solveBridge vs dense joint-Gaussian conditioning in mathjs (Bishop §2.3.1, eqs. 2.81–2.82)', () => {
  it.each([
    { d: 1, T: 1, seed: 1 },
    { d: 3, T: 4, seed: 2 },
    { d: 4, T: 7, seed: 3 },
  ])('d = $d, T = $T: means and marginal covariances agree', ({ d, T, seed }) => {
    // A general model: random F, Q = B Bᵀ + 0.5 I (not the critic form), so no structure helps.
    const B = randomMat(d, seed + 10, 0.5);
    const Qd = add(mm(toDense(B), tr(toDense(B))), eye(d, 0.5));
    const model = trueTransition(randomMat(d, seed, 0.6), {
      rows: d,
      cols: d,
      data: Float64Array.from(Qd.flat()),
    });
    const joint = chainJointCovariance(toDense(model.F), Qd, eye(d, 2), T + 1);
    const queries = 3;
    const starts = randomVec(queries * d, seed + 20);
    const goals = randomVec(queries * d, seed + 30);
    const post = solveBridge(model, starts, goals, queries, T);
    const observed = [...Array(d).keys(), ...Array.from({ length: d }, (_, i) => (T + 1) * d + i)];
    const hidden = Array.from({ length: T * d }, (_, i) => d + i);
    for (let q = 0; q < queries; q++) {
      const xb = [...starts.subarray(q * d, (q + 1) * d), ...goals.subarray(q * d, (q + 1) * d)];
      const ref = conditionGaussian(joint, hidden, observed, xb);
      expect(maxDiff(post.means.subarray(q * T * d, (q + 1) * T * d), ref.mean)).toBeLessThan(1e-9);
      for (let t = 0; t < T; t++) {
        const block = ref.cov.slice(t * d, (t + 1) * d).map((r) => r.slice(t * d, (t + 1) * d));
        expect(maxDiff(post.covariances[t]!.data, block.flat())).toBeLessThan(1e-9);
      }
    }
  });

  it('handles a model mean by working in centred coordinates', () => {
    const d = 2;
    const T = 3;
    const base = criticTransition(randomMat(d, 4, 0.7), 1.5);
    const mean = Float64Array.from([3, -2]);
    const shifted = { ...base, mean };
    const starts = randomVec(d, 5);
    const goals = randomVec(d, 6);
    const centred = solveBridge(
      base,
      starts.map((v, i) => v - mean[i]!),
      goals.map((v, i) => v - mean[i]!),
      1,
      T,
    );
    const post = solveBridge(shifted, starts, goals, 1, T);
    expect(
      maxDiff(
        post.means,
        centred.means.map((v, i) => v + mean[i % d]!),
      ),
    ).toBeLessThan(1e-12);
  });

  it('matches the dense (Td)×(Td) reference used by the bench', () => {
    const model = criticTransition(randomMat(5, 7, 0.5), 3);
    const starts = randomVec(4 * 5, 8);
    const goals = randomVec(4 * 5, 9);
    const a = solveBridge(model, starts, goals, 4, 6);
    const b = solveBridgeDense(model, starts, goals, 4, 6);
    expect(maxDiff(a.means, b.means)).toBeLessThan(1e-10);
    a.covariances.forEach((c, t) =>
      expect(maxDiff(c.data, b.covariances[t]!.data)).toBeLessThan(1e-10),
    );
  });
});

describe('one waypoint (T = 1): linear-Gaussian posterior, Bishop eqs. 2.116–2.117', () => {
  it('critic model: precision m⁻¹I + m AᵀA and information Aψ₀ + Aᵀψ_g (MATH.md §3)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5 }),
        fc.integer(),
        fc.double({ min: 0.1, max: 20, noNaN: true }),
        (d, seed, c) => {
          const A = randomMat(d, seed, 0.8);
          const m = c / (c + 1);
          const start = randomVec(d, seed + 1);
          const goal = randomVec(d, seed + 2);
          const Ad = toDense(A);
          const precision = add(
            eye(d, 1 / m),
            mm(tr(Ad), Ad).map((r) => r.map((v) => m * v)),
          );
          const info = add(mm(Ad, col(start)), mm(tr(Ad), col(goal)));
          const cov = inv(precision);
          const mean = mm(cov, info).map((r) => r[0]!);
          const post = solveBridge(criticTransition(A, c), start, goal, 1, 1);
          const scale = 1 + Math.max(...mean.map(Math.abs));
          expect(maxDiff(post.means, mean) / scale).toBeLessThan(1e-9);
          expect(maxDiff(post.covariances[0]!.data, cov.flat())).toBeLessThan(1e-9);
        },
      ),
      { numRuns: 60 },
    );
  });
});

describe('AR(1) special case A = √(1+1/c) I (MATH.md §3)', () => {
  /** E[ψ_k | ψ₀, ψ_n] = [ρ^k (1−ρ^{2(n−k)}) ψ₀ + ρ^{n−k} (1−ρ^{2k}) ψ_n] / (1−ρ^{2n}). */
  const closedForm = (rho: number, n: number, k: number, x0: number, xn: number): number =>
    (rho ** k * (1 - rho ** (2 * (n - k))) * x0 + rho ** (n - k) * (1 - rho ** (2 * k)) * xn) /
    (1 - rho ** (2 * n));

  it.each([0.5, 2, 10])('c = %s: every waypoint equals the closed form', (c) => {
    const d = 3;
    const T = 5;
    const n = T + 1;
    const rho = Math.sqrt(c / (c + 1));
    const model = criticTransition(identity(d, Math.sqrt(1 + 1 / c)), c);
    const start = Float64Array.from([1, -2, 0.5]);
    const goal = Float64Array.from([-1, 0.3, 2]);
    const post = solveBridge(model, start, goal, 1, T);
    for (let k = 1; k <= T; k++) {
      const expected = Array.from({ length: d }, (_, i) =>
        closedForm(rho, n, k, start[i]!, goal[i]!),
      );
      expect(maxDiff(blockOf(post.means, 0, k - 1, T, d), expected)).toBeLessThan(1e-12);
    }
  });

  it('as c → ∞ the bridge becomes linear interpolation, weights (n−k)/n and k/n', () => {
    const T = 7;
    const n = T + 1;
    const c = 1e9;
    const model = criticTransition(identity(2, Math.sqrt(1 + 1 / c)), c);
    const start = Float64Array.from([4, -1]);
    const goal = Float64Array.from([-2, 5]);
    const post = solveBridge(model, start, goal, 1, T);
    for (let k = 1; k <= T; k++) {
      const lerp = [0, 1].map((i) => ((n - k) / n) * start[i]! + (k / n) * goal[i]!);
      expect(maxDiff(blockOf(post.means, 0, k - 1, T, 2), lerp)).toBeLessThan(1e-6);
    }
  });
});

describe('bridge properties (fast-check)', () => {
  const arbitraryCase = fc.record({
    d: fc.integer({ min: 1, max: 5 }),
    T: fc.integer({ min: 1, max: 8 }),
    queries: fc.integer({ min: 1, max: 6 }),
    c: fc.double({ min: 0.05, max: 50, noNaN: true }),
    scale: fc.double({ min: 0.1, max: 1.5, noNaN: true }),
    seed: fc.integer(),
  });

  it('marginal covariances are symmetric positive definite (eigenvalues from mathjs)', () => {
    fc.assert(
      fc.property(arbitraryCase, ({ d, T, c, scale, seed }) => {
        const solver = prepareBridge(criticTransition(randomMat(d, seed, scale), c), T);
        for (const cov of solver.covariances) {
          const dense = toDense(cov);
          expect(maxDiff(cov.data, tr(dense).flat())).toBe(0);
          expect(Math.min(...eigenvalues(dense))).toBeGreaterThan(0);
        }
      }),
      { numRuns: 50 },
    );
  });

  it('a batched solve equals solving the queries one by one', () => {
    fc.assert(
      fc.property(arbitraryCase, ({ d, T, queries, c, scale, seed }) => {
        const model = criticTransition(randomMat(d, seed, scale), c);
        const starts = randomVec(queries * d, seed + 1);
        const goals = randomVec(queries * d, seed + 2);
        const batch = prepareBridge(model, T).solve(starts, goals, queries);
        for (let q = 0; q < queries; q++) {
          const one = solveBridge(
            model,
            starts.subarray(q * d, (q + 1) * d),
            goals.subarray(q * d, (q + 1) * d),
            1,
            T,
          );
          expect(maxDiff(batch.means.subarray(q * T * d, (q + 1) * T * d), one.means)).toBeLessThan(
            1e-12,
          );
        }
      }),
      { numRuns: 50 },
    );
  });
});

describe('bridge input errors', () => {
  const model = criticTransition(identity(2), 1);
  const codeOf = (f: () => unknown): string => {
    try {
      f();
    } catch (e) {
      return e instanceof NumericError ? e.code : 'not a NumericError';
    }
    return 'no error';
  };

  it('names the shape, the row of a non-finite value and a bad T', () => {
    expect(codeOf(() => solveBridge(model, [1, 2, 3], [1, 2], 1, 2))).toBe('shape-mismatch');
    expect(() => solveBridge(model, [1, 2, 3], [1, 2], 1, 2)).toThrow(/\[1, 2\]/);
    expect(codeOf(() => solveBridge(model, [0, 0, 1, NaN], [0, 0, 0, 0], 2, 2))).toBe(
      'non-finite-input',
    );
    expect(() => solveBridge(model, [0, 0, 1, NaN], [0, 0, 0, 0], 2, 2)).toThrow(/row 1, column 1/);
    expect(codeOf(() => prepareBridge(model, 0))).toBe('invalid-argument');
    const singular = { ...model, Q: identity(2, 0) };
    expect(codeOf(() => prepareBridge(singular, 2))).toBe('not-positive-definite');
  });
});
