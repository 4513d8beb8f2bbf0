#!/usr/bin/python3
"""Writes test/reference/harmonic_power.json: Peters & Mathews 1963 (Phys. Rev. 131, 435, eq. 20) g(n, e)
composed in Python from scipy.special.jv, for test/orbits/petersMathews.test.ts.
Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_harmonic_power.py"""
import json, os, platform
import numpy as np
import scipy
from scipy.special import jv

def g(n, e):
    x = n * e
    j = lambda k: jv(k, x)
    a = j(n - 2) - 2 * e * j(n - 1) + (2.0 / n) * j(n) + 2 * e * j(n + 1) - j(n + 2)
    b = j(n - 2) - 2 * j(n) + j(n + 2)
    return n ** 4 / 32.0 * (a * a + (1 - e * e) * b * b + 4.0 / (3.0 * n * n) * j(n) ** 2)

pairs = [(n, e) for n in (1, 2, 3, 4, 5, 10, 20, 50) for e in (0.0, 0.01, 0.1, 0.3, 0.5, 0.7, 0.9)]
pairs += [(n, e) for n in (100, 200, 400, 800) for e in (0.5, 0.9, 0.95)]
pairs += [(n, 0.99) for n in (10, 100, 1000, 1600, 2000)]
cases = [{"n": n, "e": e, "g": float(g(n, e))} for n, e in pairs]
out = {
    "library": "scipy.special.jv",
    "library_version": scipy.__version__,
    "numpy_version": np.__version__,
    "python_version": platform.python_version(),
    "call": "g(n,e) = n^4/32 {[jv(n-2,x) - 2e jv(n-1,x) + (2/n) jv(n,x) + 2e jv(n+1,x) - jv(n+2,x)]^2 + (1-e^2)[jv(n-2,x) - 2 jv(n,x) + jv(n+2,x)]^2 + 4/(3n^2) jv(n,x)^2}, x = n e (Peters & Mathews 1963, eq. 20)",
    "cases": cases,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "harmonic_power.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path, len(cases), "values")
