// exp over a row of logits, the only transcendental in the step's hot loop (2·B² calls).
// float: a branch-free Cody–Waite range reduction and a degree-6 polynomial, written so the
// compiler vectorises it (libm's expf does not vectorise under baseline flags); relative
// error below 2e-7 on [-87, 88] (Cody & Waite, 1980, ch. 6; coefficients are the Taylor
// series of e^r, |r| ≤ ln2/2). double (test build): std::exp.
#pragma once

#include <cmath>
#include <cstdint>
#include <cstring>

namespace midpath {

/** out[j] = exp(in[j] − shift) for j < n. */
inline void exp_shifted(const float* in, float shift, float* out, int n) {
  const float log2e = 1.44269504088896341f;
  const float ln2hi = 0.693359375f, ln2lo = -2.12194440e-4f;
  for (int j = 0; j < n; ++j) {
    float x = in[j] - shift;
    x = x < -87.0f ? -87.0f : (x > 88.0f ? 88.0f : x);
    // Round to nearest by adding and removing 1.5·2²³ (exact for |v| < 2²²; vectorises
    // under SSE2, where floor would be a call). Not valid under -ffast-math.
    const float fn = (x * log2e + 12582912.0f) - 12582912.0f;
    const float r = (x - fn * ln2hi) - fn * ln2lo;
    float p = 1.0f / 720.0f;
    p = p * r + 1.0f / 120.0f;
    p = p * r + 1.0f / 24.0f;
    p = p * r + 1.0f / 6.0f;
    p = p * r + 0.5f;
    p = p * r + 1.0f;
    p = p * r + 1.0f;
    const std::int32_t bits = (static_cast<std::int32_t>(fn) + 127) << 23;
    float scale;
    std::memcpy(&scale, &bits, sizeof scale);
    out[j] = p * scale;
  }
}

inline void exp_shifted(const double* in, double shift, double* out, int n) {
  for (int j = 0; j < n; ++j) out[j] = std::exp(in[j] - shift);
}

}  // namespace midpath
