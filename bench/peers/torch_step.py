"""PyTorch peer of Midpath's reference training step, for bench/training.ts.

The same step as the TF.js loop: MLP 64→256→256→16 (ReLU), distance critic
f(x, y) = -½‖A ψ(x) − ψ(y)‖² with a learned A, symmetric InfoNCE (van den Oord et al.,
2018), penalty regulariser λ(mean‖ψ‖²/d − c)², global-norm clipping, Adam. Batches are drawn
from a fixed pool of observations each step. One thread. Prints one JSON line.

Usage: python3 torch_step.py STEPS [BATCH]
"""
import json
import os
import sys
import time

import torch


def loaded_blas():
    """Shared libraries with 'blas' in their path mapped into this process (what really runs)."""
    libs = set()
    with open("/proc/self/maps") as maps:
        for line in maps:
            path = line.split()[-1]
            if "blas" in path.lower():
                libs.add(os.path.realpath(path))
    return sorted(libs)


def main():
    steps = int(sys.argv[1]) if len(sys.argv) > 1 else 200
    batch = int(sys.argv[2]) if len(sys.argv) > 2 else 256
    torch.set_num_threads(1)
    torch.manual_seed(0)
    obs_dim, dim = 64, 16
    encoder = torch.nn.Sequential(
        torch.nn.Linear(obs_dim, 256), torch.nn.ReLU(),
        torch.nn.Linear(256, 256), torch.nn.ReLU(),
        torch.nn.Linear(256, dim),
    )
    a = torch.nn.Parameter(torch.eye(dim))
    params = list(encoder.parameters()) + [a]
    optimiser = torch.optim.Adam(params, lr=1e-3, eps=1e-7)
    pool = torch.randn(8192, obs_dim)

    def step():
        ix = torch.randint(0, pool.shape[0] - 8, (batch,))
        x, y = pool[ix], pool[ix + 1 + torch.randint(0, 7, (batch,))]
        zx, zy = encoder(x), encoder(y)
        u = zx @ a.T
        logits = u @ zy.T - 0.5 * ((u * u).sum(1, keepdim=True) + (zy * zy).sum(1)[None, :])
        pos = -0.5 * ((u - zy) ** 2).sum(1)
        nce = 0.5 * (torch.logsumexp(logits, 1).mean() + torch.logsumexp(logits, 0).mean()) - pos.mean()
        z = torch.cat([zx, zy])
        reg = ((z * z).sum(1).mean() / dim - 1.0) ** 2
        loss = nce + reg
        optimiser.zero_grad()
        loss.backward()
        torch.nn.utils.clip_grad_norm_(params, 1.0)
        optimiser.step()
        return loss

    for _ in range(10):
        step()
    start = time.perf_counter()
    for _ in range(steps):
        step()
    elapsed = time.perf_counter() - start
    n = 512
    m = torch.randn(n, n)
    start = time.perf_counter()
    for _ in range(20):
        m @ m
    gemm = 20 * 2 * n**3 / (time.perf_counter() - start) / 1e9
    print(json.dumps({
        "stepsPerSecond": steps / elapsed,
        "torch": torch.__version__,
        "threads": torch.get_num_threads(),
        "blas": loaded_blas(),
        "coretype": os.environ.get("OPENBLAS_CORETYPE", ""),
        "matmulGflops": gemm,
    }))


if __name__ == "__main__":
    main()
