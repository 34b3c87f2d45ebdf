# Native training engine (see docs/native.md). Every sgemm variant is a static library with
# its own instruction-set flags; the addon itself is compiled for the baseline CPU and picks
# a variant at run time (src/gemm-dispatch.cc). Never -march=native: a copied node_modules
# must run on older CPUs.
{
  "target_defaults": {
    "cflags_cc": ["-std=c++17", "-O3", "-fPIC", "-fno-math-errno"],
    "cflags_cc!": ["-fno-exceptions", "-std=gnu++17", "-std=gnu++20", "-std=c++20"],
    "conditions": [
      ["target_arch=='x64'", {"defines": ["MIDPATH_X86_KERNELS"]}]
    ]
  },
  "targets": [
    {
      "target_name": "midpath_native",
      "sources": ["src/addon.cc", "src/gemm-dispatch.cc", "src/gemm-portable.cc"],
      "include_dirs": ["<!(node -p \"require('node-addon-api').include_dir\")"],
      "defines": ["NAPI_CPP_EXCEPTIONS", "NAPI_VERSION=8"],
      "conditions": [
        ["target_arch=='x64'", {"dependencies": ["midpath_kernel_avx2", "midpath_kernel_avx512"]}]
      ]
    }
  ],
  "conditions": [
    ["target_arch=='x64'", {
      "targets": [
        {
          "target_name": "midpath_kernel_avx2",
          "type": "static_library",
          "sources": ["src/gemm-avx2.cc"],
          "cflags_cc": ["-mavx2", "-mfma"]
        },
        {
          "target_name": "midpath_kernel_avx512",
          "type": "static_library",
          "sources": ["src/gemm-avx512.cc"],
          "cflags_cc": ["-mavx512f", "-mavx2", "-mfma"]
        }
      ]
    }]
  ]
}
