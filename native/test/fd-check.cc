// Test-only build: the training step instantiated in double precision, with its analytic
// gradient compared against central finite differences, (f(θ+h) − f(θ−h)) / 2h, whose error
// is O(h²) (Nocedal & Wright, 2006, eq. 8.7), for every encoder / critic / loss /
// regulariser combination the native engine supports. Compiled and run by
// tests/native/finite-difference.test.ts; prints one JSON object per combination.
#include <cmath>
#include <cstdio>
#include <random>
#include <vector>

#include "step.h"

using namespace midpath;

namespace {

struct Result {
  double maxAbs = 0.0;   // max |analytic − numeric|
  double maxScale = 0.0; // max |numeric|
  double loss = 0.0;
};

Result check(const StepConfig& cfg, unsigned seed) {
  TrainStep<double> step(cfg, Kernel::Portable);
  const ParamLayout& layout = step.layout();
  std::mt19937 rng(seed);
  std::normal_distribution<double> normal(0.0, 1.0);
  std::vector<double> theta(layout.total);
  for (double& v : theta) v = 0.5 * normal(rng);
  if (cfg.layerNorm) {  // gains near 1, as initialised
    for (const LayerSlots& s : layout.layers)
      if (s.hidden)
        for (int j = 0; j < s.out; ++j) theta[s.gain + j] += 1.0;
  }
  const int batch = 8;
  std::vector<double> x(static_cast<std::size_t>(batch) * cfg.inDim), y(x.size());
  for (double& v : x) v = normal(rng);
  for (double& v : y) v = normal(rng);
  step.set_params(theta.data());
  Result out;
  out.loss = step.gradient(x.data(), y.data(), batch).loss;
  const std::vector<double> analytic = step.grads();
  const double h = 1e-5;
  for (std::size_t i = 0; i < layout.total; ++i) {
    std::vector<double> probe = theta;
    probe[i] = theta[i] + h;
    step.set_params(probe.data());
    const double up = step.evaluate(x.data(), y.data(), batch).loss;
    probe[i] = theta[i] - h;
    step.set_params(probe.data());
    const double down = step.evaluate(x.data(), y.data(), batch).loss;
    const double numeric = (up - down) / (2.0 * h);
    out.maxAbs = std::max(out.maxAbs, std::fabs(numeric - analytic[i]));
    out.maxScale = std::max(out.maxScale, std::fabs(numeric));
  }
  return out;
}

const char* const kActs[] = {"relu", "tanh", "gelu", "elu"};
const char* const kCritics[] = {"distance", "distance-identity", "inner"};
const char* const kLosses[] = {"forward", "backward", "symmetric"};
const char* const kRegs[] = {"none", "penalty", "kl"};

}  // namespace

int main() {
  unsigned seed = 1;
  for (int enc = 0; enc < 9; ++enc) {  // 0: linear; 1..8: MLP × 4 activations × layer norm
    for (int critic = 0; critic < 3; ++critic) {
      for (int loss = 0; loss < 3; ++loss) {
        for (int reg = 0; reg < 3; ++reg) {
          StepConfig cfg;
          cfg.inDim = 5;
          cfg.dim = 3;
          if (enc > 0) cfg.widths = {8, 6};
          cfg.activation = static_cast<Activation>(enc > 0 ? (enc - 1) % 4 : 0);
          cfg.layerNorm = enc > 4;
          cfg.critic = static_cast<Critic>(critic);
          cfg.loss = static_cast<LossDirection>(loss);
          cfg.regulariser = static_cast<Regulariser>(reg);
          cfg.weight = 0.7;
          cfg.scale = 1.3;
          const Result r = check(cfg, seed++);
          std::printf(
              "{\"encoder\":\"%s\",\"activation\":\"%s\",\"layerNorm\":%s,\"critic\":\"%s\","
              "\"loss\":\"%s\",\"regulariser\":\"%s\",\"value\":%.17g,\"maxAbsError\":%.6g,"
              "\"maxGradient\":%.6g}\n",
              enc == 0 ? "linear" : "mlp", kActs[static_cast<int>(cfg.activation)],
              cfg.layerNorm ? "true" : "false", kCritics[critic], kLosses[loss], kRegs[reg],
              r.loss, r.maxAbs, r.maxScale);
        }
      }
    }
  }
  return 0;
}
