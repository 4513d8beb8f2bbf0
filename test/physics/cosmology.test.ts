// Flat Lambda-CDM against astropy FlatLambdaCDM(Tcmb0=0) (fixture test/reference/cosmology.json,
// generator test/reference/generate_cosmology.py); relative tolerance 1e-6.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/cosmology.json';
import { GYR_S, KM_S_MPC_SI, MPC_M } from '../../src/physics/constants';
import { FlatLambdaCdm } from '../../src/physics/cosmology';

const TOL = 1e-6;

function close(name: string, actual: number, expected: number, tol = TOL): void {
  const err = Math.abs(actual / expected - 1);
  expect(err, `${name}: expected ${expected}, got ${actual}, relative error ${err.toExponential(2)} > ${tol}`).toBeLessThanOrEqual(tol);
}

describe(`cosmology vs ${fixture.library}`, () => {
  for (const c of fixture.cases) {
    it(`H0 = ${c.H0_km_s_Mpc}, Om0 = ${c.Om0}, z = ${c.z}`, () => {
      const cosmo = new FlatLambdaCdm({ hubbleSI: c.H0_km_s_Mpc * KM_S_MPC_SI, omegaM: c.Om0 });
      close('E(z)', cosmo.E(c.z), c.efunc);
      close('D_C', cosmo.comovingDistanceM(c.z) / MPC_M, c.comoving_distance_Mpc);
      close('D_L', cosmo.luminosityDistanceM(c.z) / MPC_M, c.luminosity_distance_Mpc);
      close('dV_c/dz per sr', cosmo.comovingVolumeElementM3(c.z) / (4 * Math.PI) / MPC_M ** 3, c.differential_comoving_volume_Mpc3_per_sr);
      close('lookback time', cosmo.lookbackTimeS(c.z) / GYR_S, c.lookback_time_Gyr);
      close('age', cosmo.ageS(c.z) / GYR_S, c.age_Gyr);
    });
  }
});

describe('cosmology identities', () => {
  const cosmo = new FlatLambdaCdm({ hubbleSI: 70 * KM_S_MPC_SI, omegaM: 0.3 });
  it('age today = lookback time to z + age at z (Hogg 1999, eq. 30)', () => {
    for (const z of [0.3, 2, 8]) close(`z = ${z}`, cosmo.lookbackTimeS(z) + cosmo.ageS(z), cosmo.ageS(0), 1e-10);
  });
  it('Einstein-de Sitter closed forms at Om = 1: D_C = 2 D_H (1 - 1/sqrt(1+z)), age = 2/(3 H0) (1+z)^(-3/2) (Hogg 1999, eq. 15 integrated)', () => {
    const eds = new FlatLambdaCdm({ hubbleSI: 60 * KM_S_MPC_SI, omegaM: 1 });
    for (const z of [0.01, 1, 30, 1000]) {
      close(`D_C z = ${z}`, eds.comovingDistanceM(z), 2 * eds.hubbleDistanceM * (1 - 1 / Math.sqrt(1 + z)), 1e-12);
      close(`age z = ${z}`, eds.ageS(z), (2 / 3) * eds.hubbleTimeS * Math.pow(1 + z, -1.5), 1e-12);
    }
  });
  it('z = 0 gives zero distance and lookback time', () => {
    expect(cosmo.comovingDistanceM(0)).toBe(0);
    expect(cosmo.lookbackTimeS(0)).toBe(0);
  });
  it('rejects bad parameters and redshifts, naming them', () => {
    expect(() => new FlatLambdaCdm({ hubbleSI: -1, omegaM: 0.3 })).toThrow(/H0 must be positive/);
    expect(() => new FlatLambdaCdm({ hubbleSI: 1e-18, omegaM: 0 })).toThrow(/Omega_m/);
    expect(() => cosmo.comovingDistanceM(-0.5)).toThrow(/redshift must lie/);
    expect(() => cosmo.ageS(NaN)).toThrow(/redshift must lie/);
  });
});
