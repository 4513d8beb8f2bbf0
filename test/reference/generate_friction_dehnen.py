#!/usr/bin/python3
"""Writes test/reference/friction_dehnen.json, two independent checks of the host physics:

1. Dynamical friction: a point mass M on a circular orbit in a singular isothermal sphere of dispersion sigma
   (rho = sigma^2 / (2 pi G r^2), v_c = sqrt(2) sigma) loses angular momentum L = M v_c r at the rate F r, with
   Chandrasekhar's drag F = 4 pi G^2 M^2 rho lnL [erf(X) - 2X exp(-X^2)/sqrt(pi)] / v_c^2, X = v_c/(sqrt(2) sigma)
   (Binney & Tremaine 2008, Galactic Dynamics, 2nd ed., section 8.1). scipy.integrate.solve_ivp (DOP853)
   integrates dr/dt = -F r / (M v_c) from r_i until r = r_f (an event), with scipy.special.erf: no closed form used.
   Mass-scaled cases take sigma from log10 M = 8.32 + 5.64 log10(sigma/200 km/s) (McConnell & Ma 2013, ApJ 764,
   184) for the binary's total mass, the sinking mass m2 = M q/(1+q) and r_f = a_h = G m2/(4 sigma^2).
2. Dehnen host (Dehnen 1993, MNRAS 265, 250): rho(r) = (3-gamma) M_s a / (4 pi r^gamma (r+a)^(4-gamma)), with
   M_s from log10 M = 8.46 + 1.05 log10(M_s/1e11 Msun) (McConnell & Ma 2013) and r_inf = G M / sigma^2; the scale
   radius a is found by scipy.optimize.brentq so that scipy.integrate.quad of 4 pi r^2 rho(r) from 0 to r_inf
   equals 2M; then rho(r_inf) is evaluated from the profile itself.
Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_friction_dehnen.py"""
import json, math, os, platform
import scipy
from scipy.integrate import quad, solve_ivp
from scipy.optimize import brentq
from scipy.special import erf

G = 6.6743e-11
GMSUN = 1.3271244e20
MSUN = GMSUN / G
PC = 648000.0 / math.pi * 149597870700.0
GYR = 1e9 * 365.25 * 86400.0

def sigma_of(m_sun):
    return 200e3 * 10.0 ** ((math.log10(m_sun) - 8.32) / 5.64)

def sink_time(m_kg, sigma, r_i, r_f, lnL):
    vc = math.sqrt(2.0) * sigma
    X = vc / (math.sqrt(2.0) * sigma)
    bracket = erf(X) - 2.0 * X * math.exp(-X * X) / math.sqrt(math.pi)
    def rhs(t, y):
        r = y[0]
        rho = sigma * sigma / (2.0 * math.pi * G * r * r)
        F = 4.0 * math.pi * G * G * m_kg * m_kg * rho * lnL * bracket / (vc * vc)
        return [-F * r / (m_kg * vc)]
    ev = lambda t, y: y[0] - r_f
    ev.terminal = True
    ev.direction = -1
    # time scale for the step bound: the whole infall takes about r_i^2 v_c / (G M lnL)
    scale = r_i * r_i * vc / (G * m_kg * lnL)
    sol = solve_ivp(rhs, [0.0, 10.0 * scale], [r_i], method="DOP853", rtol=1e-12, atol=1e-12 * r_i, events=ev, max_step=scale / 50)
    return sol.t_events[0][0]

friction = []
for m_sun, sigma_kms, r_i_pc, r_f_pc, lnL in [(1e8, 200.0, 1000.0, 1.0, 5.0), (1e6, 80.0, 100.0, 0.5, 3.0), (3e9, 350.0, 5000.0, 10.0, 10.0)]:
    t = sink_time(m_sun * MSUN, sigma_kms * 1e3, r_i_pc * PC, r_f_pc * PC, lnL)
    friction.append({"kind": "fixed", "sinking_mass_sun": m_sun, "sigma_kms": sigma_kms, "start_pc": r_i_pc, "end_pc": r_f_pc, "coulomb_log": lnL, "time_s": t})
for M_sun, q, r_i_pc, lnL in [(1e9, 0.5, 1000.0, 5.0), (1e7, 0.1, 300.0, 4.0), (1e10, 1.0, 3000.0, 8.0)]:
    sigma = sigma_of(M_sun)
    m2 = M_sun * MSUN * q / (1.0 + q)
    a_h = G * m2 / (4.0 * sigma * sigma)
    t = sink_time(m2, sigma, r_i_pc * PC, a_h, lnL)
    friction.append({"kind": "mass-scaled", "M_sun": M_sun, "q": q, "start_pc": r_i_pc, "coulomb_log": lnL, "sigma_kms": sigma / 1e3, "a_h_m": a_h, "time_s": t})

def dehnen_rho(r, Ms, a, g):
    return (3.0 - g) * Ms * a / (4.0 * math.pi * r ** g * (r + a) ** (4.0 - g))

dehnen = []
for M_sun, g in [(1e7, 1.0), (1e9, 1.0), (1e9, 0.5), (1e9, 1.5), (1e10, 2.0), (3e8, 0.0)]:
    M = M_sun * MSUN
    sigma = sigma_of(M_sun)
    Ms = 1e11 * MSUN * 10.0 ** ((math.log10(M_sun) - 8.46) / 1.05)
    r_inf = G * M / sigma ** 2
    enclosed = lambda a: quad(lambda r: 4.0 * math.pi * r * r * dehnen_rho(r, Ms, a, g), 0.0, r_inf, epsabs=0, epsrel=1e-13, limit=200)[0]
    a = brentq(lambda a: enclosed(a) / (2.0 * M) - 1.0, r_inf * 1e-3, r_inf * 1e6, xtol=1e-14 * r_inf, rtol=1e-15, maxiter=500)
    dehnen.append({"M_sun": M_sun, "gamma": g, "sigma_kms": sigma / 1e3, "stellar_mass_sun": Ms / MSUN, "r_inf_m": r_inf, "scale_radius_m": a,
                   "rho_inf_msun_pc3": dehnen_rho(r_inf, Ms, a, g) / (MSUN / PC ** 3), "enclosed_over_2M": enclosed(a) / (2.0 * M)})

for c in friction:
    print("friction", c["kind"], "%.5g Gyr" % (c["time_s"] / GYR))
for c in dehnen:
    print("dehnen", c["M_sun"], c["gamma"], "rho_inf %.5g Msun/pc^3" % c["rho_inf_msun_pc3"], "a/r_inf %.4g" % (c["scale_radius_m"] / c["r_inf_m"]))
out = {
    "library": "scipy.integrate.solve_ivp, scipy.special.erf, scipy.integrate.quad, scipy.optimize.brentq",
    "library_version": scipy.__version__,
    "python_version": platform.python_version(),
    "constants": {"G": G, "GMsun": GMSUN, "pc_m": PC},
    "friction_call": "solve_ivp(dr/dt = -F r/(M v_c), [0, 10 r_i^2 v_c/(G M lnL)], [r_i], method='DOP853', rtol=1e-12, events=r - r_f); F = 4 pi G^2 M^2 rho lnL [erf(1) - 2 e^-1/sqrt(pi)]/v_c^2, rho = sigma^2/(2 pi G r^2)",
    "dehnen_call": "brentq(a -> quad(4 pi r^2 rho_Dehnen(r; M_s, a, gamma), 0, r_inf, epsrel=1e-13)/(2M) - 1); rho_inf = rho_Dehnen(r_inf)",
    "friction": friction,
    "dehnen": dehnen,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "friction_dehnen.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path)
