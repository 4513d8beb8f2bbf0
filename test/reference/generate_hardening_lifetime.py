#!/usr/bin/python3
"""Writes test/reference/hardening_lifetime.json: the time a circular binary takes from the hard-binary
separation a_h = G m2 / (4 sigma^2) (Quinlan 1996, New Astron. 1, 35) to coalescence when stars harden it,
da/dt = -G rho H a^2 / sigma (Quinlan 1996), and GW emission does, da/dt = -(64/5) G^3 m1 m2 M / (c^5 a^3)
(Peters 1964, Phys. Rev. 136, B1224, eq. 5.6):
    T = Int_0^{a_h} da / (G rho H a^2 / sigma + (64/5) G^3 m1 m2 M / (c^5 a^3)),
integrated by scipy.integrate.quad in ln a (from ln a_h - 60 to ln a_h, where the lower end contributes
below e^-200 of the total), in physical units: no substitution shared with src/physics/hardeningLifetime.ts.
Mass-scaled cases take sigma from log10 M = 8.32 + 5.64 log10(sigma/200 km/s) (McConnell & Ma 2013, ApJ 764,
184) and rho = sigma^6 / (2 pi G^3 M^2) (singular isothermal sphere at r_inf = G M / sigma^2).
Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_hardening_lifetime.py"""
import json, math, os, platform
import scipy
from scipy.integrate import quad

G = 6.6743e-11
C = 299792458.0
GMSUN = 1.3271244e20
MSUN = GMSUN / G
PC = 648000.0 / math.pi * 149597870700.0
GYR = 1e9 * 365.25 * 86400.0

def lifetime(m_sun, q, rho_msun_pc3, sigma_kms, H):
    m = m_sun * MSUN
    m1 = m / (1 + q)
    m2 = m - m1
    rho = rho_msun_pc3 * MSUN / PC ** 3
    sigma = sigma_kms * 1e3
    A = G * rho * H / sigma
    B = 64.0 / 5.0 * G ** 3 * m1 * m2 * m / C ** 5
    ah = G * m2 / (4 * sigma * sigma)
    f = lambda u: math.exp(u) / (A * math.exp(2 * u) + B * math.exp(-3 * u))
    at = (B / A) ** 0.2
    lo, hi = math.log(ah) - 60.0, math.log(ah)
    pts = [math.log(at)] if lo < math.log(at) < hi else None
    val, err = quad(f, lo, hi, points=pts, epsabs=0, epsrel=1e-13, limit=500)
    return val, err, ah

def scaled(m_sun):
    sigma = 200e3 * 10.0 ** ((math.log10(m_sun) - 8.32) / 5.64)
    m = m_sun * MSUN
    rho = sigma ** 6 / (2 * math.pi * G ** 3 * m * m)
    return rho / (MSUN / PC ** 3), sigma / 1e3

cases = []
for m_sun, q, rho, sigma, H in [(1e9, 1.0, 500.0, 250.0, 16.0), (1e8, 0.1, 2000.0, 150.0, 15.0), (3e10, 0.5, 50.0, 350.0, 20.0), (1e6, 0.05, 1e4, 80.0, 16.0)]:
    val, err, ah = lifetime(m_sun, q, rho, sigma, H)
    cases.append({"kind": "fixed", "M_sun": m_sun, "q": q, "rho_msun_pc3": rho, "sigma_kms": sigma, "H": H, "a_h_m": ah, "T_s": val, "quad_error_s": err})
for m_sun, q in [(1e7, 1.0), (1e9, 1.0), (1e9, 0.3), (1e10, 0.1)]:
    rho, sigma = scaled(m_sun)
    val, err, ah = lifetime(m_sun, q, rho, sigma, 16.0)
    cases.append({"kind": "mass-scaled", "M_sun": m_sun, "q": q, "rho_msun_pc3": rho, "sigma_kms": sigma, "H": 16.0, "a_h_m": ah, "T_s": val, "quad_error_s": err})
for c in cases:
    print(c["kind"], c["M_sun"], c["q"], "T = %.4g Gyr" % (c["T_s"] / GYR))
out = {
    "library": "scipy.integrate.quad",
    "library_version": scipy.__version__,
    "python_version": platform.python_version(),
    "constants": {"G": G, "c": C, "GMsun": GMSUN, "pc_m": PC},
    "call": "quad(lambda u: e^u / (A e^(2u) + B e^(-3u)), ln a_h - 60, ln a_h, points=[ln a_t], epsrel=1e-13, limit=500); A = G rho H / sigma, B = (64/5) G^3 m1 m2 M / c^5, a_h = G m2 / (4 sigma^2)",
    "cases": cases,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "hardening_lifetime.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path)
