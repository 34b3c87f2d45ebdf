/**
 * Every sgemm variant the CPU can run against a naive double-precision product
 * C = alpha·op(A)·op(B) + beta·C (the definition of the BLAS xGEMM operation, Dongarra et al.,
 * 1990, "A set of level 3 BLAS", §2): all four transpose combinations, odd sizes that leave
 * partial register tiles and cross the cache-block edges (KC = 256, MC = 120), leading
 * dimensions larger than the row length, and beta = 0 over NaN (C must not be read).
 */
import { describe, expect, it } from 'vitest';
import { createRng } from '../../runner/numeric/random.ts';
import type { NativeAddon, NativeKernel } from '../../runner/training/native-loader.ts';
import { nativeAddonForTests } from './native-required.ts';

const addon: NativeAddon | undefined = nativeAddonForTests();
const kernels: NativeKernel[] = addon?.kernels().supported ?? [];

interface Case {
  m: number;
  n: number;
  k: number;
  ta: boolean;
  tb: boolean;
  pad: number;
  alpha: number;
  beta: number;
}

const sizes: [number, number, number][] = [
  [1, 1, 1],
  [7, 5, 3],
  [13, 33, 17],
  [121, 37, 257], // crosses MC and KC
  [25, 70, 600],
  [3, 2100, 5], // crosses NC = 2048
];
const cases: Case[] = sizes.flatMap(([m, n, k], i) =>
  [false, true].flatMap((ta) =>
    [false, true].map((tb) => ({
      m,
      n,
      k,
      ta,
      tb,
      pad: (i % 3) + 1,
      alpha: 0.75,
      beta: i % 2 === 0 ? 0 : -0.5,
    })),
  ),
);

function naive(
  c: Case,
  a: Float32Array,
  lda: number,
  b: Float32Array,
  ldb: number,
  c0: Float32Array,
  ldc: number,
): Float64Array {
  const out = new Float64Array(c.m * c.n);
  for (let i = 0; i < c.m; i++) {
    for (let j = 0; j < c.n; j++) {
      let s = 0;
      for (let p = 0; p < c.k; p++) {
        const av = c.ta ? a[p * lda + i]! : a[i * lda + p]!;
        const bv = c.tb ? b[j * ldb + p]! : b[p * ldb + j]!;
        s += av * bv;
      }
      out[i * c.n + j] = c.alpha * s + (c.beta === 0 ? 0 : c.beta * c0[i * ldc + j]!);
    }
  }
  return out;
}

describe.skipIf(addon === undefined)('native sgemm', () => {
  it('reports the portable kernel and a best kernel among the supported ones', () => {
    expect(kernels).toContain('portable');
    expect(kernels).toContain(addon!.kernels().best);
  });

  describe.each(kernels)('%s kernel', (kernel) => {
    it.each(cases)('m=$m n=$n k=$k transA=$ta transB=$tb', (c) => {
      const rng = createRng(c.m * 7919 + c.n * 31 + c.k);
      const lda = (c.ta ? c.m : c.k) + c.pad;
      const ldb = (c.tb ? c.k : c.n) + c.pad;
      const ldc = c.n + c.pad;
      const a = Float32Array.from({ length: (c.ta ? c.k : c.m) * lda }, () => rng.normal());
      const b = Float32Array.from({ length: (c.tb ? c.n : c.k) * ldb }, () => rng.normal());
      const c0 = Float32Array.from({ length: c.m * ldc }, () =>
        c.beta === 0 ? Number.NaN : rng.normal(),
      );
      const out = Float32Array.from(c0);
      addon!.sgemm(kernel, c.ta, c.tb, c.m, c.n, c.k, c.alpha, a, lda, b, ldb, c.beta, out, ldc);
      const want = naive(c, a, lda, b, ldb, c0, ldc);
      // float32 accumulation of k products of N(0,1) values: error ≲ k·u·√k·|terms|; we allow
      // 1e-5·√k·(1 + |want|) (u = 6e-8, common practice for sgemm checks).
      let worst = 0;
      for (let i = 0; i < c.m; i++) {
        for (let j = 0; j < ldc; j++) {
          const got = out[i * ldc + j]!;
          if (j >= c.n) {
            // Padding beyond n is never written.
            expect(Object.is(got, c0[i * ldc + j]!)).toBe(true);
            continue;
          }
          const w = want[i * c.n + j]!;
          worst = Math.max(worst, Math.abs(got - w) / (Math.sqrt(c.k) * (1 + Math.abs(w))));
        }
      }
      expect(worst).toBeLessThan(1e-5);
    });
  });

  it('refuses a kernel name it does not know, naming the choices', () => {
    const one = new Float32Array(1);
    expect(() =>
      addon!.sgemm('sse9' as NativeKernel, false, false, 1, 1, 1, 1, one, 1, one, 1, 0, one, 1),
    ).toThrow(/auto, portable, avx2 or avx512/);
  });
});
