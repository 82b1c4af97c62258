"""Comparison timing: the four constant-flow blocking-law fits (Hermia 1982, constant-flux
forms) with scipy.optimize.curve_fit on the same readings as scripts/bench/fit.ts.

Usage: python3 scripts/bench/scipy_fit.py INPUT.json
INPUT.json = {"volumeL": [...], "dpBar": [...], "repeats": 30}
Prints one JSON object: {"median_ms", "p90_ms", "repeats", "scipy", "numpy", "fits": {law: {...}}}.
Each timed repetition includes the linearised starting values and all four fits, with
analytic Jacobians, as the TypeScript fitter does.
"""
import json
import sys
import time

import numpy as np
import scipy
from scipy.optimize import curve_fit


def complete(V, a, K):
    return a / (1.0 - K * V)


def complete_jac(V, a, K):
    h = 1.0 / (1.0 - K * V)
    return np.column_stack((h, a * V * h * h))


def standard(V, a, K):
    h = 1.0 / (1.0 - K * V)
    return a * h * h


def standard_jac(V, a, K):
    h = 1.0 / (1.0 - K * V)
    return np.column_stack((h * h, 2.0 * a * V * h ** 3))


def intermediate(V, a, K):
    return a * np.exp(K * V)


def intermediate_jac(V, a, K):
    e = np.exp(K * V)
    return np.column_stack((e, a * V * e))


def cake(V, a, K):
    return a * (1.0 + K * V)


def cake_jac(V, a, K):
    return np.column_stack((1.0 + K * V, a * V))


MODELS = {
    "complete": (complete, complete_jac),
    "standard": (standard, standard_jac),
    "intermediate": (intermediate, intermediate_jac),
    "cake": (cake, cake_jac),
}


def starts(V, y):
    """Weighted linearised starting values (same forms as the TypeScript fitter)."""
    vmax = V.max()
    out = {}
    c1, c0 = np.polyfit(V, 1.0 / y, 1, w=y ** 2)  # polyfit weights multiply residuals: w = sqrt(y^4)
    out["complete"] = (1.0 / c0, min(-c1 / c0, 0.99 / vmax))
    s1, s0 = np.polyfit(V, y ** -0.5, 1, w=y ** 1.5)
    out["standard"] = (1.0 / s0 ** 2, min(-s1 / s0, 0.99 / vmax))
    i1, i0 = np.polyfit(V, np.log(y), 1, w=y)
    out["intermediate"] = (np.exp(i0), i1)
    k1, k0 = np.polyfit(V, y, 1)
    out["cake"] = (k0, k1 / k0)
    return out


def fit_all(V, y):
    st = starts(V, y)
    res = {}
    for law, (f, jac) in MODELS.items():
        p, _ = curve_fit(f, V, y, p0=st[law], jac=jac, method="lm")
        r = y - f(V, *p)
        res[law] = {"dp0Bar": float(p[0]), "kPerL": float(p[1]), "rss": float(r @ r)}
    return res


def main():
    with open(sys.argv[1]) as fh:
        data = json.load(fh)
    V = np.asarray(data["volumeL"], dtype=float)
    y = np.asarray(data["dpBar"], dtype=float)
    repeats = int(data.get("repeats", 30))
    fits = fit_all(V, y)  # warm-up
    times = []
    for _ in range(repeats):
        t0 = time.perf_counter()
        fits = fit_all(V, y)
        times.append((time.perf_counter() - t0) * 1000.0)
    times.sort()
    print(json.dumps({
        "median_ms": float(np.median(times)),
        "p90_ms": float(np.percentile(times, 90)),
        "repeats": repeats,
        "scipy": scipy.__version__,
        "numpy": np.__version__,
        "fits": fits,
    }))


if __name__ == "__main__":
    main()
