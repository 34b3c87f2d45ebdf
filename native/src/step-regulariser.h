// Gaussian-marginal regulariser towards N(0, c I) on the encodings (MATH.md §1), weighted by
// λ: the penalty λ (mean_i ‖ψ_i‖²/d − c)², or the moment KL
// λ · ½ [tr Σ̂/c + ‖μ̂‖²/c − d − log det Σ̂ + d log c] = λ · KL(N(μ̂, Σ̂) ‖ N(0, cI))
// (the KL divergence between Gaussians, Rasmussen & Williams, 2006, App. A.5; equation
// number from memory: A.23), Σ̂ biased.
#pragma once

#include <cmath>
#include <limits>
#include <vector>

#include "step-config.h"

namespace midpath {

/** Lower Cholesky factor of the [d, d] matrix s in place; false when not positive definite. */
inline bool cholesky_in_place(std::vector<double>& s, int d) {
  for (int j = 0; j < d; ++j) {
    double diag = s[j * d + j];
    for (int k = 0; k < j; ++k) diag -= s[j * d + k] * s[j * d + k];
    if (!(diag > 0.0)) return false;
    const double root = std::sqrt(diag);
    s[j * d + j] = root;
    for (int i = j + 1; i < d; ++i) {
      double v = s[i * d + j];
      for (int k = 0; k < j; ++k) v -= s[i * d + k] * s[j * d + k];
      s[i * d + j] = v / root;
    }
    for (int k = j + 1; k < d; ++k) s[j * d + k] = 0.0;
  }
  return true;
}

/** Σ⁻¹ [d, d] from its lower Cholesky factor (solves L Lᵀ X = I column by column). */
inline std::vector<double> inverse_from_cholesky(const std::vector<double>& l, int d) {
  std::vector<double> inv(static_cast<std::size_t>(d) * d, 0.0), col(d);
  for (int c = 0; c < d; ++c) {
    for (int i = 0; i < d; ++i) {  // L y = e_c
      double v = i == c ? 1.0 : 0.0;
      for (int k = 0; k < i; ++k) v -= l[i * d + k] * col[k];
      col[i] = v / l[i * d + i];
    }
    for (int i = d - 1; i >= 0; --i) {  // Lᵀ x = y
      double v = col[i];
      for (int k = i + 1; k < d; ++k) v -= l[k * d + i] * col[k];
      col[i] = v / l[i * d + i];
    }
    for (int i = 0; i < d; ++i) inv[i * d + c] = col[i];
  }
  return inv;
}

template <typename T>
double penalty_regulariser(const StepConfig& cfg, const T* psi, int rows, T* dpsi) {
  const int d = cfg.dim;
  const std::size_t n = static_cast<std::size_t>(rows) * d;
  double sq = 0.0;
  for (std::size_t i = 0; i < n; ++i) sq += double(psi[i]) * psi[i];
  const double gap = sq / (static_cast<double>(rows) * d) - cfg.scale;
  if (dpsi != nullptr) {
    // d/dψ λ (s − c)² = λ · 2 (s − c) · 2ψ / (rows · d)
    const double k = cfg.weight * 4.0 * gap / (static_cast<double>(rows) * d);
    for (std::size_t i = 0; i < n; ++i) dpsi[i] += static_cast<T>(k * psi[i]);
  }
  return cfg.weight * gap * gap;
}

template <typename T>
double kl_regulariser(const StepConfig& cfg, const T* psi, int rows, T* dpsi) {
  const int d = cfg.dim;
  const double c = cfg.scale;
  std::vector<double> mu(d, 0.0), cov(static_cast<std::size_t>(d) * d, 0.0), centred(d);
  for (int r = 0; r < rows; ++r)
    for (int k = 0; k < d; ++k) mu[k] += psi[static_cast<std::size_t>(r) * d + k];
  for (int k = 0; k < d; ++k) mu[k] /= rows;
  for (int r = 0; r < rows; ++r) {
    for (int k = 0; k < d; ++k) centred[k] = psi[static_cast<std::size_t>(r) * d + k] - mu[k];
    for (int i = 0; i < d; ++i)
      for (int j = 0; j < d; ++j) cov[i * d + j] += centred[i] * centred[j];
  }
  double trace = 0.0, musq = 0.0;
  for (int i = 0; i < d * d; ++i) cov[i] /= rows;
  for (int k = 0; k < d; ++k) {
    trace += cov[k * d + k];
    musq += mu[k] * mu[k];
  }
  std::vector<double> chol = cov;
  if (!cholesky_in_place(chol, d)) {
    // A singular batch covariance: the KL is infinite. NaN lets the loop report divergence.
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (dpsi != nullptr)
      for (std::size_t i = 0; i < static_cast<std::size_t>(rows) * d; ++i) dpsi[i] = T(nan);
    return nan;
  }
  double logdet = 0.0;
  for (int k = 0; k < d; ++k) logdet += 2.0 * std::log(chol[k * d + k]);
  const double kl = 0.5 * (trace / c + musq / c - d - logdet + d * std::log(c));
  if (dpsi != nullptr) {
    // dKL/dΣ̂ = ½ (I/c − Σ̂⁻¹); dΣ̂/dψ_r = 2 (ψ_r − μ̂)ᵀ/rows; dKL/dμ̂ = μ̂/c, dμ̂/dψ_r = 1/rows
    std::vector<double> g = inverse_from_cholesky(chol, d);
    for (int i = 0; i < d * d; ++i) g[i] = -0.5 * g[i];
    for (int k = 0; k < d; ++k) g[k * d + k] += 0.5 / c;
    const double w = cfg.weight;
    for (int r = 0; r < rows; ++r) {
      T* out = dpsi + static_cast<std::size_t>(r) * d;
      for (int k = 0; k < d; ++k) centred[k] = psi[static_cast<std::size_t>(r) * d + k] - mu[k];
      for (int i = 0; i < d; ++i) {
        double v = 0.0;
        for (int j = 0; j < d; ++j) v += g[i * d + j] * centred[j];
        out[i] += static_cast<T>(w * (2.0 * v + mu[i] / c) / rows);
      }
    }
  }
  return cfg.weight * kl;
}

/** Adds the weighted regulariser's gradient into dpsi (when non-null); returns its value. */
template <typename T>
double add_regulariser(const StepConfig& cfg, const T* psi, int rows, T* dpsi) {
  switch (cfg.regulariser) {
    case Regulariser::None:
      return 0.0;
    case Regulariser::Penalty:
      return penalty_regulariser(cfg, psi, rows, dpsi);
    case Regulariser::Kl:
      return kl_regulariser(cfg, psi, rows, dpsi);
  }
  return 0.0;
}

}  // namespace midpath
