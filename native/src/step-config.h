// Configuration and parameter layout of the contrastive training step (see
// runner/training/engine.ts for the layout every engine shares).
#pragma once

#include <cstddef>
#include <vector>

namespace midpath {

enum class Activation { Relu, Tanh, Gelu, Elu };
enum class Critic { Distance, DistanceIdentity, Inner };
enum class LossDirection { Forward, Backward, Symmetric };
enum class Regulariser { None, Penalty, Kl };

/** Everything that fixes the arithmetic of one step; plain values. */
struct StepConfig {
  int inDim = 0;
  std::vector<int> widths;  // hidden widths; empty for a linear encoder
  int dim = 0;              // representation dimension d
  Activation activation = Activation::Relu;
  bool layerNorm = false;
  Critic critic = Critic::Distance;
  LossDirection loss = LossDirection::Symmetric;
  Regulariser regulariser = Regulariser::Penalty;
  double weight = 1.0;  // λ
  double scale = 1.0;   // c
  double clip = 1.0;    // 0 = off
  double lr = 1e-3;
  double beta1 = 0.9, beta2 = 0.999, eps = 1e-7;  // Adam; ε added to √v̂ as TF.js does
  double lnEps = 1e-5;
};

/** Where one dense layer's arrays sit in the flat parameter buffer. */
struct LayerSlots {
  int in = 0, out = 0;
  bool hidden = false;
  std::size_t w = 0, b = 0, gain = 0, shift = 0;  // gain/shift valid when layer norm is on
};

/** Offsets of every array, in the order of the shared layout. */
struct ParamLayout {
  std::vector<LayerSlots> layers;
  std::size_t a = 0;  // offset of A [d, d]; valid when hasA
  bool hasA = false;
  std::size_t total = 0;
  std::vector<std::size_t> sizes;  // length of each array, in layout order
};

inline ParamLayout make_layout(const StepConfig& cfg) {
  ParamLayout out;
  int input = cfg.inDim;
  const int count = static_cast<int>(cfg.widths.size()) + 1;
  std::size_t at = 0;
  auto take = [&](std::size_t n) {
    const std::size_t here = at;
    at += n;
    out.sizes.push_back(n);
    return here;
  };
  for (int l = 0; l < count; ++l) {
    LayerSlots s;
    s.in = input;
    s.out = l + 1 < count ? cfg.widths[l] : cfg.dim;
    s.hidden = l + 1 < count;
    s.w = take(static_cast<std::size_t>(s.in) * s.out);
    s.b = take(s.out);
    if (s.hidden && cfg.layerNorm) {
      s.gain = take(s.out);
      s.shift = take(s.out);
    }
    out.layers.push_back(s);
    input = s.out;
  }
  out.hasA = cfg.critic != Critic::DistanceIdentity;
  if (out.hasA) out.a = take(static_cast<std::size_t>(cfg.dim) * cfg.dim);
  out.total = at;
  return out;
}

}  // namespace midpath
