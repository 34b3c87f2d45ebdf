import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import {
  chiSquareCdf,
  chiSquareQuantile,
  normalCdf,
  normalQuantile,
  studentTCdf,
  studentTQuantile,
} from '../../runner/numeric/stats/index.ts';

// jstat ships no type declarations; this is the slice the checks use.
interface JStatSlice {
  chisquare: { cdf(x: number, df: number): number; inv(p: number, df: number): number };
  studentt: { cdf(x: number, df: number): number; inv(p: number, df: number): number };
  normal: {
    cdf(x: number, m: number, s: number): number;
    inv(p: number, m: number, s: number): number;
  };
}
const jStat = (createRequire(import.meta.url)('jstat') as { jStat: JStatSlice }).jStat;

describe('Student t', () => {
  it('matches a printed t-table to its 3 decimals', () => {
    // Critical values from the t-table of Fisher & Yates, "Statistical Tables" (1963), Table III,
    // reproduced in most introductory texts (value from memory).
    const table: [number, number, number][] = [
      [0.975, 9, 2.262],
      [0.975, 1, 12.706],
      [0.95, 10, 1.812],
      [0.995, 20, 2.845],
      [0.975, 30, 2.042],
      [0.9, 5, 1.476],
    ];
    for (const [p, df, t] of table) expect(studentTQuantile(p, df)).toBeCloseTo(t, 3);
  });

  it('agrees with jstat (independent implementation) on cdf and quantile', () => {
    for (const df of [1, 2.5, 7, 30, 200]) {
      for (const t of [-6, -2, -0.3, 0, 0.7, 3]) {
        // jstat's own accuracy is ~1e-8 here (its Φ-free t cdf gives 0.50000002 at t = 0).
        expect(studentTCdf(t, df)).toBeCloseTo(jStat.studentt.cdf(t, df), 7);
      }
      for (const p of [0.001, 0.05, 0.3, 0.8, 0.999]) {
        expect(studentTQuantile(p, df)).toBeCloseTo(jStat.studentt.inv(p, df), 6);
        expect(studentTCdf(studentTQuantile(p, df), df)).toBeCloseTo(p, 12);
      }
    }
  });

  it('tends to the normal as df grows', () => {
    // t_∞ = N(0, 1) (textbook limit); z_{0.975} = 1.959964 (Abramowitz & Stegun Table 26.5).
    expect(studentTQuantile(0.975, Infinity)).toBeCloseTo(1.959964, 6);
    expect(studentTQuantile(0.975, 1e7)).toBeCloseTo(1.959964, 5);
  });
});

describe('χ²', () => {
  it('matches a printed χ² table', () => {
    // Pearson & Hartley, "Biometrika Tables for Statisticians" (1966), Table 8, upper
    // percentage points (value from memory).
    const table: [number, number, number][] = [
      [0.95, 1, 3.841],
      [0.95, 4, 9.488],
      [0.95, 10, 18.307],
      [0.99, 5, 15.086],
      [0.05, 10, 3.94],
      [0.5, 2, 1.386],
    ];
    for (const [p, df, x] of table) expect(chiSquareQuantile(p, df)).toBeCloseTo(x, 3);
  });

  it('agrees with jstat on quantiles and cdf, including fractional df and far tails', () => {
    for (const df of [0.5, 1, 3, 16, 64, 250]) {
      for (const p of [1e-6, 0.01, 0.5, 0.9, 0.999999]) {
        const q = chiSquareQuantile(p, df);
        expect(q / jStat.chisquare.inv(p, df)).toBeCloseTo(1, 6);
        expect(chiSquareCdf(q, df)).toBeCloseTo(p, 10);
      }
      for (const x of [0.01, 1, df, 3 * df]) {
        expect(chiSquareCdf(x, df)).toBeCloseTo(jStat.chisquare.cdf(x, df), 9);
      }
    }
  });
});

describe('normal', () => {
  it('agrees with jstat and with tabled tail areas', () => {
    // Φ(-1.96) = 0.0249979 and Φ(-3) = 0.0013499 (Abramowitz & Stegun 1964, Table 26.1).
    expect(normalCdf(-1.96)).toBeCloseTo(0.0249979, 7);
    expect(normalCdf(-3)).toBeCloseTo(0.0013499, 7);
    for (const p of [1e-12, 1e-4, 0.025, 0.5, 0.7, 0.9999]) {
      // jstat's inverse is good to ~1e-6 in the far tail; ours inverts our own Φ exactly.
      expect(normalQuantile(p)).toBeCloseTo(jStat.normal.inv(p, 0, 1), 5);
      expect(normalCdf(normalQuantile(p)) / p).toBeCloseTo(1, 12);
    }
    for (const x of [-8, -2.5, 0, 1, 4]) {
      expect(normalCdf(x)).toBeCloseTo(jStat.normal.cdf(x, 0, 1), 12);
    }
    // Relative precision deep in the tail: Φ(-10) = 7.6199e-24 (A&S 26.2.12 asymptotics).
    expect(normalCdf(-10) / 7.619853e-24).toBeCloseTo(1, 5);
  });
});
