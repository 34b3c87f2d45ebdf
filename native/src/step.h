// One contrastive training step over a flat parameter buffer: encoder forward on [x; y],
// objective, backward, global-norm clipping and Adam. Templated on the scalar so that a
// double-precision build can check the gradient against central finite differences.
#pragma once

#include <cmath>
#include <cstring>
#include <vector>

#include "step-config.h"
#include "step-encoder.h"
#include "step-objective.h"

namespace midpath {

/** What one step reports, measured before the update. */
struct StepStats {
  double loss = 0.0;
  double infonce = 0.0;
  double regulariser = 0.0;
  double accuracy = 0.0;
  double gradNorm = std::nan("");
};

template <typename T>
class TrainStep {
 public:
  TrainStep(const StepConfig& cfg, Kernel kernel)
      : cfg_(cfg),
        layout_(make_layout(cfg_)),
        encoder_(cfg_, layout_, kernel),
        objective_(cfg_, kernel),
        params_(layout_.total, T(0)),
        grads_(layout_.total, T(0)),
        m_(layout_.total, T(0)),
        v_(layout_.total, T(0)) {}

  // The encoder and objective hold references to cfg_ and layout_: never copy or move.
  TrainStep(const TrainStep&) = delete;
  TrainStep& operator=(const TrainStep&) = delete;

  const ParamLayout& layout() const { return layout_; }
  std::vector<T>& params() { return params_; }
  const std::vector<T>& grads() const { return grads_; }

  /** Replaces the parameters (layout order, `total` values) and resets Adam. */
  void set_params(const T* flat) {
    std::memcpy(params_.data(), flat, sizeof(T) * layout_.total);
    std::fill(m_.begin(), m_.end(), T(0));
    std::fill(v_.begin(), v_.end(), T(0));
    t_ = 0;
  }

  /** Loss and gradient (unclipped, in grads()) of one batch; x, y are [B, inDim]. */
  StepStats gradient(const T* x, const T* y, int batch) { return run(x, y, batch, true); }

  /** Loss terms without gradient or update (validation). */
  StepStats evaluate(const T* x, const T* y, int batch) { return run(x, y, batch, false); }

  /** One optimiser step; the stats are those of the parameters before the update. */
  StepStats step(const T* x, const T* y, int batch) {
    StepStats stats = run(x, y, batch, true);
    double sq = 0.0;
    for (T g : grads_) sq += double(g) * g;
    stats.gradNorm = std::sqrt(sq);
    // A non-finite loss or gradient is divergence: leave the parameters as they were, so the
    // caller can report the last good state (the TF.js engine does the same).
    if (!std::isfinite(stats.loss) || !std::isfinite(stats.gradNorm)) return stats;
    // Global-norm clipping (Pascanu, Mikolov & Bengio, 2013, Algorithm 2).
    if (cfg_.clip > 0.0 && stats.gradNorm > cfg_.clip) {
      const T k = static_cast<T>(cfg_.clip / stats.gradNorm);
      for (T& g : grads_) g *= k;
    }
    apply_adam();
    return stats;
  }

  /** ψ of n observations x [n, inDim] into out [n, d]. */
  void encode(const T* x, int n, T* out) {
    const T* psi = encoder_.forward(params_.data(), x, n);
    std::memcpy(out, psi, sizeof(T) * static_cast<std::size_t>(n) * cfg_.dim);
  }

 private:
  StepStats run(const T* x, const T* y, int batch, bool wantGrad) {
    const std::size_t half = static_cast<std::size_t>(batch) * cfg_.inDim;
    xy_.resize(2 * half);  // [2B, inDim]: the shared encoder runs once over both sides
    std::memcpy(xy_.data(), x, sizeof(T) * half);
    std::memcpy(xy_.data() + half, y, sizeof(T) * half);
    const T* psi = encoder_.forward(params_.data(), xy_.data(), 2 * batch);
    T* dpsi = nullptr;
    if (wantGrad) {
      dpsi_.assign(static_cast<std::size_t>(2 * batch) * cfg_.dim, T(0));
      dpsi = dpsi_.data();
    }
    T* dA = layout_.hasA ? grads_.data() + layout_.a : nullptr;
    const T* a = layout_.hasA ? params_.data() + layout_.a : nullptr;
    const ObjectiveValue value = objective_.evaluate(a, psi, batch, dpsi, dA);
    if (wantGrad) encoder_.backward(params_.data(), dpsi, grads_.data());
    StepStats stats;
    stats.infonce = value.infonce;
    stats.regulariser = value.regulariser;
    stats.loss = value.infonce + value.regulariser;
    stats.accuracy = value.accuracy;
    return stats;
  }

  // Adam (Kingma & Ba, 2015, Algorithm 1) in the form TF.js uses: ε is added to √v̂.
  void apply_adam() {
    ++t_;
    const double b1 = cfg_.beta1, b2 = cfg_.beta2;
    const double c1 = 1.0 - std::pow(b1, t_), c2 = 1.0 - std::pow(b2, t_);
    const T lr = static_cast<T>(cfg_.lr), eps = static_cast<T>(cfg_.eps);
    const T ib1 = static_cast<T>(1.0 / c1), ib2 = static_cast<T>(1.0 / c2);
    const T fb1 = static_cast<T>(b1), fb2 = static_cast<T>(b2);
    for (std::size_t i = 0; i < layout_.total; ++i) {
      const T g = grads_[i];
      m_[i] = fb1 * m_[i] + (T(1) - fb1) * g;
      v_[i] = fb2 * v_[i] + (T(1) - fb2) * g * g;
      params_[i] -= lr * (m_[i] * ib1) / (std::sqrt(v_[i] * ib2) + eps);
    }
  }

  StepConfig cfg_;
  ParamLayout layout_;
  DenseStack<T> encoder_;
  Objective<T> objective_;
  std::vector<T> params_, grads_, m_, v_, xy_, dpsi_;
  int t_ = 0;
};

}  // namespace midpath
