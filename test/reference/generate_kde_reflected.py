#!/usr/bin/python3
"""Reference values for the reflected KDE in test/statistics/kdeReflected.test.ts, from Debian's python3-scipy.

For sample sets piled against prior edges, the exact reflected Gaussian KDE (reflection method,
Silverman 1986, Density Estimation, Chapman & Hall) with the Scott kernel width of
scipy.stats.gaussian_kde,
  f(t) = sum_i [phi((t - x_i)/h) + phi((t - (2a - x_i))/h) + phi((t - (2b - x_i))/h)] / (n h),  a <= t <= b,
its cdf F(t) = int_a^t f by scipy.integrate.quad (checked here against the same sum of normal cdfs
to 1e-11), and its total mass int_a^b f. Samples are drawn with numpy's PCG64 generator (seeds
recorded). Each entry records the library, its version and the calls.
Run: /usr/bin/python3 test/reference/generate_kde_reflected.py
"""
import json
import math
import os
import sys

import numpy
import scipy
from scipy import integrate, stats

OUT = os.path.join(os.path.dirname(os.path.abspath(__file__)), "kde_reflected_reference.json")
lib = {"library": "scipy", "version": scipy.__version__, "numpy": numpy.__version__, "python": sys.version.split()[0]}


def case(name, x, a, b, seed):
    x = numpy.round(numpy.asarray(x, dtype=float), 12)
    assert x.min() >= a and x.max() <= b
    h = float(numpy.sqrt(stats.gaussian_kde(x, bw_method="scott").covariance[0, 0]))
    centres = [x]
    if math.isfinite(a):
        centres.append(2 * a - x)
    if math.isfinite(b):
        centres.append(2 * b - x)
    c = numpy.concatenate(centres)
    n = len(x)

    def pdf(t):
        return float(numpy.sum(stats.norm.pdf((t - c) / h)) / (n * h))

    def cdf_closed(t):
        return float(numpy.sum(stats.norm.cdf((t - c) / h) - stats.norm.cdf((lo - c) / h)) / n)

    lo = a if math.isfinite(a) else float(x.min()) - 12 * h
    hi = b if math.isfinite(b) else float(x.max()) + 12 * h
    # points: the edges, points just inside them (a fraction of a grid step and a few kernel widths),
    # and an even spread across the samples
    pts = set(numpy.linspace(max(lo, float(x.min()) - 3 * h), min(hi, float(x.max()) + 3 * h), 25).tolist())
    for e, s in ((a, 1), (b, -1)):
        if math.isfinite(e):
            pts.update([e, e + s * 0.013 * h, e + s * 0.037 * h, e + s * 0.5 * h, e + s * 1.3 * h, e + s * 3.1 * h])
    pts = sorted(p for p in pts if lo <= p <= hi)
    brk = sorted(set([float(v) for v in numpy.quantile(x, numpy.linspace(0, 1, 41))]))
    cdf = []
    for p in pts:
        inner = [v for v in brk if lo < v < p]
        val, err = integrate.quad(pdf, lo, p, points=inner or None, limit=400, epsabs=1e-13, epsrel=1e-12)
        assert abs(val - cdf_closed(p)) < 1e-11, (name, p, val, cdf_closed(p))
        cdf.append(val)
    inner = [v for v in brk if lo < v < hi]
    mass, _ = integrate.quad(pdf, lo, hi, points=inner or None, limit=400, epsabs=1e-13, epsrel=1e-12)
    return {
        "name": name,
        "seed": seed,
        "lowerEdge": a if math.isfinite(a) else None,
        "upperEdge": b if math.isfinite(b) else None,
        "call": "h = sqrt(scipy.stats.gaussian_kde(samples, bw_method='scott').covariance[0,0]); "
                "pdf(t) = sum(scipy.stats.norm.pdf((t - centres)/h))/(n h), centres = samples and their mirror images 2a - x, 2b - x; "
                "cdf(t) = scipy.integrate.quad(pdf, a, t, epsabs=1e-13, epsrel=1e-12); mass = quad(pdf, a, b)",
        "h": h,
        "samples": [float(v) for v in x],
        "points": pts,
        "pdf": [pdf(p) for p in pts],
        "cdf": cdf,
        "mass": mass,
    }


cases = []
# A free-spectrum bin with no signal: log10 rho samples piled at the lower prior edge -10 (prior -10 to -4).
rng = numpy.random.default_rng(20261203)
cases.append(case("piled at the lower edge", -10 + rng.exponential(0.6, size=1500), -10.0, -4.0, 20261203))
# A narrow prior with samples piled at both edges (U-shaped).
rng = numpy.random.default_rng(31)
cases.append(case("piled at both edges", rng.beta(0.4, 0.4, size=800), 0.0, 1.0, 31))
# Piled at an upper edge only, with a lower edge far from every sample (no reflection there).
rng = numpy.random.default_rng(4242)
cases.append(case("piled at the upper edge", -4 - rng.gamma(2.0, 0.25, size=1000), -10.0, -4.0, 4242))
# Only an upper edge, whose grid step does not divide the table width evenly.
rng = numpy.random.default_rng(77)
cases.append(case("upper edge only", 0.3 - numpy.abs(rng.normal(0.0, 0.7, size=600)), -math.inf, 0.3, 77))

json.dump({"source": lib, "cases": cases}, open(OUT, "w"), indent=1)
print("wrote", OUT)
