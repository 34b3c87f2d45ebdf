// Reading the addon's JavaScript arguments: the engine options object, kernel names, typed
// arrays; every check fails with a TypeError that says what was expected and what came.
#pragma once

#include <napi.h>

#include <initializer_list>
#include <string>
#include <utility>

#include "gemm.h"
#include "step.h"

namespace midpath {
namespace addon_args {

inline std::string get_string(const Napi::Object& o, const char* key, const char* fallback) {
  const Napi::Value v = o.Get(key);
  return v.IsString() ? v.As<Napi::String>().Utf8Value() : std::string(fallback);
}

inline double get_number(const Napi::Object& o, const char* key, double fallback) {
  const Napi::Value v = o.Get(key);
  return v.IsNumber() ? v.As<Napi::Number>().DoubleValue() : fallback;
}

[[noreturn]] inline void fail(Napi::Env env, const std::string& message) {
  throw Napi::TypeError::New(env, "midpath native: " + message);
}

template <typename E>
E pick(Napi::Env env, const std::string& key, const std::string& value,
       std::initializer_list<std::pair<const char*, E>> options) {
  std::string allowed;
  for (const auto& o : options) {
    if (value == o.first) return o.second;
    allowed += allowed.empty() ? o.first : std::string(", ") + o.first;
  }
  fail(env, "expected " + key + " to be one of " + allowed + ", got '" + value + "'");
}

inline int get_positive_int(Napi::Env env, const Napi::Object& o, const char* key) {
  const double v = get_number(o, key, -1);
  if (!(v >= 1) || v != static_cast<int>(v)) {
    fail(env, std::string("expected ") + key + " to be a positive integer");
  }
  return static_cast<int>(v);
}

inline StepConfig read_config(Napi::Env env, const Napi::Object& o) {
  StepConfig c;
  c.inDim = get_positive_int(env, o, "inDim");
  c.dim = get_positive_int(env, o, "dim");
  const Napi::Value widths = o.Get("widths");
  if (widths.IsArray()) {
    const Napi::Array arr = widths.As<Napi::Array>();
    for (uint32_t i = 0; i < arr.Length(); ++i) {
      const double w = arr.Get(i).As<Napi::Number>().DoubleValue();
      if (!(w >= 1) || w != static_cast<int>(w)) fail(env, "expected widths of positive integers");
      c.widths.push_back(static_cast<int>(w));
    }
  }
  c.activation = pick<Activation>(env, "activation", get_string(o, "activation", "relu"),
                                  {{"relu", Activation::Relu},
                                   {"tanh", Activation::Tanh},
                                   {"gelu", Activation::Gelu},
                                   {"elu", Activation::Elu}});
  c.layerNorm = o.Get("layerNorm").ToBoolean().Value();
  c.critic = pick<Critic>(env, "critic", get_string(o, "critic", "distance"),
                          {{"distance", Critic::Distance},
                           {"distance-identity", Critic::DistanceIdentity},
                           {"inner", Critic::Inner}});
  c.loss = pick<LossDirection>(env, "loss", get_string(o, "loss", "symmetric"),
                               {{"forward", LossDirection::Forward},
                                {"backward", LossDirection::Backward},
                                {"symmetric", LossDirection::Symmetric}});
  c.regulariser = pick<Regulariser>(env, "regulariser", get_string(o, "regulariser", "penalty"),
                                    {{"none", Regulariser::None},
                                     {"penalty", Regulariser::Penalty},
                                     {"kl", Regulariser::Kl}});
  c.weight = get_number(o, "weight", c.weight);
  c.scale = get_number(o, "scale", c.scale);
  c.clip = get_number(o, "clip", c.clip);
  c.lr = get_number(o, "lr", c.lr);
  c.beta1 = get_number(o, "beta1", c.beta1);
  c.beta2 = get_number(o, "beta2", c.beta2);
  c.eps = get_number(o, "epsilon", c.eps);
  c.lnEps = get_number(o, "layerNormEpsilon", c.lnEps);
  return c;
}

inline Kernel read_kernel(Napi::Env env, const std::string& requested) {
  Kernel k = Kernel::Portable;
  const char* why = "";
  if (!resolve_kernel(requested.c_str(), &k, &why)) {
    fail(env, "kernel '" + requested + "' cannot run: " + why);
  }
  return k;
}

inline Napi::Object stats_object(Napi::Env env, const StepStats& s) {
  Napi::Object o = Napi::Object::New(env);
  o.Set("loss", s.loss);
  o.Set("infonce", s.infonce);
  o.Set("regulariser", s.regulariser);
  o.Set("accuracy", s.accuracy);
  o.Set("gradNorm", s.gradNorm);
  return o;
}

inline const float* float_data(Napi::Env env, const Napi::Value& v, std::size_t need, const char* what) {
  if (!v.IsTypedArray() || v.As<Napi::TypedArray>().TypedArrayType() != napi_float32_array) {
    fail(env, std::string("expected ") + what + " to be a Float32Array");
  }
  const Napi::Float32Array a = v.As<Napi::Float32Array>();
  if (a.ElementLength() < need) {
    fail(env, std::string("expected ") + what + " to hold at least " + std::to_string(need) +
                  " floats, got " + std::to_string(a.ElementLength()));
  }
  return a.Data();
}

}  // namespace addon_args
}  // namespace midpath
