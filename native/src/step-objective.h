// The contrastive objective on a batch of encodings: critic logits, InfoNCE in the chosen
// direction(s), the Gaussian-marginal regulariser, and the gradient with respect to the
// encodings and A (MATH.md §1; semantics of runner/training/engine.ts).
#pragma once

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

#include "gemm-any.h"
#include "step-config.h"
#include "step-exp.h"
#include "step-regulariser.h"

namespace midpath {

/** Loss terms of one batch. */
struct ObjectiveValue {
  double infonce = 0.0;
  double regulariser = 0.0;
  double accuracy = 0.0;
};

template <typename T>
class Objective {
 public:
  Objective(const StepConfig& cfg, Kernel kernel) : cfg_(cfg), kernel_(kernel) {}

  /**
   * psi [2B, d]: rows 0..B are ψ(x), rows B..2B are ψ(y). With `dpsi` non-null, writes
   * dTotal/dψ [2B, d] there and dTotal/dA [d, d] into `dA` (when A is learned).
   */
  ObjectiveValue evaluate(const T* a, const T* psi, int batch, T* dpsi, T* dA) {
    const int d = cfg_.dim;
    const int n = batch;
    const T* px = psi;                                 // [B, d]
    const T* py = psi + static_cast<std::size_t>(n) * d;  // [B, d]
    u_.resize(static_cast<std::size_t>(n) * d);
    logits_.resize(static_cast<std::size_t>(n) * n);
    const T* u = project(a, px, n);
    // L = u vᵀ (− ½‖u_i‖² − ½‖v_j‖² for the distance critics)   [B, B]
    gemm_any(kernel_, false, true, n, n, d, T(1), u, d, py, d, T(0), logits_.data(), n);
    if (cfg_.critic != Critic::Inner) subtract_norms(u, py, n);
    ObjectiveValue value;
    value.infonce = infonce(n, dpsi != nullptr, &value.accuracy);
    if (dpsi != nullptr) {
      backprop_logits(a, px, py, u, n, dpsi, dA);
    }
    value.regulariser = add_regulariser(cfg_, psi, 2 * n, dpsi);
    return value;
  }

 private:
  // u = ψx Aᵀ (distance), ψx (identity), ψx A (inner)   [B, d]
  const T* project(const T* a, const T* px, int n) {
    const int d = cfg_.dim;
    switch (cfg_.critic) {
      case Critic::DistanceIdentity:
        return px;
      case Critic::Distance:
        gemm_any(kernel_, false, true, n, d, d, T(1), px, d, a, d, T(0), u_.data(), d);
        return u_.data();
      case Critic::Inner:
        gemm_any(kernel_, false, false, n, d, d, T(1), px, d, a, d, T(0), u_.data(), d);
        return u_.data();
    }
    return px;
  }

  void subtract_norms(const T* u, const T* v, int n) {
    const int d = cfg_.dim;
    nu_.assign(n, T(0));
    nv_.assign(n, T(0));
    for (int i = 0; i < n; ++i) {
      double su = 0.0, sv = 0.0;
      for (int k = 0; k < d; ++k) {
        su += double(u[i * d + k]) * u[i * d + k];
        sv += double(v[i * d + k]) * v[i * d + k];
      }
      nu_[i] = static_cast<T>(su);
      nv_[i] = static_cast<T>(sv);
    }
    for (int i = 0; i < n; ++i) {
      T* row = logits_.data() + static_cast<std::size_t>(i) * n;
      for (int j = 0; j < n; ++j) row[j] -= T(0.5) * (nu_[i] + nv_[j]);
    }
  }

  // InfoNCE (van den Oord et al., 2018, eq. 4) with max-subtracted logsumexp. Forward uses
  // rows (x retrieves its y), backward columns, symmetric the mean. Fills grad_ = dLoss/dL
  // and the row and column sums of it. Every pass walks rows, so it stays contiguous.
  double infonce(int n, bool wantGrad, double* accuracy) {
    const bool fwd = cfg_.loss != LossDirection::Backward;
    const bool bwd = cfg_.loss != LossDirection::Forward;
    const double wf = fwd && bwd ? 0.5 : (fwd ? 1.0 : 0.0);
    const double wb = fwd && bwd ? 0.5 : (bwd ? 1.0 : 0.0);
    const std::size_t nn = static_cast<std::size_t>(n) * n;
    if (wantGrad) grad_.assign(nn, T(0));
    expo_.resize(nn);
    double loss = 0.0, acc = 0.0;
    if (fwd) loss += wf * rows_direction(n, wf, wantGrad, &acc);
    if (bwd) {
      double accB = 0.0;
      loss += wb * columns_direction(n, wb, wantGrad, &accB);
      acc = fwd ? 0.5 * (acc + accB) : accB;
    }
    *accuracy = acc;
    if (wantGrad) sum_grad_lines(n);
    return loss;
  }

  // −mean_i [L_ii − lse_j L_ij]; adds weight·(softmax_row − I)/n into grad_.
  double rows_direction(int n, double weight, bool wantGrad, double* acc) {
    double total = 0.0;
    int hits = 0;
    for (int i = 0; i < n; ++i) {
      const T* line = logits_.data() + static_cast<std::size_t>(i) * n;
      T* e = expo_.data() + static_cast<std::size_t>(i) * n;
      T mx = line[0];
      int arg = 0;
      for (int j = 1; j < n; ++j) {
        if (line[j] > mx) {
          mx = line[j];
          arg = j;
        }
      }
      exp_shifted(line, mx, e, n);
      double sum = 0.0;
      for (int j = 0; j < n; ++j) sum += e[j];
      total += double(mx) + std::log(sum) - line[i];
      if (arg == i) ++hits;
      if (!wantGrad) continue;
      T* g = grad_.data() + static_cast<std::size_t>(i) * n;
      const T k = static_cast<T>(weight / (n * sum));
      for (int j = 0; j < n; ++j) g[j] += k * e[j];
      g[i] -= static_cast<T>(weight / n);
    }
    *acc = static_cast<double>(hits) / n;
    return total / n;
  }

  // −mean_j [L_jj − lse_i L_ij]; adds weight·(softmax_column − I)/n into grad_.
  double columns_direction(int n, double weight, bool wantGrad, double* acc) {
    colMax_.assign(logits_.begin(), logits_.begin() + n);
    colArg_.assign(n, 0);
    for (int i = 1; i < n; ++i) {
      const T* line = logits_.data() + static_cast<std::size_t>(i) * n;
      for (int j = 0; j < n; ++j) {
        if (line[j] > colMax_[j]) {
          colMax_[j] = line[j];
          colArg_[j] = i;
        }
      }
    }
    colSum_.assign(n, 0.0);
    for (int i = 0; i < n; ++i) {
      const T* line = logits_.data() + static_cast<std::size_t>(i) * n;
      T* e = expo_.data() + static_cast<std::size_t>(i) * n;
      for (int j = 0; j < n; ++j) e[j] = line[j] - colMax_[j];
      exp_shifted(e, T(0), e, n);
      for (int j = 0; j < n; ++j) colSum_[j] += e[j];
    }
    double total = 0.0;
    int hits = 0;
    for (int j = 0; j < n; ++j) {
      total += double(colMax_[j]) + std::log(colSum_[j]) - logits_[static_cast<std::size_t>(j) * n + j];
      if (colArg_[j] == j) ++hits;
    }
    *acc = static_cast<double>(hits) / n;
    if (wantGrad) {
      colScale_.resize(n);
      for (int j = 0; j < n; ++j) colScale_[j] = static_cast<T>(weight / (n * colSum_[j]));
      for (int i = 0; i < n; ++i) {
        const T* e = expo_.data() + static_cast<std::size_t>(i) * n;
        T* g = grad_.data() + static_cast<std::size_t>(i) * n;
        for (int j = 0; j < n; ++j) g[j] += colScale_[j] * e[j];
        g[i] -= static_cast<T>(weight / n);
      }
    }
    return total / n;
  }

  // rowSum_[i] = Σ_j G_ij, colSumG_[j] = Σ_i G_ij (the distance critics need both).
  void sum_grad_lines(int n) {
    rowSumG_.assign(n, T(0));
    colSumG_.assign(n, T(0));
    for (int i = 0; i < n; ++i) {
      const T* g = grad_.data() + static_cast<std::size_t>(i) * n;
      T rs = T(0);
      for (int j = 0; j < n; ++j) {
        rs += g[j];
        colSumG_[j] += g[j];
      }
      rowSumG_[i] = rs;
    }
  }

  // From G = dLoss/dL to dψx, dψy and dA.
  void backprop_logits(const T* a, const T* px, const T* py, const T* u, int n, T* dpsi, T* dA) {
    const int d = cfg_.dim;
    const T* G = grad_.data();
    du_.resize(static_cast<std::size_t>(n) * d);
    T* dpy = dpsi + static_cast<std::size_t>(n) * d;
    // du = G v [B, d]; dv = Gᵀ u [B, d]
    gemm_any(kernel_, false, false, n, d, n, T(1), G, n, py, d, T(0), du_.data(), d);
    gemm_any(kernel_, true, false, n, d, n, T(1), G, n, u, d, T(0), dpy, d);
    if (cfg_.critic != Critic::Inner) {
      // the −½‖u_i‖² − ½‖v_j‖² terms: du_i −= (Σ_j G_ij) u_i, dv_j −= (Σ_i G_ij) v_j
      for (int i = 0; i < n; ++i) {
        for (int k = 0; k < d; ++k) {
          du_[i * d + k] -= rowSumG_[i] * u[i * d + k];
          dpy[i * d + k] -= colSumG_[i] * py[i * d + k];
        }
      }
    }
    switch (cfg_.critic) {
      case Critic::DistanceIdentity:
        std::copy(du_.begin(), du_.end(), dpsi);
        return;
      case Critic::Distance:  // u = ψx Aᵀ: dψx = du A, dA = duᵀ ψx
        gemm_any(kernel_, false, false, n, d, d, T(1), du_.data(), d, a, d, T(0), dpsi, d);
        gemm_any(kernel_, true, false, d, d, n, T(1), du_.data(), d, px, d, T(0), dA, d);
        return;
      case Critic::Inner:  // u = ψx A: dψx = du Aᵀ, dA = ψxᵀ du
        gemm_any(kernel_, false, true, n, d, d, T(1), du_.data(), d, a, d, T(0), dpsi, d);
        gemm_any(kernel_, true, false, d, d, n, T(1), px, d, du_.data(), d, T(0), dA, d);
        return;
    }
  }

  const StepConfig& cfg_;
  Kernel kernel_;
  std::vector<T> u_, logits_, grad_, du_, nu_, nv_;
  std::vector<T> expo_, colMax_, colScale_, rowSumG_, colSumG_;  // [B, B] and [B]
  std::vector<int> colArg_;
  std::vector<double> colSum_;
};

}  // namespace midpath
