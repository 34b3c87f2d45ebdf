import * as math from 'mathjs';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { loadDataset } from '../../../runner/data/load-dataset.ts';
import { drawLinearSystem } from '../../../runner/data/sources/linear-gaussian.ts';
import { createRng } from '../../../runner/numeric/random.ts';
import { makeDataConfig } from '../make-data-config.ts';

describe('linear-gaussian source', () => {
  it.each([1, 3, 5])(
    'stationary covariance solves P = F P Fᵀ + Q (n = %i), checked by a Kronecker solve',
    (n) => {
      const sys = drawLinearSystem(n, createRng(7 + n));
      // Independent method: vec(P) = (I − F⊗F)⁻¹ vec(Q) (Magnus & Neudecker, "Matrix
      // Differential Calculus", 3rd ed., 2019, ch. 2, vec(AXB) = (Bᵀ⊗A) vec X), solved by
      // mathjs LU. Row-major vec turns Bᵀ⊗A into A⊗B, here F⊗F.
      const F = Array.from({ length: n }, (_, i) => Array.from(sys.F.subarray(i * n, (i + 1) * n)));
      const lhs = math.subtract(math.identity(n * n), math.kron(F, F)) as math.Matrix;
      const solution: math.Matrix = math.flatten(math.lusolve(lhs, Array.from(sys.Q)));
      const vecP = solution.toArray() as number[];
      vecP.forEach((p, i) => expect(sys.P[i]).toBeCloseTo(p, 10));
      // F is stable: every eigenvalue strictly inside the unit circle (ml-matrix's
      // EigenvalueDecomposition, a port of JAMA's Hessenberg–QR algorithm).
      const eig = new EigenvalueDecomposition(new Matrix(F));
      eig.realEigenvalues.forEach((re, i) =>
        expect(Math.hypot(re, eig.imaginaryEigenvalues[i]!)).toBeLessThan(1),
      );
    },
  );

  it('states at any step follow the stationary law within sampling error', async () => {
    const episodes = 3000;
    const ds = await loadDataset(
      makeDataConfig({
        episodes,
        steps: 6,
        stateDim: 3,
        obsDim: 2,
        standardise: false,
        split: { train: 1, val: 0, test: 0 },
      }),
      '.',
    );
    const P = ds.model!.stationary;
    const n = 3;
    for (const t of [0, 5]) {
      const cov = new Float64Array(n * n);
      for (const ep of ds.train) {
        const s = ep.state!.subarray(t * n, (t + 1) * n);
        for (let i = 0; i < n; i++)
          for (let j = 0; j < n; j++) cov[i * n + j]! += (s[i]! * s[j]!) / episodes;
      }
      // Sampling error of a Gaussian covariance entry: Var(ŝ_ij) = (P_ii P_jj + P_ij²) / N
      // (Anderson, "An Introduction to Multivariate Statistical Analysis", 3rd ed., 2003, §3.3).
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          const se = Math.sqrt((P[i * n + i]! * P[j * n + j]! + P[i * n + j]! ** 2) / episodes);
          expect(Math.abs(cov[i * n + j]! - P[i * n + j]!)).toBeLessThan(4 * se);
        }
      }
    }
  });

  it('exposes the observation model in standardised units: o = H s + offset + v, v ~ N(0, R)', async () => {
    const ds = await loadDataset(
      makeDataConfig({ episodes: 60, steps: 40, obsDim: 5, stateDim: 2, noise: 0.1 }),
      '.',
    );
    const m = ds.model!;
    const [p, n] = [5, 2];
    expect(m.H).toBeDefined();
    const resid = new Float64Array(p);
    let count = 0;
    for (const ep of ds.train) {
      for (let t = 0; t < ep.steps; t++) {
        const s = Float64Array.from(ep.state!.subarray(t * n, (t + 1) * n));
        const pred = m.observe!(s);
        for (let i = 0; i < p; i++) {
          let lin = m.obsOffset![i]!;
          for (let j = 0; j < n; j++) lin += m.H![i * n + j]! * s[j]!;
          expect(pred[i]).toBeCloseTo(lin, 5);
          resid[i]! += (ep.obs[t * p + i]! - lin) ** 2;
        }
        count++;
      }
    }
    // Residual variance ≈ R_ii (chi-square with `count` degrees of freedom: ±4·√(2/count)).
    for (let i = 0; i < p; i++) {
      const ratio = resid[i]! / count / m.R![i * p + i]!;
      expect(Math.abs(ratio - 1)).toBeLessThan(4 * Math.sqrt(2 / count));
    }
  });

  it('smooth map: observations are tanh of a linear map, bounded before standardisation', async () => {
    const ds = await loadDataset(
      makeDataConfig({ map: 'smooth', noise: 0, episodes: 10, steps: 10, standardise: false }),
      '.',
    );
    for (const ep of ds.train) for (const v of ep.obs) expect(Math.abs(v)).toBeLessThanOrEqual(1);
    expect(ds.model!.H).toBeUndefined();
  });
});
