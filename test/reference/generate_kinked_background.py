#!/usr/bin/python3
"""Writes test/reference/kinked_background_scipy.json: h_c^2(f) of separable user densities whose
redshift integrand has a kink, by scipy's adaptive quadrature (QUADPACK qags/qagp), independent of the
project's Gauss-Legendre integrator.

Formula (Phinney 2001, astro-ph/0108028, strain form with the circular kernel, M_c^(5/3) = M^(5/3) eta):
  h_c^2(f) = 4 G^(5/3) / (3 pi^(1/3) c^2) f^(-4/3) Int dz (1+z)^(-1/3) Z(z) Int_{log10MMin}^{x_cut(z)} dlog10M
             M^(5/3) m(log10M) Int dq p(q) eta(q),
  x_cut(z) = min(log10MMax, log10(c^3 / (6^(3/2) pi G (1+z) f) / Msun))  (Schwarzschild ISCO),
for densities n = Z(z) m(log10M) p(q) in Mpc^-3 per unit z, per dex, per unit q (M the total mass, Msun).
The kinks: where x_cut crosses log10MMax inside the redshift range (passed to quad as a break point),
and powers z^a with a < 2 at z = 0 (an end-point singularity of a derivative; qags extrapolates).
Constants: G = 6.67430e-11 (CODATA 2018), c = 299792458, GM_sun = 1.3271244e20 (IAU 2015 B3),
au = 149597870700 m (IAU 2012 B2), pc = 648000/pi au (IAU 2015 B2), Julian year 365.25 d.
Run with Debian's python3-scipy: /usr/bin/python3 generate_kinked_background.py
"""
import json
import math
import os

import numpy as np
import scipy
from scipy.integrate import quad

G = 6.67430e-11
C = 299792458.0
MSUN = 1.3271244e20 / G
PC = 648000.0 / math.pi * 149597870700.0
MPC = 1e6 * PC
YEAR = 365.25 * 86400.0
F_YR = 1.0 / YEAR

# Each density: Z(z) = norm z^a (1+z)^b exp(-z/z0); m(x) = (M/1e8)^(-alpha) exp(-M/Mstar) (Mstar null: no
# cutoff); p(q) = q^gamma normalised on [qMin, 1].
DENSITIES = [
    {"label": "cut crosses the upper mass limit (power-law masses, no cutoff)", "id": "K1",
     "norm": 1e-4, "a": 0.0, "b": 2.0, "z0": 1.5, "alpha": 0.3, "mStar": None,
     "zMax": 5.0, "log10MMin": 7.0, "log10MMax": 10.8, "gamma": -0.5, "qMin": 0.05},
    {"label": "z^0.5 at z = 0", "id": "K2",
     "norm": 1e-4, "a": 0.5, "b": 0.0, "z0": 1.0, "alpha": 0.3, "mStar": 1e9,
     "zMax": 5.0, "log10MMin": 6.0, "log10MMax": 11.0, "gamma": 0.0, "qMin": 0.1},
    {"label": "z^1.5 at z = 0", "id": "K3",
     "norm": 1e-4, "a": 1.5, "b": 0.0, "z0": 1.0, "alpha": 0.3, "mStar": 1e9,
     "zMax": 5.0, "log10MMin": 6.0, "log10MMax": 11.0, "gamma": 0.0, "qMin": 0.1},
    {"label": "z^0.3 at z = 0 and the cut crossing the upper mass limit", "id": "K4",
     "norm": 1e-4, "a": 0.3, "b": 1.0, "z0": 2.0, "alpha": 0.5, "mStar": None,
     "zMax": 4.0, "log10MMin": 7.0, "log10MMax": 10.6, "gamma": -1.0, "qMin": 0.05},
]
FREQS = [F_YR, 2e-8, 5e-8, 1e-7]


def z_factor(d, z):
    return d["norm"] * z ** d["a"] * (1 + z) ** d["b"] * math.exp(-z / d["z0"])


def mass_factor(d, x):
    m = 10.0 ** x
    v = (m / 1e8) ** (-d["alpha"])
    return v * math.exp(-m / d["mStar"]) if d["mStar"] else v


def x_isco(z, f):
    return math.log10(C ** 3 / (6 ** 1.5 * math.pi * G * (1 + z) * f) / MSUN)


def hc2(d, f):
    lo, hi = d["log10MMin"], d["log10MMax"]
    g = d["gamma"]
    q_norm = quad(lambda q: q ** g, d["qMin"], 1.0, epsabs=0, epsrel=1e-13, limit=200)[0]
    eta_pdf = quad(lambda q: q ** g / q_norm * q / (1 + q) ** 2, d["qMin"], 1.0, epsabs=0, epsrel=1e-13, limit=200)[0]

    def mass_integral(x_top):  # Int dx M^(5/3) m(x) (M in Msun)
        if x_top <= lo:
            return 0.0
        return quad(lambda x: 10.0 ** (5.0 / 3.0 * x) * mass_factor(d, x), lo, x_top, epsabs=0, epsrel=1e-13, limit=200)[0]

    full = mass_integral(hi)

    def z_integrand(z):
        xc = x_isco(z, f)
        return (1 + z) ** (-1.0 / 3.0) * z_factor(d, z) * (full if xc >= hi else mass_integral(xc))

    # kinks of the z integrand: x_cut = log10MMax and x_cut = log10MMin
    kinks = [k for k in (10 ** (x_isco(0, f) - hi) - 1, 10 ** (x_isco(0, f) - lo) - 1) if 0 < k < d["zMax"]]
    val, err = quad(z_integrand, 0.0, d["zMax"], points=kinks or None, epsabs=0, epsrel=1e-12, limit=400)
    pref = 4 * G ** (5.0 / 3.0) / (3 * math.pi ** (1.0 / 3.0) * C ** 2) * f ** (-4.0 / 3.0) * MSUN ** (5.0 / 3.0) / MPC ** 3
    return pref * eta_pdf * val, pref * eta_pdf * err, kinks


cases = []
for d in DENSITIES:
    for f in FREQS:
        v, e, kinks = hc2(d, f)
        cases.append({"density": d["id"], "frequencyHz": f, "hc2": v, "hc2_error_estimate": e, "kinkRedshifts": kinks})
        print(d["id"], f, v, e / v, kinks)

out = {
    "library": f"scipy {scipy.__version__} (numpy {np.__version__})",
    "call": "scipy.integrate.quad over z (points = the redshifts where the ISCO cut crosses the mass limits, epsrel 1e-12) of quad over log10M (epsrel 1e-13); Int dq p(q) eta by quad",
    "generator": "test/reference/generate_kinked_background.py",
    "formula": "Phinney 2001 strain form, circular kernel, ISCO cut c^3/(6^1.5 pi G M); n = norm z^a (1+z)^b exp(-z/z0) (M/1e8)^(-alpha) exp(-M/mStar) q^gamma / Int q^gamma dq",
    "densities": DENSITIES,
    "cases": cases,
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "kinked_background_scipy.json"), "w") as fh:
    json.dump(out, fh, indent=1)
