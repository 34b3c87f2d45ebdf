// Matrix product overloaded on the scalar type, so the training step can be a template:
// float goes to the dispatched sgemm; double (the finite-difference test build) goes to a
// plain triple loop, which is exact enough to check gradients against.
#pragma once

#include "gemm.h"

namespace midpath {

/** C = alpha·op(A)·op(B) + beta·C, row-major (see GemmArgs). */
void gemm_any(Kernel kernel, bool ta, bool tb, int m, int n, int k, float alpha, const float* a,
              int lda, const float* b, int ldb, float beta, float* c, int ldc);

/** Double-precision reference product (test build only). */
inline void gemm_any(Kernel, bool ta, bool tb, int m, int n, int k, double alpha,
                     const double* a, int lda, const double* b, int ldb, double beta, double* c,
                     int ldc) {
  for (int i = 0; i < m; ++i) {
    for (int j = 0; j < n; ++j) {
      double s = 0.0;
      for (int p = 0; p < k; ++p) {
        const double av = ta ? a[static_cast<long>(p) * lda + i] : a[static_cast<long>(i) * lda + p];
        const double bv = tb ? b[static_cast<long>(j) * ldb + p] : b[static_cast<long>(p) * ldb + j];
        s += av * bv;
      }
      double& cv = c[static_cast<long>(i) * ldc + j];
      cv = beta == 0.0 ? alpha * s : alpha * s + beta * cv;
    }
  }
}

}  // namespace midpath
