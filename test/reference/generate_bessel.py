#!/usr/bin/python3
"""Writes test/reference/bessel_jv.json: J_n(x) from scipy.special.jv for the Bessel checks in
test/orbits/bessel.test.ts, one list per regime of the algorithm. Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_bessel.py"""
import json, os, platform
import numpy as np
import scipy
from scipy.special import jv

def cases(pairs):
    return [{"n": int(n), "x": float(x), "jv": float(jv(int(n), float(x)))} for n, x in pairs]

regimes = {
    "small order, small argument": cases([(n, x) for n in range(0, 6) for x in (1e-8, 1e-3, 0.1, 0.5, 1.0, 2.5, 7.0)]),
    "argument above order (oscillating)": cases([(n, x) for n in (0, 1, 2, 5, 10, 50) for x in (20.0, 99.5, 500.0, 1999.0)]),
    "order above argument (decaying), x = n e": cases(
        [(n, n * e) for n in (3, 10, 50, 200, 1000, 1500, 2000) for e in (0.01, 0.1, 0.5, 0.9, 0.99)]
    ),
    "transition, x near n": cases(
        [(n, x) for n in (100, 1000, 1500, 2000) for x in (n - 3 * n ** (1 / 3), n - n ** (1 / 3), n - 1, n, n + n ** (1 / 3))]
    ),
}
out = {
    "library": "scipy.special.jv",
    "library_version": scipy.__version__,
    "numpy_version": np.__version__,
    "python_version": platform.python_version(),
    "call": "scipy.special.jv(n, x) with integer n (as int) and float x",
    "regimes": regimes,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "bessel_jv.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path, sum(len(v) for v in regimes.values()), "values")
