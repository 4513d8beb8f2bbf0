#!/usr/bin/python3
"""Writes test/reference/sigma_mass_function.json: the local black-hole mass function of the velocity-dispersion
route, computed independently of src/physics/sigmaMassFunction.ts.

Velocity-dispersion function of early-type galaxies (Sheth et al. 2003, ApJ 594, 225, eq. 4):
    phi(sigma) dsigma = phi* (sigma/sigma*)^alpha exp[-(sigma/sigma*)^beta] beta / Gamma(alpha/beta) dsigma/sigma,
(phi*, sigma*, alpha, beta) = (0.0020 h^3 Mpc^-3, 88.8 km/s, 6.5, 1.93), h = 0.7; M-sigma
log10 M = a + b log10(sigma/200 km/s), (a, b) = (8.32, 5.64) (McConnell & Ma 2013, ApJ 764, 184) with a
log-normal intrinsic scatter eps. Here:
  - beta / Gamma(alpha/beta) from scipy.special.gamma (the TypeScript normalises by quadrature);
  - phi_BH per dex by scipy.integrate.quad over ln sigma of phi(ln sigma) times the normal density;
  - n(>M) by quad over ln sigma of phi(ln sigma) times the normal upper tail 0.5 erfc((log10 M - mu)/(sqrt 2 eps))
    (the TypeScript integrates phi_BH over log10 M instead: a different order of integration);
  - the mass density by quad of phi(ln sigma) times the log-normal mean 10^(mu + ln10 eps^2 / 2);
  - without scatter, n(>M) is the dispersion function above sigma(M).
Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_sigma_mass_function.py"""
import json, math, os, platform
import scipy
from scipy.integrate import quad
from scipy.special import erfc, gamma

H = 0.7
PHI, SS, AL, BE = 0.002 * H ** 3, 88.8, 6.5, 1.93
NORMALISATION = BE / gamma(AL / BE)
LO, HI = math.log(SS * 1e-3), math.log(SS * 40.0)

def vdf(ls):
    x = math.exp(ls) / SS
    return PHI * x ** AL * math.exp(-x ** BE) * NORMALISATION

def mu(ls, a, b):
    return a + b * math.log10(math.exp(ls) / 200.0)

def sigma_of(lgm, a, b):
    return math.log(200.0) + math.log(10.0) * (lgm - a) / b

def phi_bh(lgm, a, b, eps):
    if eps == 0:
        return vdf(sigma_of(lgm, a, b)) * math.log(10.0) / b
    c = sigma_of(lgm, a, b)
    w = 10.0 * eps * math.log(10.0) / b
    f = lambda ls: vdf(ls) * math.exp(-0.5 * ((lgm - mu(ls, a, b)) / eps) ** 2) / (math.sqrt(2 * math.pi) * eps)
    return quad(f, max(LO, c - w), min(HI, c + w), epsabs=0, epsrel=1e-12, limit=200, points=[c] if LO < c < HI else None)[0]

def n_above(lgm, a, b, eps):
    if eps == 0:
        return quad(vdf, sigma_of(lgm, a, b), HI, epsabs=0, epsrel=1e-12, limit=200)[0]
    c = sigma_of(lgm, a, b)
    f = lambda ls: vdf(ls) * 0.5 * erfc((lgm - mu(ls, a, b)) / (math.sqrt(2.0) * eps))
    return quad(f, LO, HI, epsabs=0, epsrel=1e-12, limit=400, points=[c])[0]

def mass_density(a, b, eps):
    f = lambda ls: vdf(ls) * 10.0 ** (mu(ls, a, b) + math.log(10.0) * eps * eps / 2.0)
    return quad(f, LO, HI, epsabs=0, epsrel=1e-12, limit=400)[0]

A, B = 8.32, 5.64
cases = []
for eps in (0.38, 0.2, 0.0):
    row = {"scatter_dex": eps, "phi_per_dex": [], "number_above": [], "band_low": [], "band_high": []}
    for lgm in (7.0, 8.0, 9.0, 10.0):
        row["phi_per_dex"].append({"log10M": lgm, "value_Mpc3": phi_bh(lgm, A, B, eps)})
    for lgm in (8.0, 9.0, 10.0):
        row["number_above"].append({"log10M": lgm, "value_Mpc3": n_above(lgm, A, B, eps)})
        vals = [n_above(lgm, A - 0.1, B, eps), n_above(lgm, A + 0.1, B, eps)]
        row["band_low"].append(min(vals))
        row["band_high"].append(max(vals))
    row["mass_density_Msun_Mpc3"] = mass_density(A, B, eps)
    cases.append(row)
    print("eps", eps, "n>1e9 %.4g n>1e10 %.4g rho %.4g" % (row["number_above"][1]["value_Mpc3"], row["number_above"][2]["value_Mpc3"], row["mass_density_Msun_Mpc3"]))
out = {
    "library": "scipy.integrate.quad, scipy.special.gamma, scipy.special.erfc",
    "library_version": scipy.__version__,
    "python_version": platform.python_version(),
    "dispersion_function": {"phi_star_Mpc3": PHI, "h": H, "sigma_star_kms": SS, "alpha": AL, "beta": BE, "beta_over_gamma": NORMALISATION},
    "m_sigma": {"norm": A, "slope": B},
    "band_dex": 0.1,
    "call": "quad over ln sigma in [ln(1e-3 sigma*), ln(40 sigma*)], epsrel=1e-12: phi_BH = Int phi N(log10 M; mu, eps); n(>M) = Int phi 0.5 erfc((log10 M - mu)/(sqrt2 eps)); rho = Int phi 10^(mu + ln10 eps^2/2)",
    "cases": cases,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "sigma_mass_function.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path)
