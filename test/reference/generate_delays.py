#!/usr/bin/python3
"""Writes test/reference/delays.json: formation redshifts of binaries that coalesce a fixed lifetime
after formation, and the ratio |dt/dz|(z_c) / |dt/dz|(z_f), from astropy.

Reference library: astropy.cosmology.FlatLambdaCDM with Tcmb0=0 (no radiation, as in
src/physics/cosmology.ts) and astropy.cosmology.z_at_value. Run with Debian's python3-astropy:
/usr/bin/python3 generate_delays.py
"""
import json
import os

import astropy
import astropy.units as u
import numpy as np
from astropy.cosmology import FlatLambdaCDM, z_at_value

cases = []
for h0, om in [(70.0, 0.3), (67.4, 0.315)]:
    cosmo = FlatLambdaCDM(H0=h0, Om0=om, Tcmb0=0)
    for tau in [0.1, 1.0, 3.0, 8.0]:
        for zc in [0.0, 0.05, 0.5, 1.0, 2.0, 4.0]:
            t_f = cosmo.age(zc) - tau * u.Gyr
            if t_f <= 0.01 * u.Gyr:
                continue
            zf = float(z_at_value(cosmo.age, t_f, zmin=zc, zmax=1e4, ztol=1e-12, maxfun=10000))
            # |dt/dz| = 1 / ((1+z) H(z)) (Hogg 1999 eq. 30 integrand)
            ratio = float(((1 + zf) * cosmo.H(zf)) / ((1 + zc) * cosmo.H(zc)))
            cases.append({"H0_km_s_Mpc": h0, "Om0": om, "tau_Gyr": tau, "z_c": zc, "z_f": zf, "dtdz_ratio": ratio})
    # the redshift below which binaries of lifetime tau stall (coalesce after today)
    for tau in [1.0, 3.0, 8.0]:
        t = cosmo.age(0) - tau * u.Gyr
        zs = float(z_at_value(cosmo.age, t, zmin=0, zmax=1e4, ztol=1e-12, maxfun=10000))
        cases.append({"H0_km_s_Mpc": h0, "Om0": om, "tau_Gyr": tau, "z_c": 0.0, "z_f": zs, "dtdz_ratio": None, "stall": True})

out = {
    "library": f"astropy {astropy.__version__} (numpy {np.__version__})",
    "calls": [
        "FlatLambdaCDM(H0=H0_km_s_Mpc, Om0=Om0, Tcmb0=0)",
        "z_f = z_at_value(cosmo.age, cosmo.age(z_c) - tau_Gyr*u.Gyr, zmin=z_c, zmax=1e4, ztol=1e-12, maxfun=10000)",
        "dtdz_ratio = (1+z_f) H(z_f) / ((1+z_c) H(z_c))",
    ],
    "cases": cases,
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "delays.json"), "w") as fh:
    json.dump(out, fh, indent=1)
    fh.write("\n")
