#!/usr/bin/python3
"""Writes test/reference/galaxy_pairs.json: the black-hole binary density d^3n/(dz dlog10M dq) of the
galaxy route with mass-, ratio- and redshift-dependent pair fraction and merger time, a time shift from
pair to merger, an evolving black-hole-bulge normalisation and log-normal scatter drawn independently for
each black hole (or once per merger), computed from the definitions by direct integration over the galaxy
variables (log10 M_G, q_G), with the pair redshift found by root finding on the age of the universe.

Model (Chen, Sesana & Conselice 2019, MNRAS 488, 401; see src/physics/galaxyPairRoute.ts):
  rate of pairs merging, per dex of M_G, per q_G, per unit time at the pair:
    R = Phi(M_G, z_p) f0 (M_G/1e11)^aF (1+z_p)^bF p(q_G) / [tau0 (M_G/1e11)^aT (1+z_p)^bT q_G^gT]
  merger at t(z_m) = t(z_p) + tau; per unit merger redshift: R |dt/dz|(z_p) dz_p/dz_m (the derivative
  by central differences of the root, not by formula);
  log10 m_i = a + zeta log10(1+z_m) + b (log10 f_bulge + log10 M_i - 11) + eps_i, eps_i ~ N(0, sigma).
Reference libraries: astropy FlatLambdaCDM(Tcmb0=0) ages (the closed form used for speed is checked
against astropy.cosmology age below), scipy.optimize.brentq, scipy.integrate.dblquad / quad.
Run with Debian's python3-scipy and python3-astropy: /usr/bin/python3 generate_galaxy_pairs.py
"""
import json
import math
import os

import astropy
import astropy.units as u
import numpy as np
import scipy
from astropy.cosmology import FlatLambdaCDM
from scipy.integrate import dblquad, quad
from scipy.optimize import brentq

H0, OM = 70.0, 0.3
cosmo = FlatLambdaCDM(H0=H0, Om0=OM, Tcmb0=0)
OL = 1 - OM
H0_GYR = (H0 * u.km / u.s / u.Mpc).to(1 / u.Gyr).value


def age(z):
    # flat Lambda-CDM without radiation: t = 2 / (3 H0 sqrt(OL)) asinh(sqrt(OL/Om) (1+z)^-1.5)
    return 2 / (3 * H0_GYR * math.sqrt(OL)) * math.asinh(math.sqrt(OL / OM) * (1 + z) ** -1.5)


for z in [0, 0.5, 2, 10, 30]:
    ref = cosmo.age(z).to(u.Gyr).value
    assert abs(age(z) / ref - 1) < 1e-9, (z, age(z), ref)


def dtdz(z):
    return 1 / ((1 + z) * H0_GYR * math.sqrt(OM * (1 + z) ** 3 + OL))


MF = dict(log10PhiStar0=-2.8, log10PhiStarSlope=-0.25, mStar=10**10.9, alpha0=-1.2, alphaSlope=-0.05)
PAIR = dict(f0=0.025, alpha=0.2, beta=1.0)
TIME = dict(tau0=0.8, alpha=-0.3, beta=-0.3, gamma=-0.5)
QG_MIN, QG_GAMMA = 0.2, -0.5
QG_NORM = (1 - QG_MIN ** (QG_GAMMA + 1)) / (QG_GAMMA + 1)
FB = 0.5
A, B = 9 + math.log10(0.49), 1.16
ZMAX, ZPAIR_LIMIT = 4.0, 30.0


def phi(y, z):
    r = 10**y / MF["mStar"]
    return math.log(10) * 10 ** (MF["log10PhiStar0"] + MF["log10PhiStarSlope"] * z) * r ** (1 + MF["alpha0"] + MF["alphaSlope"] * z) * math.exp(-r)


def tau(y, qg, zp):
    return TIME["tau0"] * (10 ** (y - 11)) ** TIME["alpha"] * (1 + zp) ** TIME["beta"] * qg ** TIME["gamma"]


def pair_redshift(zm, y, qg):
    tm = age(zm)
    g = lambda zp: age(zp) + tau(y, qg, zp) - tm
    if g(ZPAIR_LIMIT) > 0:
        return None
    return brentq(g, zm, ZPAIR_LIMIT, xtol=1e-14, rtol=1e-15)


def n_galaxy(zm, y, qg, shift, eps=2e-6):
    """Mergers per dex of M_G, per q_G, per unit merger redshift, Mpc^-3."""
    if not (QG_MIN <= qg <= 1):
        return 0.0
    pq = qg**QG_GAMMA / QG_NORM
    if shift:
        zp = pair_redshift(zm, y, qg)
        if zp is None:
            return 0.0
        lo, hi = pair_redshift(zm - eps, y, qg), pair_redshift(zm + eps, y, qg)
        if lo is None or hi is None:
            return 0.0  # at the edge where pairs would form before z = 30 (a set of measure zero)
        dzp_dzm = (hi - lo) / (2 * eps)
        per_z = dtdz(zp) * dzp_dzm
    else:
        zp, per_z = zm, dtdz(zm)
    zc = min(zp, ZMAX)
    pair = PAIR["f0"] * (10 ** (y - 11)) ** PAIR["alpha"] * (1 + zc) ** PAIR["beta"]
    return phi(y, zc) * pair * pq / tau(y, qg, zp) * per_z


def mu(y, zm, zeta):
    return A + zeta * math.log10(1 + zm) + B * (math.log10(FB) + y - 11)


def normal(x, s):
    return math.exp(-0.5 * (x / s) ** 2) / (math.sqrt(2 * math.pi) * s)


def density(zm, logm, q, sigma, scatter, shift, zeta):
    xb = logm - math.log10(1 + q)
    xs = xb + math.log10(q)
    if scatter == "shared":
        # both holes share eps: x2 - x1 = b log10 q_G, so q_G = q^(1/b); density per (x_big, q)
        qg = q ** (1 / B)
        y0 = (xb - A - zeta * math.log10(1 + zm)) / B + 11 - math.log10(FB)
        f = lambda y: n_galaxy(zm, y, qg, shift) * normal(xb - mu(y, zm, zeta), sigma)
        val, _ = quad(f, y0 - 8 * sigma / B, y0 + 8 * sigma / B, epsabs=0, epsrel=1e-10, limit=200)
        # dx_big/dy = b at fixed eps; d q / d q_G = b q_G^(b-1)
        return val * B / (B * qg ** (B - 1)) / B
    total = 0.0
    for x1, x2 in [(xb, xs), (xs, xb)]:
        y0 = (x1 - A - zeta * math.log10(1 + zm)) / B + 11 - math.log10(FB)
        f = lambda qg, y: n_galaxy(zm, y, qg, shift) * normal(x1 - mu(y, zm, zeta), sigma) * normal(x2 - mu(y + math.log10(qg), zm, zeta), sigma)
        val, _ = dblquad(f, y0 - 8 * sigma / B, y0 + 8 * sigma / B, QG_MIN, 1.0, epsabs=0, epsrel=1e-9)
        total += val
    # p(x1, x2) -> (log10 M, q): Jacobian 1 / (q ln10)
    return total / (q * math.log(10))


configs = [
    dict(name="independent, shifted, evolving", sigma=0.3, scatter="independent", shift=True, zeta=0.5),
    dict(name="shared, shifted", sigma=0.3, scatter="shared", shift=True, zeta=0.0),
    dict(name="independent, not shifted", sigma=0.3, scatter="independent", shift=False, zeta=0.5),
]
points = [(0.1, 8.5, 0.3), (0.1, 9.5, 0.8), (1.0, 9.0, 0.5), (1.0, 10.3, 0.25), (2.5, 9.5, 0.9), (2.5, 8.2, 0.4)]
cases = []
for c in configs:
    for zm, logm, q in points:
        d = density(zm, logm, q, c["sigma"], c["scatter"], c["shift"], c["zeta"])
        cases.append({**c, "z": zm, "log10M": logm, "q": q, "density_Mpc3": d})
        print(c["name"], zm, logm, q, d, flush=True)

out = {
    "library": f"scipy {scipy.__version__}, astropy {astropy.__version__} (numpy {np.__version__})",
    "calls": [
        "age(z): flat closed form, checked against FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0).age to 1e-9",
        "z_pair = scipy.optimize.brentq(age(zp) + tau(zp) - age(z_m), z_m, 30, xtol=1e-14, rtol=1e-15); dz_p/dz_m by central difference (2e-6)",
        "independent: scipy.integrate.dblquad over log10 M_G (+-8 sigma/b) and q_G in [0.2, 1], epsrel=1e-9, both orderings",
        "shared: scipy.integrate.quad over log10 M_G, epsrel=1e-10",
    ],
    "parameters": dict(H0=H0, Om0=OM, massFunction=MF, pair=PAIR, time=TIME, qgMin=QG_MIN, qgGamma=QG_GAMMA, bulgeFraction=FB, a=A, b=B, zMax=ZMAX, pairZLimit=ZPAIR_LIMIT),
    "cases": cases,
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "galaxy_pairs.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
