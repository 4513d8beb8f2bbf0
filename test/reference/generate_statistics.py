#!/usr/bin/python3
"""Reference values for test/statistics, from Debian's python3-scipy (run with /usr/bin/python3).

Writes statistics_reference.json beside this script. Each entry records the library, its version
and the exact call. The xoshiro128** and SplitMix64 streams are an independent Python
transcription of the generators as published (Blackman & Vigna 2021, ACM TOMS 47(4), 36;
Steele, Lea & Flood 2014, OOPSLA '14), not of our TypeScript.
Run: /usr/bin/python3 test/reference/generate_statistics.py
"""
import json
import math
import os
import sys

import numpy
import scipy
from scipy import optimize, stats

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "statistics_reference.json")
lib = {"library": "scipy", "version": scipy.__version__, "numpy": numpy.__version__, "python": sys.version.split()[0]}

ppf_p = [1e-12, 1e-6, 1e-3, 0.0228, 0.05, 0.1, 0.3, 0.5, 0.6, 0.8413, 0.95, 0.975, 0.999, 1 - 1e-9]
cdf_z = [-9.0, -5.0, -3.0, -2.0, -1.5, -1.0, -0.3, 0.0, 0.5, 1.0, 1.959963984540054, 2.5, 3.0, 6.0]
logn = [(1e-3, 0.3, p) for p in (0.025, 0.16, 0.5, 0.84, 0.975)] + [(2.5e-15, 0.1, p) for p in (0.05, 0.95)]

M64 = (1 << 64) - 1


def splitmix64(seed, count):
    s = seed & M64
    out = []
    for _ in range(count):
        s = (s + 0x9E3779B97F4A7C15) & M64
        z = s
        z = ((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9) & M64
        z = ((z ^ (z >> 27)) * 0x94D049BB133111EB) & M64
        out.append(z ^ (z >> 31))
    return out


def rotl32(x, k):
    return ((x << k) | (x >> (32 - k))) & 0xFFFFFFFF


def xoshiro128ss(seed, count):
    w0, w1 = splitmix64(seed, 2)
    s = [w0 & 0xFFFFFFFF, w0 >> 32, w1 & 0xFFFFFFFF, w1 >> 32]
    out = []
    for _ in range(count):
        result = (rotl32((s[1] * 5) & 0xFFFFFFFF, 7) * 9) & 0xFFFFFFFF
        t = (s[1] << 9) & 0xFFFFFFFF
        s[2] ^= s[0]
        s[3] ^= s[1]
        s[1] ^= s[2]
        s[0] ^= s[3]
        s[2] ^= t
        s[3] = rotl32(s[3], 11)
        out.append(result)
    return out


data = {
    "generator": "test/reference/generate_statistics.py",
    "normal_ppf": {**lib, "call": "scipy.stats.norm.ppf(p)", "p": ppf_p, "value": [float(stats.norm.ppf(p)) for p in ppf_p]},
    "normal_cdf": {**lib, "call": "scipy.stats.norm.cdf(z)", "z": cdf_z, "value": [float(stats.norm.cdf(z)) for z in cdf_z]},
    "lognormal_ppf": {
        **lib,
        "call": "scipy.stats.lognorm.ppf(p, s=sigma_dex*ln(10), scale=median)",
        "cases": [{"median": m, "sigma_dex": s, "p": p, "value": float(stats.lognorm.ppf(p, s=s * math.log(10), scale=m))} for m, s, p in logn],
    },
    "chi2_ppf_2dof": {
        **lib,
        "call": "scipy.stats.chi2.ppf(level, df=2)",
        "level": [0.6826894921370859, 0.9544997361036416],
        "value": [float(stats.chi2.ppf(l, 2)) for l in (0.6826894921370859, 0.9544997361036416)],
    },
    "brentq": {
        **lib,
        "call": "scipy.optimize.brentq(f, a, b, xtol=1e-15, rtol=4*2.22e-16)",
        "cases": [
            {"f": "cos(x) - x", "a": 0.0, "b": 1.0, "root": optimize.brentq(lambda x: math.cos(x) - x, 0.0, 1.0, xtol=1e-15, rtol=8.9e-16)},
            {"f": "x^3 - 2x - 5", "a": 2.0, "b": 3.0, "root": optimize.brentq(lambda x: x**3 - 2 * x - 5, 2.0, 3.0, xtol=1e-15, rtol=8.9e-16)},
            {"f": "exp(x) - 1e6", "a": 1.0, "b": 30.0, "root": optimize.brentq(lambda x: math.exp(x) - 1e6, 1.0, 30.0, xtol=1e-15, rtol=8.9e-16)},
        ],
    },
    "xoshiro128ss": {
        "library": "independent Python transcription of xoshiro128** 1.0 seeded by SplitMix64",
        "python": sys.version.split()[0],
        "call": "xoshiro128ss(seed, 8) in this script",
        "cases": [{"seed": sd, "outputs": xoshiro128ss(sd, 8)} for sd in (0, 1, 42, 2**53 - 1)],
    },
}

with open(OUT, "w") as fh:
    json.dump(data, fh, indent=2)
    fh.write("\n")
print("wrote", OUT)
