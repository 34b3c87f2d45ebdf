// Forward and backward pass of the dense encoder stack (linear or MLP) over row-major
// buffers: hidden layers h = act(LN(x W + b)), output ψ = h W + b (layout and semantics of
// runner/training/engine.ts). Templated on the scalar so a double build can check gradients.
#pragma once

#include <algorithm>
#include <cmath>
#include <utility>
#include <vector>

#include "gemm-any.h"
#include "step-config.h"

namespace midpath {

/** act(u) for one element. gelu is the tanh form (Hendrycks & Gimpel, 2016, §2). */
template <typename T>
inline T activate(Activation kind, T u) {
  switch (kind) {
    case Activation::Relu:
      return u < T(0) ? T(0) : u;
    case Activation::Tanh:
      return std::tanh(u);
    case Activation::Elu:  // Clevert et al., 2016, eq. 15, α = 1
      return u > T(0) ? u : std::expm1(u);
    case Activation::Gelu: {
      const T s = T(0.7978845608028654);  // √(2/π)
      return T(0.5) * u * (T(1) + std::tanh(s * (u + T(0.044715) * u * u * u)));
    }
  }
  return u;
}

/** d act / du at u, given a = act(u). */
template <typename T>
inline T activate_slope(Activation kind, T u, T a) {
  switch (kind) {
    case Activation::Relu:
      return u > T(0) ? T(1) : T(0);
    case Activation::Tanh:
      return T(1) - a * a;
    case Activation::Elu:
      return u > T(0) ? T(1) : a + T(1);
    case Activation::Gelu: {
      const T s = T(0.7978845608028654);
      const T t = std::tanh(s * (u + T(0.044715) * u * u * u));
      return T(0.5) * (T(1) + t) +
             T(0.5) * u * (T(1) - t * t) * s * (T(1) + T(3 * 0.044715) * u * u);
    }
  }
  return T(1);
}

/** a[i] = act(u[i]) for i < n; one loop per kind so the simple ones vectorise. */
template <typename T>
void activate_all(Activation kind, const T* u, T* a, std::size_t n) {
  switch (kind) {
    case Activation::Relu:
      // u < 0 ? 0 : u, not u > 0 ? u : 0: a NaN must pass through and show as divergence.
      for (std::size_t i = 0; i < n; ++i) a[i] = u[i] < T(0) ? T(0) : u[i];
      return;
    case Activation::Tanh:
      for (std::size_t i = 0; i < n; ++i) a[i] = activate(Activation::Tanh, u[i]);
      return;
    case Activation::Elu:
      for (std::size_t i = 0; i < n; ++i) a[i] = activate(Activation::Elu, u[i]);
      return;
    case Activation::Gelu:
      for (std::size_t i = 0; i < n; ++i) a[i] = activate(Activation::Gelu, u[i]);
      return;
  }
}

/** d[i] *= act'(u[i]) given a = act(u); one loop per kind. */
template <typename T>
void multiply_slope(Activation kind, const T* u, const T* a, T* d, std::size_t n) {
  switch (kind) {
    case Activation::Relu:
      for (std::size_t i = 0; i < n; ++i) d[i] = u[i] > T(0) ? d[i] : T(0);
      return;
    case Activation::Tanh:
      for (std::size_t i = 0; i < n; ++i) d[i] *= T(1) - a[i] * a[i];
      return;
    case Activation::Elu:
      for (std::size_t i = 0; i < n; ++i) d[i] *= u[i] > T(0) ? T(1) : a[i] + T(1);
      return;
    case Activation::Gelu:
      for (std::size_t i = 0; i < n; ++i) d[i] *= activate_slope(Activation::Gelu, u[i], a[i]);
      return;
  }
}

/** The dense stack: keeps the activations of the last forward pass for the backward pass. */
template <typename T>
class DenseStack {
 public:
  DenseStack(const StepConfig& cfg, const ParamLayout& layout, Kernel kernel)
      : cfg_(cfg), layout_(layout), kernel_(kernel) {}

  /** ψ of `rows` inputs x [rows, inDim] (x must outlive backward()). Returns [rows, d]. */
  const T* forward(const T* params, const T* x, int rows) {
    resize(rows);
    const T* h = x;
    const int count = static_cast<int>(layout_.layers.size());
    for (int l = 0; l < count; ++l) {
      const LayerSlots& s = layout_.layers[l];
      T* z = s.hidden ? pre_[l].data() : out_.data();  // [rows, out]
      gemm_any(kernel_, false, false, rows, s.out, s.in, T(1), h, s.in, params + s.w, s.out,
               T(0), z, s.out);
      add_bias(z, params + s.b, rows, s.out);
      inputs_[l] = h;
      if (!s.hidden) break;
      if (cfg_.layerNorm) normalise(l, params, rows);
      T* a = post_[l].data();
      activate_all(cfg_.activation, z, a, static_cast<std::size_t>(rows) * s.out);
      h = a;
    }
    return out_.data();
  }

  /** Backpropagates dψ [rows, d] (overwritten) and writes every encoder gradient. */
  void backward(const T* params, T* dpsi, T* grads) {
    const int rows = rows_;
    T* dz = dpsi;
    for (int l = static_cast<int>(layout_.layers.size()) - 1; l >= 0; --l) {
      const LayerSlots& s = layout_.layers[l];
      // dW = hᵀ dz [in, out]; db = Σ_rows dz
      gemm_any(kernel_, true, false, s.in, s.out, rows, T(1), inputs_[l], s.in, dz, s.out, T(0),
               grads + s.w, s.out);
      sum_columns(dz, rows, s.out, grads + s.b);
      if (l == 0) break;
      const LayerSlots& prev = layout_.layers[l - 1];
      T* dh = (dz == scratch_a_.data()) ? scratch_b_.data() : scratch_a_.data();  // [rows, in]
      gemm_any(kernel_, false, true, rows, s.in, s.out, T(1), dz, s.out, params + s.w, s.out,
               T(0), dh, s.in);
      through_activation(l - 1, dh, rows, prev.out);
      if (cfg_.layerNorm) through_norm(l - 1, params, grads, dh, rows);
      dz = dh;
    }
  }

 private:
  void resize(int rows) {
    rows_ = rows;
    const std::size_t count = layout_.layers.size();
    pre_.resize(count);
    post_.resize(count);
    xhat_.resize(count);
    rstd_.resize(count);
    inputs_.assign(count, nullptr);
    std::size_t widest = 1;
    for (std::size_t l = 0; l < count; ++l) {
      const LayerSlots& s = layout_.layers[l];
      const std::size_t n = static_cast<std::size_t>(rows) * s.out;
      widest = std::max<std::size_t>(widest, static_cast<std::size_t>(std::max(s.in, s.out)));
      if (!s.hidden) continue;
      pre_[l].resize(n);
      post_[l].resize(n);
      if (cfg_.layerNorm) {
        xhat_[l].resize(n);
        rstd_[l].resize(rows);
      }
    }
    out_.resize(static_cast<std::size_t>(rows) * cfg_.dim);
    scratch_a_.resize(widest * rows);
    scratch_b_.resize(widest * rows);
  }

  static void add_bias(T* z, const T* b, int rows, int cols) {
    for (int i = 0; i < rows; ++i) {
      T* row = z + static_cast<std::size_t>(i) * cols;
      for (int j = 0; j < cols; ++j) row[j] += b[j];
    }
  }

  // out[j] = Σ_i m[i, j], accumulated row by row (contiguous, vectorises).
  static void sum_columns(const T* m, int rows, int cols, T* out) {
    for (int j = 0; j < cols; ++j) out[j] = T(0);
    for (int i = 0; i < rows; ++i) {
      const T* row = m + static_cast<std::size_t>(i) * cols;
      for (int j = 0; j < cols; ++j) out[j] += row[j];
    }
  }

  // Layer norm over the features of each row (Ba, Kiros & Hinton, 2016, eq. 4), biased
  // variance, in place on pre_[l]: pre ← gain · x̂ + shift.
  void normalise(int l, const T* params, int rows) {
    const LayerSlots& s = layout_.layers[l];
    const int n = s.out;
    for (int i = 0; i < rows; ++i) {
      T* z = pre_[l].data() + static_cast<std::size_t>(i) * n;
      T* xh = xhat_[l].data() + static_cast<std::size_t>(i) * n;
      double mean = 0.0, var = 0.0;
      for (int j = 0; j < n; ++j) mean += z[j];
      mean /= n;
      for (int j = 0; j < n; ++j) var += (z[j] - mean) * (z[j] - mean);
      var /= n;
      const T r = static_cast<T>(1.0 / std::sqrt(var + cfg_.lnEps));
      rstd_[l][i] = r;
      for (int j = 0; j < n; ++j) {
        xh[j] = (z[j] - static_cast<T>(mean)) * r;
        z[j] = params[s.gain + j] * xh[j] + params[s.shift + j];
      }
    }
  }

  // dh ← dh ⊙ act'(pre) for hidden layer l.
  void through_activation(int l, T* dh, int rows, int cols) {
    multiply_slope(cfg_.activation, pre_[l].data(), post_[l].data(), dh,
                   static_cast<std::size_t>(rows) * cols);
  }

  // Layer-norm backward, in place: dy → dz = r (dx̂ − mean dx̂ − x̂ mean(dx̂ ⊙ x̂)), dx̂ = dy ⊙ gain.
  void through_norm(int l, const T* params, T* grads, T* d, int rows) {
    const LayerSlots& s = layout_.layers[l];
    const int n = s.out;
    std::vector<double> dgain(n, 0.0), dshift(n, 0.0);
    for (int i = 0; i < rows; ++i) {
      T* dy = d + static_cast<std::size_t>(i) * n;
      const T* xh = xhat_[l].data() + static_cast<std::size_t>(i) * n;
      double m1 = 0.0, m2 = 0.0;
      for (int j = 0; j < n; ++j) {
        dgain[j] += dy[j] * xh[j];
        dshift[j] += dy[j];
        const double dx = dy[j] * params[s.gain + j];
        m1 += dx;
        m2 += dx * xh[j];
      }
      m1 /= n;
      m2 /= n;
      const double r = rstd_[l][i];
      for (int j = 0; j < n; ++j) {
        const double dx = dy[j] * params[s.gain + j];
        dy[j] = static_cast<T>(r * (dx - m1 - xh[j] * m2));
      }
    }
    for (int j = 0; j < n; ++j) {
      grads[s.gain + j] = static_cast<T>(dgain[j]);
      grads[s.shift + j] = static_cast<T>(dshift[j]);
    }
  }

  const StepConfig& cfg_;
  const ParamLayout& layout_;
  Kernel kernel_;
  int rows_ = 0;
  std::vector<const T*> inputs_;      // input of layer l [rows, in_l]
  std::vector<std::vector<T>> pre_;   // hidden l: pre-activation [rows, out_l]
  std::vector<std::vector<T>> post_;  // hidden l: act(pre) [rows, out_l]
  std::vector<std::vector<T>> xhat_;  // hidden l with layer norm: x̂ [rows, out_l]
  std::vector<std::vector<T>> rstd_;  // hidden l with layer norm: 1/σ [rows]
  std::vector<T> out_;                // ψ [rows, d]
  std::vector<T> scratch_a_, scratch_b_;
};

}  // namespace midpath
