// Run-time choice of the sgemm variant (compiled with baseline flags only).
#include <cstdlib>
#include <cstring>
#include <memory>

#include "gemm.h"

namespace midpath {

namespace {
const int kMaxNr = 32;
const int kKc = 256, kMc = 120, kNc = 2048;  // must match gemm-driver.inc

struct AlignedFree {
  void operator()(float* p) const { std::free(p); }
};
}  // namespace

std::size_t gemm_workspace_floats() {
  return static_cast<std::size_t>(kMc) * kKc + static_cast<std::size_t>(kKc) * (kNc + kMaxNr);
}

bool kernel_supported(Kernel kernel) {
  switch (kernel) {
    case Kernel::Portable:
      return true;
    case Kernel::Avx2:
#if defined(MIDPATH_X86_KERNELS)
      return __builtin_cpu_supports("avx2") && __builtin_cpu_supports("fma");
#else
      return false;
#endif
    case Kernel::Avx512:
#if defined(MIDPATH_X86_KERNELS)
      // libgcc's probe also checks that the OS saves zmm state (XGETBV), not only CPUID.
      return __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx2") &&
             __builtin_cpu_supports("fma");
#else
      return false;
#endif
  }
  return false;
}

Kernel best_kernel() {
  if (kernel_supported(Kernel::Avx512)) return Kernel::Avx512;
  if (kernel_supported(Kernel::Avx2)) return Kernel::Avx2;
  return Kernel::Portable;
}

const char* kernel_name(Kernel kernel) {
  switch (kernel) {
    case Kernel::Portable:
      return "portable";
    case Kernel::Avx2:
      return "avx2";
    case Kernel::Avx512:
      return "avx512";
  }
  return "portable";
}

bool resolve_kernel(const char* name, Kernel* out, const char** why) {
  if (name == nullptr || name[0] == '\0' || std::strcmp(name, "auto") == 0) {
    *out = best_kernel();
    return true;
  }
  const Kernel all[] = {Kernel::Portable, Kernel::Avx2, Kernel::Avx512};
  for (Kernel k : all) {
    if (std::strcmp(name, kernel_name(k)) != 0) continue;
    if (!kernel_supported(k)) {
      *why = "this CPU (or this build) cannot run that kernel";
      return false;
    }
    *out = k;
    return true;
  }
  *why = "unknown kernel name; expected auto, portable, avx2 or avx512";
  return false;
}

void sgemm(Kernel kernel, const GemmArgs& g) {
  // One workspace per thread: each training step runs on one thread at a time.
  thread_local std::unique_ptr<float, AlignedFree> work(
      static_cast<float*>(std::aligned_alloc(64, ((gemm_workspace_floats() * 4 + 63) / 64) * 64)));
  switch (kernel) {
#if defined(MIDPATH_X86_KERNELS)
    case Kernel::Avx512:
      sgemm_avx512(g, work.get());
      return;
    case Kernel::Avx2:
      sgemm_avx2(g, work.get());
      return;
#endif
    default:
      sgemm_portable(g, work.get());
      return;
  }
}

}  // namespace midpath

#include "gemm-any.h"

namespace midpath {

void gemm_any(Kernel kernel, bool ta, bool tb, int m, int n, int k, float alpha, const float* a,
              int lda, const float* b, int ldb, float beta, float* c, int ldc) {
  sgemm(kernel, GemmArgs{ta, tb, m, n, k, alpha, a, lda, b, ldb, beta, c, ldc});
}

}  // namespace midpath
