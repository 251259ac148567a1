#!/usr/bin/env python3
"""
Reference timing for bench/preview.bench.ts: the same preview-window work done with numpy, run in the same
bench run. Sizes: 64 channels, 64 components, 2500 samples (10 s at 250 Hz), 10 components removed.

  activations     S = W @ (X - m[:, None])                     (64 x 64 x 2500)
  full-clean      X - A[:, R] @ S[R, :]                        (the non-incremental update, |R| = 10)
  rank-one        X_clean -= np.outer(A[:, i], S[i, :])        (numpy's version of one toggle)

Usage: python3 preview_reference.py  -> prints JSON {"numpy": version, "activations": ms, "full": ms, "rank1": ms}
(medians of 21 runs after a warm-up; seeded data).
"""
import json
import time

import numpy as np

rng = np.random.default_rng(7)
n, k, L = 64, 64, 2500
X = rng.normal(0, 20, size=(n, L)).astype(np.float32)
W = rng.normal(0, 1, size=(k, n))
A = np.linalg.pinv(W)
m = rng.normal(0, 1, size=n)
R = list(range(0, 20, 2))


def median_ms(fn, repeats=21):
    fn()
    t = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        t.append((time.perf_counter() - t0) * 1000)
    t.sort()
    return t[len(t) // 2]


S = W @ (X.astype(np.float64) - m[:, None])
C = X.astype(np.float64).copy()
print(json.dumps({
    "numpy": np.__version__,
    "activations": median_ms(lambda: W @ (X.astype(np.float64) - m[:, None])),
    "full": median_ms(lambda: X - A[:, R] @ S[R, :]),
    "rank1": median_ms(lambda: np.subtract(C, np.outer(A[:, 3], S[3, :]), out=C)),
}))
