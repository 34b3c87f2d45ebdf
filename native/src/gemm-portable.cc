// Portable sgemm variant: plain C++ compiled for the baseline x86-64 (SSE2) or any other
// architecture; the compiler vectorises the 4×8 register tile.
#include "gemm.h"

namespace midpath {
namespace kern_portable {

static const int MR = 4;
static const int NR = 8;

// C[MR, NR] = alpha · Σ_p a[p, :]ᵀ b[p, :] + beta · C   (a: [kc, MR], b: [kc, NR] packed)
static void micro_kernel(int kc, const float* a, const float* b, float* c, int ldc, float alpha,
                         float beta) {
  float acc[MR][NR] = {};
  for (int p = 0; p < kc; ++p) {
    const float* bp = b + p * NR;
    for (int i = 0; i < MR; ++i) {
      const float ai = a[p * MR + i];
      for (int j = 0; j < NR; ++j) acc[i][j] += ai * bp[j];
    }
  }
  for (int i = 0; i < MR; ++i) {
    float* crow = c + static_cast<long>(i) * ldc;
    for (int j = 0; j < NR; ++j) {
      crow[j] = beta == 0.0f ? alpha * acc[i][j] : alpha * acc[i][j] + beta * crow[j];
    }
  }
}

#include "gemm-driver.inc"

}  // namespace kern_portable

void sgemm_portable(const GemmArgs& g, float* work) { kern_portable::run_blocked(g, work); }

}  // namespace midpath
