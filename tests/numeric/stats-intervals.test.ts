import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import {
  benjaminiHochberg,
  bootstrapInterval,
  holm,
  interquartileMean,
  mean,
  pairedTTest,
  summarise,
  welchTTest,
  wilsonInterval,
} from '../../runner/numeric/stats/index.ts';

interface JStatSlice {
  studentt: { cdf(x: number, df: number): number; inv(p: number, df: number): number };
}
const jStat = (createRequire(import.meta.url)('jstat') as { jStat: JStatSlice }).jStat;

describe('summarise', () => {
  it('gives mean ± t_{0.975,9}·s/√n with the printed t-value 2.262', () => {
    // Ten values with mean 5.5 and s = √(55/6) = 3.02765 (hand arithmetic);
    // t_{0.975,9} = 2.262 from a printed t-table (Fisher & Yates 1963, Table III).
    const s = summarise([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(s.n).toBe(10);
    expect(s.mean).toBe(5.5);
    expect(s.std).toBeCloseTo(Math.sqrt(55 / 6), 12);
    const half = (2.262 * Math.sqrt(55 / 6)) / Math.sqrt(10);
    expect(s.ciLow).toBeCloseTo(5.5 - half, 2);
    expect(s.ciHigh).toBeCloseTo(5.5 + half, 2);
  });

  it('returns NaN spread and interval for a single value, and NaN mean for none', () => {
    const one = summarise([3]);
    expect(one.mean).toBe(3);
    expect(one.std).toBeNaN();
    expect(one.ciLow).toBeNaN();
    expect(summarise([]).mean).toBeNaN();
  });
});

describe('interquartileMean', () => {
  it('is the 25 % trimmed mean (Agarwal et al. 2021)', () => {
    // n = 8: drop 2 from each end, mean of the middle 4 (definition of the trimmed mean).
    expect(interquartileMean([100, 1, 2, 3, 4, 5, 6, -50])).toBe(3.5);
    // n = 3: ⌊3/4⌋ = 0 values dropped, so it is the mean.
    expect(interquartileMean([1, 2, 6])).toBe(3);
  });
});

describe('bootstrapInterval', () => {
  it('is reproducible for a seed and brackets the estimate', () => {
    const values = [0.2, 0.5, 0.1, 0.9, 0.4, 0.3, 0.7, 0.6];
    const a = bootstrapInterval(values, mean, { resamples: 500, seed: 3 });
    const b = bootstrapInterval(values, mean, { resamples: 500, seed: 3 });
    expect(a).toEqual(b);
    expect(a.low).toBeLessThan(a.estimate);
    expect(a.high).toBeGreaterThan(a.estimate);
  });

  it('approaches the normal-theory interval for the mean of a large sample', () => {
    // For the mean, the percentile bootstrap interval approaches x̄ ± 1.96 σ/√n
    // (Efron & Tibshirani 1993, §13.3). Uniform 0..1 grid: σ² = 1/12.
    const values = Array.from({ length: 400 }, (_, i) => (i + 0.5) / 400);
    const r = bootstrapInterval(values, mean, { resamples: 2000, seed: 1 });
    const half = 1.96 * Math.sqrt(1 / 12 / 400);
    expect(r.low).toBeCloseTo(0.5 - half, 2);
    expect(r.high).toBeCloseTo(0.5 + half, 2);
  });
});

describe('t-tests', () => {
  it('reproduces the Welch example of the two 15-value samples', () => {
    // Worked example of Welch's t-test (Wikipedia, "Welch's t-test", Examples, sample sets
    // A1/A2): t = -2.46, df ≈ 25.0, p = 0.021 (value from memory).
    const a1 = [
      27.5, 21.0, 19.0, 23.6, 17.0, 17.9, 16.9, 20.1, 21.9, 22.6, 23.1, 19.6, 19.0, 21.7, 21.4,
    ];
    const a2 = [
      27.1, 22.0, 20.8, 23.4, 23.4, 23.5, 25.8, 22.0, 24.8, 20.2, 21.9, 22.1, 22.9, 20.5, 24.4,
    ];
    const r = welchTTest(a1, a2);
    expect(r.t).toBeCloseTo(-2.46, 2);
    expect(r.df).toBeCloseTo(25.0, 0);
    expect(r.p).toBeCloseTo(0.021, 3);
    // The p-value is the two-sided t tail at (t, df) per jstat (independent implementation).
    expect(r.p).toBeCloseTo(2 * jStat.studentt.cdf(-Math.abs(r.t), r.df), 8);
  });

  it('paired test equals a one-sample test on the differences', () => {
    // Student's (1908) sleep data, drugs 1 and 2 (Cushny & Peebles 1905): paired t = -4.062,
    // df = 9, p = 0.00283 (R's `t.test(extra ~ group, data = sleep, paired = TRUE)`, value from memory).
    const d1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
    const d2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];
    const r = pairedTTest(d1, d2);
    expect(r.t).toBeCloseTo(-4.062, 3);
    expect(r.df).toBe(9);
    expect(r.p).toBeCloseTo(0.00283, 5);
    expect(() => pairedTTest([1, 2], [1])).toThrow(RangeError);
  });
});

describe('wilsonInterval', () => {
  it('matches Newcombe (1998) Table I, method 3 (score interval without continuity correction)', () => {
    // Newcombe, "Two-sided confidence intervals for the single proportion", Stat. Med. 17,
    // 857–872, Table I examples (value from memory).
    const cases: [number, number, number, number][] = [
      [81, 263, 0.2553, 0.3662],
      [15, 148, 0.0624, 0.1605],
      [0, 20, 0, 0.1611],
      [1, 29, 0.0061, 0.1718],
    ];
    for (const [s, n, low, high] of cases) {
      const r = wilsonInterval(s, n);
      expect(r.low).toBeCloseTo(low, 4);
      expect(r.high).toBeCloseTo(high, 4);
    }
  });
});

describe('multiple-testing corrections', () => {
  it('Holm and Benjamini–Hochberg agree with hand-computed adjustments', () => {
    // p = (0.01, 0.04, 0.03, 0.005), m = 4. Holm: sorted 0.005·4, 0.01·3, 0.03·2, 0.04·1 →
    // 0.02, 0.03, 0.06, max(0.06, 0.04) = 0.06 (Holm 1979, step-down definition).
    expect(Array.from(holm([0.01, 0.04, 0.03, 0.005]))).toEqual(
      [0.03, 0.06, 0.06, 0.02].map((v) => expect.closeTo(v, 12) as number),
    );
    // BH: 4p/rank = 0.02, 0.02, 0.04, 0.04 after the running minimum from the top
    // (Benjamini & Hochberg 1995, step-up definition).
    expect(Array.from(benjaminiHochberg([0.01, 0.04, 0.03, 0.005]))).toEqual(
      [0.02, 0.04, 0.04, 0.02].map((v) => expect.closeTo(v, 12) as number),
    );
  });
});
