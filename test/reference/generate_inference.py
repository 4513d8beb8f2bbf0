#!/usr/bin/python3
"""Reference values for test/inference, from Debian's python3-scipy (run with /usr/bin/python3).

Writes inference_reference.json beside this script: quantiles and densities of truncated normal
and truncated log-normal priors (scipy.stats.truncnorm), each with the library version and call.
Run: /usr/bin/python3 test/reference/generate_inference.py
"""
import json
import math
import os
import sys

import numpy
import scipy
from scipy import stats

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "inference_reference.json")
lib = {"library": "scipy", "version": scipy.__version__, "numpy": numpy.__version__, "python": sys.version.split()[0]}

cases = []
# Normal(mean 0.7, sd 0.3) truncated to [0.5, 1.5].
mean, sd, lo, hi = 0.7, 0.3, 0.5, 1.5
a, b = (lo - mean) / sd, (hi - mean) / sd
for p in (0.01, 0.16, 0.5, 0.84, 0.99):
    cases.append({"family": "normal", "mean": mean, "sd": sd, "lo": lo, "hi": hi, "p": p,
                  "quantile": float(stats.truncnorm.ppf(p, a, b, loc=mean, scale=sd)),
                  "call": f"scipy.stats.truncnorm.ppf({p}, {a!r}, {b!r}, loc={mean}, scale={sd})"})
for x in (0.55, 0.9, 1.4):
    cases.append({"family": "normal", "mean": mean, "sd": sd, "lo": lo, "hi": hi, "x": x,
                  "density": float(stats.truncnorm.pdf(x, a, b, loc=mean, scale=sd)),
                  "call": f"scipy.stats.truncnorm.pdf({x}, {a!r}, {b!r}, loc={mean}, scale={sd})"})
# Log-normal: log10 x ~ Normal(log10 1e-3, 0.5 dex) truncated to x in [1e-4, 2e-3]: quantiles of
# log10 x from truncnorm, mapped back by 10^q.
med, dex, lo, hi = 1e-3, 0.5, 1e-4, 2e-3
a, b = (math.log10(lo) - math.log10(med)) / dex, (math.log10(hi) - math.log10(med)) / dex
for p in (0.05, 0.5, 0.95):
    q = float(stats.truncnorm.ppf(p, a, b, loc=math.log10(med), scale=dex))
    cases.append({"family": "lognormal", "median": med, "sigmaDex": dex, "lo": lo, "hi": hi, "p": p, "quantile": 10 ** q,
                  "call": f"10**scipy.stats.truncnorm.ppf({p}, {a!r}, {b!r}, loc={math.log10(med)!r}, scale={dex})"})

with open(OUT, "w") as f:
    json.dump({"generator": "test/reference/generate_inference.py", **lib, "truncated": cases}, f, indent=1)
    f.write("\n")
