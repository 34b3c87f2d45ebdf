"""Peer timing for bench/inference.ts: the same bridge batch solved by numpy its best way.

Reads one JSON object on stdin: {"d", "T", "queries", "F", "Q", "starts", "goals",
"means", "repeats"} (row-major flat lists; "means" are Midpath's answers, [queries, T, d]).
Builds the dense (Td)x(Td) block-tridiagonal precision of MATH.md section 3, solves all
queries as stacked right-hand sides with one LAPACK factorisation (numpy.linalg.solve), and
takes the marginal covariances from one dense inverse. Prints one JSON line: the best CPU
time in seconds (the caller pins BLAS to one thread), the largest differences from
Midpath's means and covariances, and numpy's version.
"""

import json
import sys
import time

import numpy as np


def solve_batch(F, Q, starts, goals, T):
    d = F.shape[0]
    n = T * d
    q_inv = np.linalg.inv(Q)
    q_inv_f = q_inv @ F
    diag = q_inv + F.T @ q_inv_f
    lam = np.zeros((n, n))
    for t in range(T):
        lam[t * d:(t + 1) * d, t * d:(t + 1) * d] = diag
        if t + 1 < T:
            lam[(t + 1) * d:(t + 2) * d, t * d:(t + 1) * d] = -q_inv_f
            lam[t * d:(t + 1) * d, (t + 1) * d:(t + 2) * d] = -q_inv_f.T
    h = np.zeros((n, starts.shape[0]))
    h[:d, :] += q_inv_f @ starts.T
    h[(T - 1) * d:, :] += q_inv_f.T @ goals.T
    mu = np.linalg.solve(lam, h)  # one factorisation, every query a column
    sigma = np.linalg.inv(lam)
    covs = [sigma[t * d:(t + 1) * d, t * d:(t + 1) * d] for t in range(T)]
    return mu, covs


def main():
    job = json.load(sys.stdin)
    d, T, queries = job["d"], job["T"], job["queries"]
    F = np.array(job["F"], dtype=np.float64).reshape(d, d)
    Q = np.array(job["Q"], dtype=np.float64).reshape(d, d)
    starts = np.array(job["starts"], dtype=np.float64).reshape(queries, d)
    goals = np.array(job["goals"], dtype=np.float64).reshape(queries, d)
    best = float("inf")
    for _ in range(max(1, int(job.get("repeats", 3)))):
        t0 = time.process_time()  # CPU time, as the TypeScript side measures
        mu, covs = solve_batch(F, Q, starts, goals, T)
        best = min(best, time.process_time() - t0)
    ours = np.array(job["means"], dtype=np.float64).reshape(queries, T * d).T
    our_covs = np.array(job["covariances"], dtype=np.float64).reshape(T, d, d)
    cov_diff = max(float(np.max(np.abs(c - o))) for c, o in zip(covs, our_covs))
    print(json.dumps({
        "seconds": best,
        "maxMeanDiff": float(np.max(np.abs(mu - ours))),
        "maxCovDiff": cov_diff,
        "numpy": np.__version__,
    }))


if __name__ == "__main__":
    main()
