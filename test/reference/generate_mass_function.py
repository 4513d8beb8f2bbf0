#!/usr/bin/python3
"""Writes test/reference/mass_function.json: number and mass densities of a Schechter mass function per
dex between two masses, in closed form through the upper incomplete gamma function.

phi(M) dlog10M = ln10 Phi* (M/M*)^(1+alpha) e^(-M/M*) dlog10M = Phi* t^alpha e^(-t) dt with t = M/M*
(Schechter 1976, ApJ 203, 297), so
  n(M0 < M < M1)   = Phi* [Gamma(1+alpha, t0) - Gamma(1+alpha, t1)],
  rho(M0 < M < M1) = Phi* M* [Gamma(2+alpha, t0) - Gamma(2+alpha, t1)].
Reference library: scipy.special.gammaincc and gamma; for a <= 0 the recurrence
Gamma(a, x) = (Gamma(a+1, x) - x^a e^(-x)) / a (integration by parts of the definition).
Run with Debian's python3-scipy: /usr/bin/python3 generate_mass_function.py
"""
import json
import os

import numpy as np
import scipy
from scipy.special import gamma, gammaincc


def upper_gamma(a, x):
    if a > 0:
        return float(gammaincc(a, x) * gamma(a))
    return (upper_gamma(a + 1, x) - x**a * np.exp(-x)) / a


cases = []
for phi, mstar, alpha in [(1e-3, 5e8, -0.5), (2e-3, 2e9, 0.3), (5e-4, 1e9, -1.3)]:
    for m0, m1 in [(1e9, 1e11), (1e10, 1e11), (1e9, 1e12), (1e10, 1e12), (1e6, 1e11)]:
        t0, t1 = m0 / mstar, m1 / mstar
        n = phi * (upper_gamma(1 + alpha, t0) - upper_gamma(1 + alpha, t1))
        rho = phi * mstar * (upper_gamma(2 + alpha, t0) - upper_gamma(2 + alpha, t1))
        cases.append({"phiStar_Mpc3": phi, "mStar_Msun": mstar, "alpha": alpha, "m0_Msun": m0, "m1_Msun": m1, "number_Mpc3": n, "mass_Msun_Mpc3": rho})

out = {
    "library": f"scipy {scipy.__version__} (numpy {np.__version__})",
    "calls": [
        "Gamma(a, x) = scipy.special.gammaincc(a, x) * scipy.special.gamma(a) for a > 0, recurrence below",
        "number_Mpc3 = phiStar * (Gamma(1+alpha, m0/mStar) - Gamma(1+alpha, m1/mStar))",
        "mass_Msun_Mpc3 = phiStar * mStar * (Gamma(2+alpha, m0/mStar) - Gamma(2+alpha, m1/mStar))",
    ],
    "cases": cases,
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "mass_function.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
