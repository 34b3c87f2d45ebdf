// AVX2 + FMA sgemm variant, compiled with -mavx2 -mfma in its own static library
// (binding.gyp) and only ever called after CPUID says the CPU supports both.
#include <immintrin.h>

#include "gemm.h"

namespace midpath {
namespace kern_avx2 {

static const int MR = 6;
static const int NR = 16;

// 6×16 register tile: 12 ymm accumulators, 2 ymm of B and one broadcast of A per k step.
static void micro_kernel(int kc, const float* a, const float* b, float* c, int ldc, float alpha,
                         float beta) {
  __m256 acc[MR][2];
#pragma GCC unroll 6
  for (int i = 0; i < MR; ++i) {
    acc[i][0] = _mm256_setzero_ps();
    acc[i][1] = _mm256_setzero_ps();
  }
  for (int p = 0; p < kc; ++p) {
    const __m256 b0 = _mm256_loadu_ps(b + p * NR);
    const __m256 b1 = _mm256_loadu_ps(b + p * NR + 8);
#pragma GCC unroll 6
    for (int i = 0; i < MR; ++i) {
      const __m256 ai = _mm256_broadcast_ss(a + p * MR + i);
      acc[i][0] = _mm256_fmadd_ps(ai, b0, acc[i][0]);
      acc[i][1] = _mm256_fmadd_ps(ai, b1, acc[i][1]);
    }
  }
  const __m256 va = _mm256_set1_ps(alpha);
  const __m256 vb = _mm256_set1_ps(beta);
#pragma GCC unroll 6
  for (int i = 0; i < MR; ++i) {
    float* crow = c + static_cast<long>(i) * ldc;
    __m256 r0 = _mm256_mul_ps(va, acc[i][0]);
    __m256 r1 = _mm256_mul_ps(va, acc[i][1]);
    if (beta != 0.0f) {
      r0 = _mm256_fmadd_ps(vb, _mm256_loadu_ps(crow), r0);
      r1 = _mm256_fmadd_ps(vb, _mm256_loadu_ps(crow + 8), r1);
    }
    _mm256_storeu_ps(crow, r0);
    _mm256_storeu_ps(crow + 8, r1);
  }
}

#include "gemm-driver.inc"

}  // namespace kern_avx2

void sgemm_avx2(const GemmArgs& g, float* work) { kern_avx2::run_blocked(g, work); }

}  // namespace midpath
