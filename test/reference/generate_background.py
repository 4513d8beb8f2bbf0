#!/usr/bin/python3
"""Writes test/reference/background_scipy.json: h_c(f) of parametric merger populations by scipy's
adaptive cubature, independent of the project's Gauss-Legendre integrator.

Formula (Phinney 2001, astro-ph/0108028, strain form with the circular kernel):
  h_c^2(f) = 4 G^(5/3) / (3 pi^(1/3) c^2) f^(-4/3) Int dz (1+z)^(-1/3) Int dlog10M Int dq n M_c^(5/3),
with the mass integral ending at the ISCO, M < c^3 / (6^(3/2) pi G (1+z) f).
Density (Middleton et al. 2016, MNRAS 455, L72; mass-ratio term of Chen, Sesana & Del Pozzo 2017),
M the total mass in Msun, ndot0 in Mpc^-3 Gyr^-1:
  n = ndot0 (M/1e7)^(-alpha) exp(-M/Mstar) (1+z)^beta exp(-z/z0) |dt/dz|[Gyr] q^gamma / norm(gamma, qmin),
  |dt/dz| = 1 / ((1+z) H0 sqrt(Om (1+z)^3 + 1 - Om))  (Hogg 1999, astro-ph/9905116).
Constants: G = 6.67430e-11 (CODATA 2018), c = 299792458, GM_sun = 1.3271244e20 (IAU 2015 B3),
au = 149597870700 m (IAU 2012 B2), pc = 648000/pi au (IAU 2015 B2), Julian year 365.25 d.
Run with Debian's python3-scipy: /usr/bin/python3 generate_background.py
"""
import json
import math
import os

import numpy as np
import scipy
from scipy.integrate import tplquad

G = 6.67430e-11
C = 299792458.0
MSUN = 1.3271244e20 / G
PC = 648000.0 / math.pi * 149597870700.0
MPC = 1e6 * PC
YEAR = 365.25 * 86400.0
GYR = 1e9 * YEAR
F_YR = 1.0 / YEAR

POPULATIONS = [
    {"label": "P1", "rateNorm": 1e-3, "alpha": 0.2, "cutoffMass": 1e9, "beta": 2.0, "z0": 1.5, "zMax": 5.0,
     "log10MMin": 6.0, "log10MMax": 11.0, "gamma": -0.5, "qMin": 0.05, "H0": 70.0, "Om0": 0.3},
    {"label": "P2", "rateNorm": 5e-4, "alpha": -0.5, "cutoffMass": 3e8, "beta": 1.0, "z0": 0.8, "zMax": 3.0,
     "log10MMin": 7.0, "log10MMax": 10.5, "gamma": 0.0, "qMin": 0.25, "H0": 67.4, "Om0": 0.315},
    {"label": "P3", "rateNorm": 2e-5, "alpha": 0.5, "cutoffMass": 1e10, "beta": 3.0, "z0": 1.0, "zMax": 6.0,
     "log10MMin": 8.0, "log10MMax": 11.5, "gamma": 1.0, "qMin": 0.1, "H0": 70.0, "Om0": 0.3},
]
FREQS = [1e-9, F_YR, 3e-8, 1e-7, 3e-7]


def hc2(p, f):
    h0 = p["H0"] * 1e3 / MPC
    om = p["Om0"]
    g = p["gamma"]
    norm = -math.log(p["qMin"]) if g == -1 else (1 - p["qMin"] ** (g + 1)) / (g + 1)

    def dtdz_gyr(z):
        return 1.0 / ((1 + z) * h0 * math.sqrt(om * (1 + z) ** 3 + 1 - om)) / GYR

    def x_cut(z):
        m_isco = C ** 3 / (6 ** 1.5 * math.pi * G * (1 + z) * f) / MSUN
        return min(p["log10MMax"], math.log10(m_isco))

    def integrand(q, x, z):  # tplquad order: innermost first
        m = 10.0 ** x
        n = (p["rateNorm"] * (m / 1e7) ** (-p["alpha"]) * math.exp(-m / p["cutoffMass"])
             * (1 + z) ** p["beta"] * math.exp(-z / p["z0"]) * dtdz_gyr(z) * q ** g / norm)
        mc = m * q ** 0.6 / (1 + q) ** 1.2
        return (1 + z) ** (-1.0 / 3.0) * n * mc ** (5.0 / 3.0)

    # Redshifts where the ISCO limit falls below log10MMin contribute nothing.
    z_hi = p["zMax"]
    while z_hi > 0 and x_cut(z_hi) <= p["log10MMin"]:
        z_hi *= 0.5
    val, err = tplquad(integrand, 0.0, z_hi, lambda z: p["log10MMin"], x_cut,
                       lambda z, x: p["qMin"], lambda z, x: 1.0, epsabs=0, epsrel=1e-10)
    pref = 4 * G ** (5.0 / 3.0) / (3 * math.pi ** (1.0 / 3.0) * C ** 2) * f ** (-4.0 / 3.0)
    return pref * val * MSUN ** (5.0 / 3.0) / MPC ** 3, pref * err * MSUN ** (5.0 / 3.0) / MPC ** 3


cases = []
for p in POPULATIONS:
    for f in FREQS:
        v, e = hc2(p, f)
        cases.append({"population": p["label"], "frequencyHz": f, "hc2": v, "hc2_error_estimate": e})
        print(p["label"], f, math.sqrt(v), e / v)

out = {
    "library": f"scipy {scipy.__version__} (numpy {np.__version__})",
    "call": "scipy.integrate.tplquad(integrand(q, log10M, z), 0, zMax, log10MMin, min(log10MMax, log10M_isco(z)), qMin, 1, epsabs=0, epsrel=1e-10)",
    "generator": "test/reference/generate_background.py",
    "formula": "Phinney 2001 strain form, circular kernel, ISCO cut c^3/(6^1.5 pi G M); density of Middleton et al. 2016 with M = total mass",
    "populations": POPULATIONS,
    "cases": cases,
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "background_scipy.json"), "w") as fh:
    json.dump(out, fh, indent=1)
