#!/usr/bin/python3
"""Writes test/reference/peters_evolution.json: eccentricity against orbital-frequency ratio f/f0 from a
direct numerical integration of Peters 1964 (Phys. Rev. 136, B1224) da/dt and de/dt, an independent check of
the closed form a(e) used in src/physics/petersEvolution.ts.
The ratio de/d(ln a) = a (de/dt)/(da/dt) is integrated in u = ln(a/a0) (masses cancel), and Kepler's law
gives f/f0 = exp(-3u/2). Run (Debian python3-scipy): /usr/bin/python3 test/reference/generate_peters_evolution.py"""
import json, os, platform
import numpy as np
import scipy
from scipy.integrate import solve_ivp

def de_dlna(u, y):
    e = y[0]
    e2 = e * e
    dadt = -(64.0 / 5.0) * (1 + 73.0 / 24.0 * e2 + 37.0 / 96.0 * e2 * e2) / (1 - e2) ** 3.5  # times G^3 m1 m2 M / (c^5 a^3)
    dedt = -(304.0 / 15.0) * e * (1 + 121.0 / 304.0 * e2) / (1 - e2) ** 2.5  # times G^3 m1 m2 M / (c^5 a^4)
    return [dedt / dadt]  # a cancels: (de/dt) a / (da/dt)

ratios = [1.0, 1.5, 2.0, 3.0, 10.0, 30.0, 100.0, 1e3, 1e4, 1e5]
runs = []
for e0 in (0.05, 0.3, 0.6, 0.9, 0.99):
    u_eval = [-(2.0 / 3.0) * np.log(r) for r in ratios]
    sol = solve_ivp(de_dlna, (0.0, u_eval[-1]), [e0], method="DOP853", t_eval=u_eval, rtol=1e-13, atol=1e-300)
    assert sol.success, sol.message
    runs.append({"e0": e0, "points": [{"frequencyRatio": r, "e": float(e)} for r, e in zip(ratios, sol.y[0])]})
out = {
    "library": "scipy.integrate.solve_ivp",
    "library_version": scipy.__version__,
    "numpy_version": np.__version__,
    "python_version": platform.python_version(),
    "call": "solve_ivp(de/dln a from Peters 1964 eqs. da/dt, de/dt, (0, -(2/3) ln 1e5), [e0], method='DOP853', t_eval=-(2/3) ln(f/f0), rtol=1e-13, atol=1e-300)",
    "runs": runs,
}
path = os.path.join(os.path.dirname(os.path.abspath(__file__)), "peters_evolution.json")
with open(path, "w") as fh:
    json.dump(out, fh, indent=1)
print("wrote", path)
