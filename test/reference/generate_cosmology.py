#!/usr/bin/python3
"""Writes test/reference/cosmology.json: flat Lambda-CDM distances and times from astropy.

Reference library: astropy.cosmology.FlatLambdaCDM with Tcmb0=0 (no radiation, as in
src/physics/cosmology.ts). Run with Debian's python3-astropy: /usr/bin/python3 generate_cosmology.py
"""
import json
import os

import astropy
import astropy.units as u
import numpy as np
from astropy.cosmology import FlatLambdaCDM

PARAMS = [(70.0, 0.3), (67.4, 0.315), (73.0, 0.25), (55.0, 1.0)]
REDSHIFTS = [1e-4, 0.01, 0.1, 0.5, 1.0, 2.0, 3.7, 5.0, 10.0, 100.0]

cases = []
for h0, om in PARAMS:
    cosmo = FlatLambdaCDM(H0=h0, Om0=om, Tcmb0=0)
    for z in REDSHIFTS:
        cases.append({
            "H0_km_s_Mpc": h0,
            "Om0": om,
            "z": z,
            "efunc": float(cosmo.efunc(z)),
            "comoving_distance_Mpc": float(cosmo.comoving_distance(z).to_value(u.Mpc)),
            "luminosity_distance_Mpc": float(cosmo.luminosity_distance(z).to_value(u.Mpc)),
            "differential_comoving_volume_Mpc3_per_sr": float(cosmo.differential_comoving_volume(z).to_value(u.Mpc**3 / u.sr)),
            "lookback_time_Gyr": float(cosmo.lookback_time(z).to_value(u.Gyr)),
            "age_Gyr": float(cosmo.age(z).to_value(u.Gyr)),
        })

out = {
    "library": f"astropy {astropy.__version__} (numpy {np.__version__})",
    "calls": [
        "FlatLambdaCDM(H0=H0_km_s_Mpc, Om0=Om0, Tcmb0=0)",
        "efunc(z)", "comoving_distance(z).to_value(u.Mpc)", "luminosity_distance(z).to_value(u.Mpc)",
        "differential_comoving_volume(z).to_value(u.Mpc**3/u.sr)", "lookback_time(z).to_value(u.Gyr)",
        "age(z).to_value(u.Gyr)",
    ],
    "generator": "test/reference/generate_cosmology.py",
    "cases": cases,
}
with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "cosmology.json"), "w") as fh:
    json.dump(out, fh, indent=1)
print(f"wrote {len(cases)} cases")
