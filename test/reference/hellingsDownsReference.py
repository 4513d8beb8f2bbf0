#!/usr/bin/env python3
"""Writes test/reference/hellingsDowns.json: reference values for the Hellings & Downs correlation
(Hellings & Downs 1983, ApJ 265, L39) computed with scipy, independently of the closed form where
possible. Run from the repository root:  python3 test/reference/hellingsDownsReference.py

Contents (each entry records the exact scipy call):
- overlap: the correlation at given separations by integrating the product of the two pulsars'
  antenna patterns over gravitational-wave directions with scipy.integrate.dblquad, normalised by
  3/(8 pi) so that co-located distinct pulsars give 1/2 (Hellings & Downs 1983 normalisation).
  Antenna pattern of pulsar p for a wave travelling along Omega with polarisation tensor e^A:
  F^A = (1/2) p^i p^j e^A_ij / (1 + Omega . p) (Anholm et al. 2009, PRD 79, 084030).
- zeroCrossings: roots of (3/2) x ln x - x/4 + 1/2 = 0 in closed form with the Lambert W function,
  x = -1 / (3 W_k(-exp(-1/6)/3)), k = 0 and -1 (scipy.special.lambertw), as separation angles.
- minimum: minimiser of the closed form by scipy.optimize.minimize_scalar (bounded, xatol 1e-12).
- meanSquare: Int_0^1 Gamma(x)^2 dx by scipy.integrate.quad (x = (1 - cos zeta)/2 is uniform on
  [0, 1] for isotropic positions).
"""
import json
import math
import sys

import numpy as np
import scipy
from scipy import integrate, optimize, special


def antenna(p, theta, phi):
    """(F_plus, F_cross) of pulsar direction p for a wave travelling along (theta, phi)."""
    st, ct, sp, cp = math.sin(theta), math.cos(theta), math.sin(phi), math.cos(phi)
    omega = np.array([st * cp, st * sp, ct])
    m = np.array([ct * cp, ct * sp, -st])
    n = np.array([-sp, cp, 0.0])
    pm, pn, po = p @ m, p @ n, p @ omega
    denom = 1.0 + po
    if denom < 1e-300:
        return 0.0, 0.0
    return 0.5 * (pm * pm - pn * pn) / denom, 0.5 * (2 * pm * pn) / denom


def overlap(zeta):
    pa = np.array([0.0, 0.0, 1.0])
    pb = np.array([math.sin(zeta), 0.0, math.cos(zeta)])

    def integrand(theta, phi):
        fa = antenna(pa, theta, phi)
        fb = antenna(pb, theta, phi)
        return (fa[0] * fb[0] + fa[1] * fb[1]) * math.sin(theta)

    # dblquad(func(y, x), x in [0, 2 pi] (phi), y in [0, pi] (theta))
    val, err = integrate.dblquad(integrand, 0.0, 2 * math.pi, 0.0, math.pi, epsabs=1e-10, epsrel=1e-10)
    return 3.0 / (8.0 * math.pi) * val, 3.0 / (8.0 * math.pi) * err


def closed(x):
    return 1.5 * x * math.log(x) - x / 4 + 0.5 if x > 0 else 0.5


def main():
    degrees = [0.5, 5, 20, 45, 60, 82.7, 90, 110, 135, 160, 179.5]
    overlaps = []
    for d in degrees:
        v, e = overlap(math.radians(d))
        overlaps.append({"separationDeg": d, "gamma": v, "absErrorEstimate": e})
    z = -math.exp(-1.0 / 6.0) / 3.0
    crossings = []
    for k in (-1, 0):
        w = special.lambertw(z, k).real
        x = -1.0 / (3.0 * w)
        crossings.append({"branch": k, "x": x, "separationDeg": math.degrees(math.acos(1 - 2 * x))})
    res = optimize.minimize_scalar(lambda zeta: closed((1 - math.cos(zeta)) / 2), bounds=(0.5, 2.5),
                                   method="bounded", options={"xatol": 1e-12})
    ms, ms_err = integrate.quad(lambda x: closed(x) ** 2, 0.0, 1.0, epsabs=1e-14, epsrel=1e-13)
    out = {
        "generator": "test/reference/hellingsDownsReference.py",
        "library": f"scipy {scipy.__version__}, numpy {np.__version__}, python {sys.version.split()[0]}",
        "overlap": {
            "call": "scipy.integrate.dblquad(integrand, 0, 2*pi, 0, pi, epsabs=1e-10, epsrel=1e-10) * 3/(8 pi); "
                    "integrand = sum_A F^A_a F^A_b sin(theta), F^A = (1/2) p^i p^j e^A_ij / (1 + Omega.p)",
            "values": overlaps,
        },
        "zeroCrossings": {
            "call": "x = -1/(3*scipy.special.lambertw(-exp(-1/6)/3, k).real), zeta = acos(1 - 2x)",
            "values": crossings,
        },
        "minimum": {
            "call": "scipy.optimize.minimize_scalar(Gamma(zeta), bounds=(0.5, 2.5), method='bounded', options={'xatol': 1e-12})",
            "separationDeg": math.degrees(res.x),
            "gamma": float(res.fun),
        },
        "meanSquare": {
            "call": "scipy.integrate.quad(lambda x: Gamma(x)**2, 0, 1, epsabs=1e-14, epsrel=1e-13)",
            "value": ms,
            "absErrorEstimate": ms_err,
        },
    }
    with open("test/reference/hellingsDowns.json", "w") as fh:
        json.dump(out, fh, indent=2)
        fh.write("\n")


if __name__ == "__main__":
    main()
