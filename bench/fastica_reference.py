#!/usr/bin/env python3
"""
fastica_reference.py -- general-purpose reference for bench/ica.bench.ts: symmetric FastICA
(Hyvarinen 1999, IEEE Trans. Neural Netw. 10:626-634; METHODS section 7.3) written with numpy only.

  whitening: eigendecomposition of the covariance (numpy.linalg.eigh), Z = D^-1/2 E' (X - mean)
  update:    W+ = E{tanh(W Z) Z'} - diag(E{1 - tanh^2(W Z)}) W ;  W = (W+ W+')^-1/2 W+
  stop:      max_i |1 - |<w_i_new, w_i_old>|| < tol (1e-4), or max_iter (200)
  start:     numpy.random.default_rng(seed).standard_normal((n, n)), symmetrically decorrelated

Usage: python3 fastica_reference.py DATA.f32 MIXING.f64 N T
  DATA.f32: channel-major float32 n x T samples; MIXING.f64: float64 n x n true mixing (row-major).
Prints one JSON line: {"seconds": ..., "iterations": ..., "amari": ..., "numpy": "..."}; the time covers
whitening + FastICA (not file reading). Amari index: Amari, Cichocki & Yang 1996, |p_ij| form,
normalised by 2n(n-1).
"""
import json
import sys
import time

import numpy as np


def sym_decorr(W):
    d, E = np.linalg.eigh(W @ W.T)
    return (E * (1.0 / np.sqrt(d))) @ E.T @ W


def fastica(X, max_iter=200, tol=1e-4, seed=0):
    n, T = X.shape
    Xc = X - X.mean(axis=1, keepdims=True)
    C = Xc @ Xc.T / T
    d, E = np.linalg.eigh(C)
    K = (E / np.sqrt(d)).T
    Z = K @ Xc
    W = sym_decorr(np.random.default_rng(seed).standard_normal((n, n)))
    it = 0
    for it in range(1, max_iter + 1):
        G = np.tanh(W @ Z)
        W1 = G @ Z.T / T - (1.0 - G * G).mean(axis=1)[:, None] * W
        W1 = sym_decorr(W1)
        lim = np.max(np.abs(np.abs(np.einsum("ij,ij->i", W1, W)) - 1.0))
        W = W1
        if lim < tol:
            break
    return W @ K, it


def amari(P):
    a = np.abs(P)
    n = a.shape[0]
    raw = (a.sum(1) / a.max(1) - 1).sum() + (a.sum(0) / a.max(0) - 1).sum()
    return raw / (2 * n * (n - 1))


def main():
    data, mixing, n, T = sys.argv[1], sys.argv[2], int(sys.argv[3]), int(sys.argv[4])
    X = np.fromfile(data, dtype=np.float32).reshape(n, T).astype(np.float64)
    A = np.fromfile(mixing, dtype=np.float64).reshape(n, n)
    t0 = time.perf_counter()
    W, iters = fastica(X)
    secs = time.perf_counter() - t0
    print(json.dumps({"seconds": secs, "iterations": iters, "amari": float(amari(W @ A)), "numpy": np.__version__}))


if __name__ == "__main__":
    main()
