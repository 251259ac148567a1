#!/usr/bin/env python3
"""
Reference timing for bench/headmodel.bench.ts: single-dipole fits of the same maps with
scipy.optimize.least_squares(method='lm') on the variable-projection residual (moment solved linearly,
average reference on model and data; docs/methods.md §15), started from the same points our coarse grid picked.

Forward models in numpy, vectorised over electrodes:
  sphere      closed form (docs/methods.md §8.2)
  three-shell Legendre series with g_n from the ratio recursion of docs/methods.md §8.3, terms up to the same
              convergence bound as src/core/headmodel/shells.ts

Usage: python3 headmodel_reference.py input.json  -> prints JSON {"ms": [...], "positions": [...]} on stdout.
input.json: {"model": "sphere"|"three-shell", "radiusMm": 90, "sigma": 0.33, "electrodes": [[x,y,z],...] (mm),
             "maps": [[...], ...] (µV), "starts": [[x,y,z], ...] (mm), "repeats": 3}
"""
import json
import sys
import time

import numpy as np
import scipy
from scipy.optimize import least_squares


def g_three_shell(nmax, radii=(0.87, 0.92, 1.0), sig=(1.0, 1 / 80, 1.0)):
    g = np.empty(nmax)
    for n in range(1, nmax + 1):
        tau = (n + 1) / n
        tin, tout = {}, {}
        for k in range(2, 0, -1):
            tout[k] = tau
            tin[k] = tau * (radii[k - 1] / radii[k]) ** (2 * n + 1)
            q = (sig[k] / sig[k - 1]) * (n * tin[k] - (n + 1)) / (tin[k] + 1)
            tau = (q + n + 1) / (n - q)
        gn = tau + 1
        for k in (1, 2):
            gn *= (tout[k] + 1) / (tin[k] + 1)
        g[n - 1] = gn
    return g


def make_lead_field(model, R, sigma, E):
    U = E / np.linalg.norm(E, axis=1, keepdims=True)
    k = 1e3 / (4 * np.pi * sigma)
    if model == "sphere":
        def lf(p):
            r = R * U
            dv = r - p
            d = np.linalg.norm(dv, axis=1)
            a = 2 / d**3
            b = 1 / (d * (R * d + np.sum(r * dv, axis=1)))
            return k * (a[:, None] * dv + b[:, None] * (d[:, None] * U + dv))
        return lf
    g = g_three_shell(2000)

    def lf(p):
        a = np.linalg.norm(p)
        b = a / R
        u = p / a if a > 0 else np.array([0.0, 0.0, 1.0])
        w = 1.0
        nterms = 2000
        for n in range(2, 2001):
            w *= b
            if g[n - 1] * w * n * (n + 1) / (1 - b) < 1e-16 * g[0]:
                nterms = n
                break
        c = U @ u
        pp, p1 = np.ones_like(c), c
        dpp, dp1 = np.zeros_like(c), np.ones_like(c)
        s1 = g[0] * c
        s2 = g[0] * np.ones_like(c)
        bp = 1.0
        for n in range(1, nterms):
            bp *= b
            pn = ((2 * n + 1) * c * p1 - n * pp) / (n + 1)
            dn = dpp + (2 * n + 1) * p1
            s1 = s1 + g[n] * bp * (n + 1) * pn
            s2 = s2 + g[n] * bp * dn
            pp, p1, dpp, dp1 = p1, pn, dp1, dn
        L = ((s1 - c * s2)[:, None] * u[None, :] + s2[:, None] * U) / R**2
        return k * L
    return lf


def fit_all(lf, maps, starts, R):
    out = []
    for v, s in zip(maps, starts):
        vt = v - v.mean()

        def resid(p):
            L = lf(p)
            L = L - L.mean(axis=0)
            q, *_ = np.linalg.lstsq(L, vt, rcond=None)
            return vt - L @ q

        res = least_squares(resid, s, method="lm", diff_step=1e-6, xtol=1e-10, ftol=1e-12)
        out.append(res.x.tolist())
    return out


def main():
    cfg = json.load(open(sys.argv[1]))
    E = np.asarray(cfg["electrodes"], float)
    maps = [np.asarray(m, float) for m in cfg["maps"]]
    starts = [np.asarray(s, float) for s in cfg["starts"]]
    lf = make_lead_field(cfg["model"], cfg["radiusMm"], cfg["sigma"], E)
    times = []
    positions = None
    for _ in range(cfg.get("repeats", 3)):
        t0 = time.perf_counter()
        positions = fit_all(lf, maps, starts, cfg["radiusMm"])
        times.append((time.perf_counter() - t0) * 1e3)
    print(json.dumps({"ms": times, "positions": positions, "numpy": np.__version__, "scipy": scipy.__version__}))


if __name__ == "__main__":
    main()
