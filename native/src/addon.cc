// N-API binding of the native training engine: the Engine class (sync and Promise-returning
// async steps; the async ones run on the libuv thread pool, off the JavaScript event loop),
// kernel discovery, and a raw sgemm entry point for tests and benchmarks.
#include <napi.h>

#include <atomic>
#include <cstdlib>
#include <memory>
#include <string>
#include <vector>

#include "addon-args.h"
#include "gemm.h"
#include "step.h"

namespace midpath {
namespace {

using namespace addon_args;

class Engine;

/** Runs one step (or evaluation) on the thread pool and settles a Promise. */
class StepWorker : public Napi::AsyncWorker {
 public:
  StepWorker(Napi::Env env, Engine* engine, Napi::Object self, std::vector<float> x,
             std::vector<float> y, int batch, bool update)
      : Napi::AsyncWorker(env, "midpath-native-step"),
        deferred_(Napi::Promise::Deferred::New(env)),
        engine_(engine),
        x_(std::move(x)),
        y_(std::move(y)),
        batch_(batch),
        update_(update) {
    self_ = Napi::Persistent(self);  // keeps the engine alive while the step runs
  }
  Napi::Promise promise() const { return deferred_.Promise(); }
  void Execute() override;
  void OnOK() override;
  void OnError(const Napi::Error& e) override;

 private:
  Napi::Promise::Deferred deferred_;
  Engine* engine_;
  Napi::ObjectReference self_;
  std::vector<float> x_, y_;
  int batch_;
  bool update_;
  StepStats stats_;
};

class Engine : public Napi::ObjectWrap<Engine> {
 public:
  static Napi::Function define(Napi::Env env) {
    return DefineClass(env, "Engine",
                       {InstanceMethod("setParams", &Engine::set_params),
                        InstanceMethod("getParams", &Engine::get_params),
                        InstanceMethod("layout", &Engine::layout),
                        InstanceMethod("stepSync", &Engine::step_sync),
                        InstanceMethod("evaluateSync", &Engine::evaluate_sync),
                        InstanceMethod("step", &Engine::step_async),
                        InstanceMethod("evaluate", &Engine::evaluate_async),
                        InstanceMethod("encode", &Engine::encode),
                        InstanceMethod("dispose", &Engine::dispose),
                        InstanceAccessor("kernel", &Engine::kernel, nullptr)});
  }

  explicit Engine(const Napi::CallbackInfo& info) : Napi::ObjectWrap<Engine>(info) {
    Napi::Env env = info.Env();
    if (info.Length() < 1 || !info[0].IsObject()) fail(env, "expected an options object");
    const Napi::Object o = info[0].As<Napi::Object>();
    cfg_ = read_config(env, o);
    kernel_ = read_kernel(env, get_string(o, "kernel", "auto"));
    step_ = std::make_unique<TrainStep<float>>(cfg_, kernel_);
  }

  /** Called on the worker thread. */
  StepStats run(const std::vector<float>& x, const std::vector<float>& y, int batch, bool update) {
    return update ? step_->step(x.data(), y.data(), batch)
                  : step_->evaluate(x.data(), y.data(), batch);
  }
  void release() { busy_.store(false); }

 private:
  TrainStep<float>& ready(Napi::Env env) {
    if (!step_) fail(env, "the engine was disposed");
    if (busy_.load()) fail(env, "a step is still running on this engine; await it first");
    return *step_;
  }

  int read_batch(const Napi::CallbackInfo& info) {
    const double b = info.Length() > 2 && info[2].IsNumber()
                         ? info[2].As<Napi::Number>().DoubleValue()
                         : -1;
    if (!(b >= 2) || b != static_cast<int>(b)) fail(info.Env(), "expected a batch size ≥ 2");
    return static_cast<int>(b);
  }

  Napi::Value set_params(const Napi::CallbackInfo& info) {
    TrainStep<float>& s = ready(info.Env());
    const std::size_t total = s.layout().total;
    const float* p = float_data(info.Env(), info[0], total, "params");
    s.set_params(p);
    return info.Env().Undefined();
  }

  Napi::Value get_params(const Napi::CallbackInfo& info) {
    TrainStep<float>& s = ready(info.Env());
    const std::size_t total = s.layout().total;
    Napi::Float32Array out = Napi::Float32Array::New(info.Env(), total);
    std::copy(s.params().begin(), s.params().end(), out.Data());
    return out;
  }

  Napi::Value layout(const Napi::CallbackInfo& info) {
    TrainStep<float>& s = ready(info.Env());
    const std::vector<std::size_t>& sizes = s.layout().sizes;
    Napi::Array out = Napi::Array::New(info.Env(), sizes.size());
    for (std::size_t i = 0; i < sizes.size(); ++i)
      out.Set(static_cast<uint32_t>(i), static_cast<double>(sizes[i]));
    return out;
  }

  Napi::Value run_sync(const Napi::CallbackInfo& info, bool update) {
    TrainStep<float>& s = ready(info.Env());
    const int batch = read_batch(info);
    const std::size_t need = static_cast<std::size_t>(batch) * cfg_.inDim;
    const float* x = float_data(info.Env(), info[0], need, "batchX");
    const float* y = float_data(info.Env(), info[1], need, "batchY");
    return stats_object(info.Env(), update ? s.step(x, y, batch) : s.evaluate(x, y, batch));
  }
  Napi::Value step_sync(const Napi::CallbackInfo& info) { return run_sync(info, true); }
  Napi::Value evaluate_sync(const Napi::CallbackInfo& info) { return run_sync(info, false); }

  Napi::Value run_async(const Napi::CallbackInfo& info, bool update) {
    ready(info.Env());
    const int batch = read_batch(info);
    const std::size_t need = static_cast<std::size_t>(batch) * cfg_.inDim;
    const float* x = float_data(info.Env(), info[0], need, "batchX");
    const float* y = float_data(info.Env(), info[1], need, "batchY");
    // Copies: the caller may reuse its buffers as soon as this returns.
    auto* worker = new StepWorker(info.Env(), this, info.This().As<Napi::Object>(),
                                  std::vector<float>(x, x + need), std::vector<float>(y, y + need),
                                  batch, update);
    busy_.store(true);
    worker->Queue();
    return worker->promise();
  }
  Napi::Value step_async(const Napi::CallbackInfo& info) { return run_async(info, true); }
  Napi::Value evaluate_async(const Napi::CallbackInfo& info) { return run_async(info, false); }

  Napi::Value encode(const Napi::CallbackInfo& info) {
    TrainStep<float>& s = ready(info.Env());
    const double nd = info.Length() > 1 && info[1].IsNumber()
                          ? info[1].As<Napi::Number>().DoubleValue()
                          : -1;
    if (!(nd >= 0) || nd != static_cast<int>(nd)) fail(info.Env(), "expected a row count ≥ 0");
    const int n = static_cast<int>(nd);
    const float* x = float_data(info.Env(), info[0], static_cast<std::size_t>(n) * cfg_.inDim, "x");
    Napi::Float32Array out =
        Napi::Float32Array::New(info.Env(), static_cast<std::size_t>(n) * cfg_.dim);
    if (n > 0) s.encode(x, n, out.Data());
    return out;
  }

  Napi::Value dispose(const Napi::CallbackInfo& info) {
    if (busy_.load()) fail(info.Env(), "cannot dispose while a step is running; await it first");
    step_.reset();
    return info.Env().Undefined();
  }

  Napi::Value kernel(const Napi::CallbackInfo& info) {
    return Napi::String::New(info.Env(), kernel_name(kernel_));
  }

  StepConfig cfg_;
  Kernel kernel_ = Kernel::Portable;
  std::unique_ptr<TrainStep<float>> step_;
  std::atomic<bool> busy_{false};
};

void StepWorker::Execute() {
  stats_ = engine_->run(x_, y_, batch_, update_);
}

void StepWorker::OnOK() {
  engine_->release();
  deferred_.Resolve(stats_object(Env(), stats_));
}

void StepWorker::OnError(const Napi::Error& e) {
  engine_->release();
  deferred_.Reject(e.Value());
}

// sgemm(kernel, transA, transB, m, n, k, alpha, A, lda, B, ldb, beta, C, ldc): C in place.
Napi::Value sgemm_entry(const Napi::CallbackInfo& info) {
  Napi::Env env = info.Env();
  if (info.Length() < 14) fail(env, "sgemm expects 14 arguments");
  const Kernel k = read_kernel(env, info[0].As<Napi::String>().Utf8Value());
  const bool ta = info[1].ToBoolean().Value(), tb = info[2].ToBoolean().Value();
  auto num = [&](int i) { return info[i].As<Napi::Number>().Int32Value(); };
  const int m = num(3), n = num(4), kk = num(5), lda = num(8), ldb = num(10), ldc = num(13);
  if (m < 0 || n < 0 || kk < 0) fail(env, "sgemm: negative size");
  if (lda < (ta ? m : kk) || ldb < (tb ? kk : n) || ldc < n) fail(env, "sgemm: leading dimension too small");
  const std::size_t needA = static_cast<std::size_t>(ta ? kk : m) * lda;
  const std::size_t needB = static_cast<std::size_t>(tb ? n : kk) * ldb;
  const float* a = float_data(env, info[7], needA, "A");
  const float* b = float_data(env, info[9], needB, "B");
  float* c = const_cast<float*>(float_data(env, info[12], static_cast<std::size_t>(m) * ldc, "C"));
  const float alpha = info[6].As<Napi::Number>().FloatValue();
  const float beta = info[11].As<Napi::Number>().FloatValue();
  sgemm(k, GemmArgs{ta, tb, m, n, kk, alpha, a, lda, b, ldb, beta, c, ldc});
  return env.Undefined();
}

// kernels(): { best, supported: [...] }
Napi::Value kernels_entry(const Napi::CallbackInfo& info) {
  Napi::Env env = info.Env();
  Napi::Object out = Napi::Object::New(env);
  Napi::Array supported = Napi::Array::New(env);
  const Kernel all[] = {Kernel::Portable, Kernel::Avx2, Kernel::Avx512};
  uint32_t i = 0;
  for (Kernel k : all)
    if (kernel_supported(k)) supported.Set(i++, kernel_name(k));
  out.Set("best", kernel_name(best_kernel()));
  out.Set("supported", supported);
  return out;
}

Napi::Object init_module(Napi::Env env, Napi::Object exports) {
  exports.Set("Engine", Engine::define(env));
  exports.Set("sgemm", Napi::Function::New(env, sgemm_entry));
  exports.Set("kernels", Napi::Function::New(env, kernels_entry));
  return exports;
}

}  // namespace
}  // namespace midpath

static Napi::Object InitMidpathNative(Napi::Env env, Napi::Object exports) {
  return midpath::init_module(env, exports);
}

NODE_API_MODULE(midpath_native, InitMidpathNative)
