import { describe, expect, it } from 'vitest';
import {
  amplitudeAtNewReference,
  amplitudeForNewIndex,
  omegaGwFromStrain,
  powerLawStrain,
  residualPowerFromStrain,
  strainFromOmegaGw,
  strainFromResidualPower,
} from '../../src/statistics/powerLaw';
import { F_YR_HZ, KM_S_MPC_SI } from '../../src/physics/constants';

describe('power-law conversions', () => {
  it('gamma = 13/3 gives h_c ~ f^(-2/3) (Phinney 2001, astro-ph/0108028)', () => {
    expect(powerLawStrain(1e-15, 13 / 3, F_YR_HZ, 8 * F_YR_HZ)).toBeCloseTo(1e-15 / 4, 28);
  });
  it('residual power of the power law falls as f^-gamma (Thrane & Romano 2013, PRD 88, 124032)', () => {
    const gamma = 3.2;
    const p1 = residualPowerFromStrain(powerLawStrain(2e-15, gamma, F_YR_HZ, 1e-9), 1e-9);
    const p2 = residualPowerFromStrain(powerLawStrain(2e-15, gamma, F_YR_HZ, 4e-9), 4e-9);
    expect(Math.log(p1 / p2) / Math.log(4)).toBeCloseTo(gamma, 12);
  });
  it('Omega_gw of a gamma = 13/3 background grows as f^(2/3) (Phinney 2001)', () => {
    const h0 = 70 * KM_S_MPC_SI;
    const o1 = omegaGwFromStrain(powerLawStrain(2e-15, 13 / 3, F_YR_HZ, 1e-9), 1e-9, h0);
    const o2 = omegaGwFromStrain(powerLawStrain(2e-15, 13 / 3, F_YR_HZ, 8e-9), 8e-9, h0);
    expect(o2 / o1).toBeCloseTo(4, 12);
  });
  it('Omega_gw(f_yr) for A = 1e-15, H0 = 70 km/s/Mpc equals 2 pi^2 f^2 A^2 / (3 H0^2) worked by hand with rounded constants (1.28e-9)', () => {
    // Independent arithmetic: f_yr = 3.1688e-8 Hz, H0 = 2.2685e-18 s^-1 -> 6.580 * 1.0041e-15 * 1e-30 / 1.5438e-35.
    const h0 = 70 * KM_S_MPC_SI;
    const byHand = (2 * 9.8696044 * (3.168809e-8) ** 2 * 1e-30) / (3 * (2.268546e-18) ** 2);
    expect(omegaGwFromStrain(1e-15, F_YR_HZ, h0) / byHand).toBeCloseTo(1, 5);
  });
  it('conversions invert', () => {
    const h0 = 67 * KM_S_MPC_SI;
    expect(strainFromOmegaGw(omegaGwFromStrain(3e-15, 5e-9, h0), 5e-9, h0) / 3e-15).toBeCloseTo(1, 12);
    expect(strainFromResidualPower(residualPowerFromStrain(3e-15, 5e-9), 5e-9) / 3e-15).toBeCloseTo(1, 12);
  });
  it('moving the reference frequency and changing the index about a pivot', () => {
    expect(amplitudeAtNewReference(2e-15, 13 / 3, F_YR_HZ, F_YR_HZ / 10) / (2e-15 * 10 ** (2 / 3))).toBeCloseTo(1, 12);
    // Same strain at the pivot before and after the change of index.
    const fp = F_YR_HZ / 5;
    const a2 = amplitudeForNewIndex(2e-15, 13 / 3, 3.5, F_YR_HZ, fp);
    expect(powerLawStrain(a2, 3.5, F_YR_HZ, fp) / powerLawStrain(2e-15, 13 / 3, F_YR_HZ, fp)).toBeCloseTo(1, 12);
    expect(amplitudeForNewIndex(2e-15, 13 / 3, 3.5, F_YR_HZ, F_YR_HZ)).toBe(2e-15);
  });
  it('refuses non-positive frequencies and H0', () => {
    expect(() => powerLawStrain(1e-15, 13 / 3, 0, 1e-9)).toThrow(/reference frequency/);
    expect(() => omegaGwFromStrain(1e-15, 1e-9, 0)).toThrow(/H0/);
  });
});
