// Single-precision matrix product C = alpha·op(A)·op(B) + beta·C over row-major buffers, with
// one implementation per instruction set. Each variant lives in its own translation unit,
// compiled with its own flags (binding.gyp), and is chosen at run time from CPUID, so the
// shipped addon never executes an instruction the CPU lacks.
#pragma once

#include <cstddef>

namespace midpath {

/** Instruction-set variants of the sgemm kernel, slowest first. */
enum class Kernel : int { Portable = 0, Avx2 = 1, Avx512 = 2 };

/**
 * Arguments of one product. op(A) is [m, k], op(B) is [k, n], C is [m, n]; all row-major.
 * A is stored [m, lda] (or [k, lda] when transA), B is [k, ldb] (or [n, ldb] when transB).
 * With beta == 0, C is written without being read (it may hold garbage or NaN).
 */
struct GemmArgs {
  bool transA;
  bool transB;
  int m, n, k;
  float alpha;
  const float* a;
  int lda;
  const float* b;
  int ldb;
  float beta;
  float* c;
  int ldc;
};

/** Floats of scratch a kernel needs for packing (the caller owns it, 64-byte aligned). */
std::size_t gemm_workspace_floats();

// One entry per variant; `work` holds gemm_workspace_floats() floats.
void sgemm_portable(const GemmArgs& g, float* work);
#if defined(MIDPATH_X86_KERNELS)
void sgemm_avx2(const GemmArgs& g, float* work);
void sgemm_avx512(const GemmArgs& g, float* work);
#endif

/** True when this build contains `kernel` and the CPU (and OS) can run it. */
bool kernel_supported(Kernel kernel);
/** The fastest variant the CPU supports. */
Kernel best_kernel();
/** 'portable' | 'avx2' | 'avx512'. */
const char* kernel_name(Kernel kernel);
/**
 * Resolves a requested name ("" or "auto" = best). Returns false, leaving `out` untouched,
 * when the name is unknown or the CPU cannot run it; `why` then says which.
 */
bool resolve_kernel(const char* name, Kernel* out, const char** why);

/** Runs one product on the given variant, using a thread-local packing workspace. */
void sgemm(Kernel kernel, const GemmArgs& g);

}  // namespace midpath
