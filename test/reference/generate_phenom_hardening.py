#!/usr/bin/python3
"""Writes test/reference/phenom_hardening.json: the phenomenological hardening model with a total lifetime
(form of Agazie et al. 2023, ApJL 952, L37), by scipy, in physical units, sharing no code or substitution
with src/physics/phenomHardening.ts:

  da/dt = -A x^(1 - nu_in) (1 + x)^(nu_in - nu_out) - B / a^3,  x = a / a_c,
  B = (64/5) G^3 m1 m2 M / c^5 (Peters 1964, Phys. Rev. 136, B1224, eq. 5.6),
  T(A) = Int_{6GM/c^2}^{a_0} da / |da/dt|  (scipy.integrate.quad in ln a, break points at ln a_c and at the
         separation where the two terms are equal),
  A: T(A) = tau_f by scipy.optimize.brentq on ln A.

Residence factor at rest-frame GW frequency f_r (circular orbit, a = (G M / (pi f_r)^2)^(1/3)):
  R = (dt/dln f)_total / (dt/dln f)_GW = (B / a^3) / |da/dt|.
Spectrum (Phinney 2001, astro-ph/0108028) of a population at one mass ratio q0 (n per unit q on
[q0, q0 + dq], dq = 1e-8, so the q integral is the value at q0):
  h_c^2(f) = 4 G / (pi c^2 f^2) Int dz Int dlog10M n(z, M) / (1+z) (pi^(2/3)/3) G^(2/3) M_c^(5/3) f_r^(2/3) R(f_r, M, q0),
  n = n0 (1+z)^2 e^(-z) (M / 1e8 Msun)^(-0.5) Mpc^-3, z in [0, 3], log10 M in [7, 9.5], f_r = (1+z) f,
by scipy.integrate.dblquad (mass outside, redshift inside), A solved once per mass.
Constants: G = 6.67430e-11, c = 299792458, GM_sun = 1.3271244e20, pc = 648000/pi au, Julian year.
Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_phenom_hardening.py"""
import json, math, os, platform
import scipy
from scipy.integrate import quad, dblquad
from scipy.optimize import brentq

G = 6.67430e-11
C = 299792458.0
MSUN = 1.3271244e20 / G
PC = 648000.0 / math.pi * 149597870700.0
MPC = 1e6 * PC
GYR = 1e9 * 365.25 * 86400.0


def gw_constant(m, q):
    m1 = m / (1 + q)
    m2 = m - m1
    return 64.0 / 5.0 * G ** 3 * m1 * m2 * m / C ** 5


def env_rate(a, A, p):
    x = a / p["a_c"]
    return A * x ** (1 - p["nu_in"]) * (1 + x) ** (p["nu_in"] - p["nu_out"])


def lifetime(A, m, q, p):
    B = gw_constant(m, q)
    lo, hi = math.log(6 * G * m / C ** 2), math.log(p["a_0"])
    f = lambda u: math.exp(u) / (env_rate(math.exp(u), A, p) + B * math.exp(-3 * u))
    pts = [math.log(p["a_c"])]
    # where the environment and GW rates are equal (a bisection in ln a on the rates' ratio)
    if A > 0:
        g = lambda u: math.log(env_rate(math.exp(u), A, p)) - math.log(B) + 3 * u
        if g(lo) * g(hi) < 0:
            pts.append(brentq(g, lo, hi, xtol=1e-12))
    pts = [x for x in pts if lo < x < hi]
    val, err = quad(f, lo, hi, points=pts or None, epsabs=0, epsrel=1e-13, limit=2000)
    return val


def normalisation(m, q, p):
    tau = p["tau_Gyr"] * GYR
    env_only = quad(lambda u: math.exp(u) / env_rate(math.exp(u), 1.0, p), math.log(6 * G * m / C ** 2), math.log(p["a_0"]),
                    points=[math.log(p["a_c"])], epsabs=0, epsrel=1e-13, limit=2000)[0]
    top = math.log(env_only / tau)
    lnA = brentq(lambda u: math.log(lifetime(math.exp(u), m, q, p) / tau), top - 80, top + 1e-9, xtol=1e-14, rtol=1e-15)
    return math.exp(lnA)


def residence(fr, m, q, A, p):
    a = (G * m / (math.pi * fr) ** 2) ** (1.0 / 3.0)
    b = gw_constant(m, q) / a ** 3
    return b / (env_rate(a, A, p) + b)


MODELS = [
    {"label": "defaults", "tau_Gyr": 3.0, "nu_in": -1.0, "nu_out": 2.5, "a_c_pc": 100.0, "a_0_pc": 1e4},
    {"label": "short, steep inside", "tau_Gyr": 0.1, "nu_in": -1.5, "nu_out": 2.5, "a_c_pc": 100.0, "a_0_pc": 1e4},
    {"label": "flat inside, long", "tau_Gyr": 11.0, "nu_in": 0.0, "nu_out": 2.5, "a_c_pc": 10.0, "a_0_pc": 1e3},
    {"label": "rising inside", "tau_Gyr": 1.0, "nu_in": 0.5, "nu_out": 1.0, "a_c_pc": 30.0, "a_0_pc": 3e3},
]
for p in MODELS:
    p["a_c"] = p["a_c_pc"] * PC
    p["a_0"] = p["a_0_pc"] * PC

lifetime_cases = []
for p in MODELS:
    for m_sun, q in [(1e6, 0.1), (1e8, 1.0), (1e9, 0.3), (3e10, 1.0)]:
        m = m_sun * MSUN
        A = normalisation(m, q, p)
        check = lifetime(A, m, q, p) / (p["tau_Gyr"] * GYR) - 1
        times = [{"A_m_s": s * A, "T_s": lifetime(s * A, m, q, p)} for s in (0.1, 10.0)]
        res = [{"f_r_Hz": fr, "R": residence(fr, m, q, A, p)} for fr in (1e-9, 3e-9, 1e-8, 3e-8, 1e-7)]
        lifetime_cases.append({"model": p["label"], "M_sun": m_sun, "q": q, "A_m_s": A, "T_check": check, "times": times, "residence": res})
        print(p["label"], m_sun, q, "A = %.6e m/s" % A, "T/tau - 1 = %.1e" % check)

# Spectrum of a population at one mass ratio (header).
N0 = 1e-3  # Mpc^-3 per unit z per dex per unit q
Q0 = 0.5
LOG10M = (7.0, 9.5)
ZR = (0.0, 3.0)


def density(z, lg):
    return N0 * (1 + z) ** 2 * math.exp(-z) * (10 ** (lg - 8)) ** -0.5


def strain2(f, p):
    cache = {}

    def norm_of(lg):
        if lg not in cache:
            cache[lg] = normalisation(10 ** lg * MSUN, Q0, p) if p else 0.0
        return cache[lg]

    eta = Q0 / (1 + Q0) ** 2

    def integrand(z, lg):
        m = 10 ** lg * MSUN
        mc = m * eta ** 0.6
        fr = (1 + z) * f
        de = math.pi ** (2 / 3) / 3 * G ** (2 / 3) * mc ** (5 / 3) * fr ** (2 / 3)
        r = residence(fr, m, Q0, norm_of(lg), p) if p else 1.0
        return density(z, lg) / MPC ** 3 / (1 + z) * de * r

    val, err = dblquad(integrand, LOG10M[0], LOG10M[1], ZR[0], ZR[1], epsabs=0, epsrel=1e-10)
    return 4 * G / (math.pi * C ** 2 * f ** 2) * val, 4 * G / (math.pi * C ** 2 * f ** 2) * err


spectrum_cases = []
for p in (MODELS[0], MODELS[1]):
    for f in (1e-9, 3e-9, 1e-8, 3e-8):
        hc2, err = strain2(f, p)
        gw, _ = strain2(f, None)
        spectrum_cases.append({"model": p["label"], "f_Hz": f, "hc2": hc2, "hc2_error": err, "hc2_gw_only": gw})
        print("spectrum", p["label"], f, "hc2 %.6e" % hc2, "ratio to GW only %.6f" % (hc2 / gw))

out = {
    "library": "scipy.integrate.quad, scipy.integrate.dblquad, scipy.optimize.brentq",
    "library_version": scipy.__version__,
    "python_version": platform.python_version(),
    "constants": {"G": G, "c": C, "GMsun": 1.3271244e20, "pc_m": PC},
    "call": "T(A) = quad(lambda u: e^u / (A x^(1-nu_in) (1+x)^(nu_in-nu_out) + B e^(-3u)), ln(6GM/c^2), ln a_0, points=[ln a_c, ln a_eq], epsrel=1e-13); A = exp(brentq(ln T(e^u)/tau, ...)); h_c^2 = 4G/(pi c^2 f^2) dblquad(n/(1+z) dE/dlnf_r R, log10M, z, epsrel=1e-10)",
    "models": [{k: v for k, v in p.items() if k not in ("a_c", "a_0")} for p in MODELS],
    "lifetime_cases": lifetime_cases,
    "spectrum_population": {"n0_per_Mpc3": N0, "q0": Q0, "dq": 1e-8, "log10MMin": LOG10M[0], "log10MMax": LOG10M[1], "zMin": ZR[0], "zMax": ZR[1],
                            "density": "n0 (1+z)^2 e^(-z) (M/1e8 Msun)^(-0.5) per unit z, dex and q"},
    "spectrum_cases": spectrum_cases,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "phenom_hardening.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path)
