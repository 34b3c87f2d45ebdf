import { describe, expect, it } from 'vitest';
import { createRng } from '../../runner/numeric/random.ts';

describe('createRng (xoshiro128** seeded by SplitMix32)', () => {
  it('is deterministic for a seed and differs across seeds', () => {
    const a = Array.from({ length: 5 }, createRng(42).next);
    const b = Array.from({ length: 5 }, createRng(42).next);
    const c = Array.from({ length: 5 }, createRng(43).next);
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
  });

  it('has the moments of U(0,1) and N(0,1) within sampling error', () => {
    // Mean 1/2 and variance 1/12 of U(0,1); N(0,1) mean 0, variance 1 (textbook moments).
    // Tolerances are 5 standard errors for n = 200,000 (common practice).
    const n = 200_000;
    const rng = createRng(7);
    let su = 0;
    let su2 = 0;
    let sn = 0;
    let sn2 = 0;
    for (let i = 0; i < n; i++) {
      const u = rng.next();
      su += u;
      su2 += u * u;
      const z = rng.normal();
      sn += z;
      sn2 += z * z;
    }
    expect(Math.abs(su / n - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(su2 / n - (su / n) ** 2 - 1 / 12)).toBeLessThan(0.001);
    expect(Math.abs(sn / n)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(sn2 / n - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
  });

  it('int(n) covers [0, n) uniformly (chi-square against the 0.999 quantile 27.88 of χ²₉, printed tables)', () => {
    const rng = createRng(3);
    const counts = new Array<number>(10).fill(0);
    const n = 100_000;
    for (let i = 0; i < n; i++) counts[rng.int(10)]! += 1;
    const expected = n / 10;
    const chi2 = counts.reduce((s, c) => s + (c - expected) ** 2 / expected, 0);
    expect(chi2).toBeLessThan(27.88);
  });

  it('fork gives reproducible independent streams', () => {
    const x = createRng(1).fork('split').next();
    const y = createRng(1).fork('split').next();
    const z = createRng(1).fork('init').next();
    expect(x).toBe(y);
    expect(x).not.toBe(z);
  });
});
