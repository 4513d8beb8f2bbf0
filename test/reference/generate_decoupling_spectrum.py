#!/usr/bin/python3
"""Writes test/reference/decoupling_spectrum.json: the eccentric-to-circular ratio of h_c^2 for binaries
whose eccentricity e0 is set where each one decouples from a mass-scaled stellar environment.

Population: one redshift z, total masses log-uniform on [10^8, 10^10] Msun, q = 1. Each binary has its own
start (orbital) frequency f0(M): the orbital frequency of the separation where stellar hardening
(da/dt = -G rho H a^2 / sigma, Quinlan 1996, New Astron. 1, 35) equals GW hardening with the eccentric
enhancement F(e0) (Peters 1964, Phys. Rev. 136, B1224), sigma from log10 M = 8.32 + 5.64 log10(sigma/200 km/s)
(McConnell & Ma 2013, ApJ 764, 184) and rho = sigma^6 / (2 pi G^3 M^2) (singular isothermal sphere at
r_inf = G M / sigma^2). Since dE/dln f_r of one binary is the circular one times Phi(f_r / f0; e0)
(Enoki & Nagashima 2007, PTP 117, 241), the ratio is
    R(f) = Int dlog10M M^(5/3) Phi(f (1+z) / f0(M); e0) / Int dlog10M M^(5/3).
Phi is the direct harmonic sum sum_{n <= x} (2/n)^(2/3) g(n, e_n) / F(e_n) with g(n, e) of Peters & Mathews
1963 (eq. 20) from scipy.special.jv and e_n from the Peters 1964 a(e) relation solved by scipy.optimize.brentq
(every harmonic up to floor(x)). The mass integral is split at every mass where f (1+z) / f0(M) is a whole
number (Phi jumps there; the split points by brentq) with 12-point Gauss-Legendre (numpy) per piece.
Independent of src/physics: no table, no interpolation, its own root finders.
Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_decoupling_spectrum.py"""
import json, math, os, platform
import numpy as np
import scipy
from scipy.special import jv
from scipy.optimize import brentq

G = 6.6743e-11
C = 299792458.0
MSUN = 1.3271244e20 / G
H = 16.0
Z = 0.5

def g(n, e):
    x = n * e
    j = lambda k: jv(k, x)
    a = j(n - 2) - 2 * e * j(n - 1) + (2.0 / n) * j(n) + 2 * e * j(n + 1) - j(n + 2)
    b = j(n - 2) - 2 * j(n) + j(n + 2)
    return n ** 4 / 32.0 * (a * a + (1 - e * e) * b * b + 4.0 / (3.0 * n * n) * j(n) ** 2)

def F(e):
    return (1 + 73.0 / 24.0 * e * e + 37.0 / 96.0 * e ** 4) / (1 - e * e) ** 3.5

def shape_log(e):
    return 12.0 / 19.0 * math.log(e) - math.log1p(-e * e) + 870.0 / 2299.0 * math.log1p(121.0 / 304.0 * e * e)

def ecc(e0, ratio):
    target = shape_log(e0) - 2.0 / 3.0 * math.log(ratio)
    return brentq(lambda e: shape_log(e) - target, 1e-300, 1 - 1e-16, xtol=1e-300, rtol=1e-15, maxiter=500)

def phi(x, e0):
    s = 0.0
    for n in range(1, int(math.floor(x)) + 1):
        en = ecc(e0, x / n)
        s += (2.0 / n) ** (2.0 / 3.0) * g(n, en) / F(en)
    return s

def f0_of(log10m, e0):
    m = 10.0 ** log10m * MSUN
    sigma = 200e3 * 10.0 ** ((log10m - 8.32) / 5.64)
    rho = sigma ** 6 / (2 * math.pi * G ** 3 * m * m)
    m1 = m2 = m / 2
    at = ((64.0 / 5.0) * G * G * m1 * m2 * m * F(e0) * sigma / (C ** 5 * rho * H)) ** 0.2
    return math.sqrt(G * m / at ** 3) / (2 * math.pi)

gl_x, gl_w = np.polynomial.legendre.leggauss(12)

def ratio(f, e0, lo=8.0, hi=10.0):
    fr = f * (1 + Z)
    x_of = lambda u: fr / f0_of(u, e0)
    xlo, xhi = x_of(lo), x_of(hi)
    cuts = [lo]
    for k in range(int(math.ceil(xlo)), int(math.floor(xhi)) + 1):
        if k < 1:
            continue
        cuts.append(brentq(lambda u: x_of(u) - k, lo, hi, xtol=1e-15, rtol=1e-15))
    cuts.append(hi)
    cuts = sorted(set(cuts))
    num = 0.0
    for a, b in zip(cuts[:-1], cuts[1:]):
        if b <= a:
            continue
        for xi, wi in zip(gl_x, gl_w):
            u = 0.5 * (a + b) + 0.5 * (b - a) * xi
            x = x_of(u)
            if x >= 1:
                num += 0.5 * (b - a) * wi * (10.0 ** u) ** (5.0 / 3.0) * phi(x, e0)
    den = ((10.0 ** hi) ** (5.0 / 3.0) - (10.0 ** lo) ** (5.0 / 3.0)) / ((5.0 / 3.0) * math.log(10.0))
    return num / den

runs = []
for e0, freqs in ((0.5, [0.5e-9, 1e-9, 2e-9, 4e-9, 8e-9]), (0.8, [0.3e-9, 0.6e-9, 1.2e-9])):
    runs.append({"e0": e0, "points": [{"f_hz": f, "ratio": ratio(f, e0)} for f in freqs]})
    print("e0", e0, runs[-1]["points"])
out = {
    "library": "scipy.special.jv, scipy.optimize.brentq, numpy.polynomial.legendre.leggauss",
    "library_version": scipy.__version__,
    "numpy_version": np.__version__,
    "python_version": platform.python_version(),
    "population": {"z": Z, "log10M": [8.0, 10.0], "q": 1.0, "density": "uniform in log10 M", "hardening_H": H,
                   "m_sigma": "log10 M = 8.32 + 5.64 log10(sigma / 200 km/s)", "density_at_influence": "sigma^6 / (2 pi G^3 M^2)"},
    "constants": {"G": G, "c": C, "GMsun": 1.3271244e20},
    "call": "ratio(f, e0) = Int_8^10 dlog10M M^(5/3) phi(f (1+z)/f0(M), e0) / Int_8^10 dlog10M M^(5/3); phi = sum_{n<=x} (2/n)^(2/3) g(n,e_n)/F(e_n) (jv, brentq); pieces split at whole x (brentq), 12-point Gauss-Legendre per piece",
    "runs": runs,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "decoupling_spectrum.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path)
