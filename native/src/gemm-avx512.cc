// AVX-512F sgemm variant, compiled with -mavx512f in its own static library (binding.gyp)
// and only ever called after CPUID (and the OS's saved-state mask) says zmm registers work.
#include <immintrin.h>

#include "gemm.h"

namespace midpath {
namespace kern_avx512 {

static const int MR = 12;
static const int NR = 32;

// 12×32 register tile: 24 zmm accumulators, 2 zmm of B and one broadcast of A per k step
// (27 of the 32 zmm registers).
static void micro_kernel(int kc, const float* a, const float* b, float* c, int ldc, float alpha,
                         float beta) {
  __m512 acc[MR][2];
#pragma GCC unroll 12
  for (int i = 0; i < MR; ++i) {
    acc[i][0] = _mm512_setzero_ps();
    acc[i][1] = _mm512_setzero_ps();
  }
  for (int p = 0; p < kc; ++p) {
    const __m512 b0 = _mm512_loadu_ps(b + p * NR);
    const __m512 b1 = _mm512_loadu_ps(b + p * NR + 16);
#pragma GCC unroll 12
    for (int i = 0; i < MR; ++i) {
      const __m512 ai = _mm512_set1_ps(a[p * MR + i]);
      acc[i][0] = _mm512_fmadd_ps(ai, b0, acc[i][0]);
      acc[i][1] = _mm512_fmadd_ps(ai, b1, acc[i][1]);
    }
  }
  const __m512 va = _mm512_set1_ps(alpha);
  const __m512 vb = _mm512_set1_ps(beta);
#pragma GCC unroll 12
  for (int i = 0; i < MR; ++i) {
    float* crow = c + static_cast<long>(i) * ldc;
    __m512 r0 = _mm512_mul_ps(va, acc[i][0]);
    __m512 r1 = _mm512_mul_ps(va, acc[i][1]);
    if (beta != 0.0f) {
      r0 = _mm512_fmadd_ps(vb, _mm512_loadu_ps(crow), r0);
      r1 = _mm512_fmadd_ps(vb, _mm512_loadu_ps(crow + 16), r1);
    }
    _mm512_storeu_ps(crow, r0);
    _mm512_storeu_ps(crow + 16, r1);
  }
}

#include "gemm-driver.inc"

}  // namespace kern_avx512

void sgemm_avx512(const GemmArgs& g, float* work) { kern_avx512::run_blocked(g, work); }

}  // namespace midpath
