#!/usr/bin/env python3
"""
Reference timing for bench/kernels.bench.ts: the unmixing product W @ X with numpy (its BLAS, all threads the
machine gives it), for W 64 x 64 and X 64 x 150 000, float32 and float64, median of 7 runs after a warm-up.
Usage: python3 matmul_reference.py K N T -> prints JSON {"numpy": version, "f32": ms, "f64": ms}
"""
import json
import sys
import time

import numpy as np

k, n, T = (int(a) for a in sys.argv[1:4])
rng = np.random.default_rng(3)
X32 = rng.normal(size=(n, T)).astype(np.float32)
W32 = rng.normal(size=(k, n)).astype(np.float32)
X64 = X32.astype(np.float64)
W64 = W32.astype(np.float64)
out32 = np.empty((k, T), np.float32)
out64 = np.empty((k, T), np.float64)


def median_ms(fn, repeats=7):
    fn()
    t = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fn()
        t.append((time.perf_counter() - t0) * 1000)
    t.sort()
    return t[len(t) // 2]


print(json.dumps({
    "numpy": np.__version__,
    "f32": median_ms(lambda: np.matmul(W32, X32, out=out32)),
    "f64": median_ms(lambda: np.matmul(W64, X64, out=out64)),
}))
