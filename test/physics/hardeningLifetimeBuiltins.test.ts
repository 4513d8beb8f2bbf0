// Hardening delays through the sheet: delayedPopulation and stalledFraction given a mass-scaled
// environment instead of a fixed lifetime, and hardeningLifetime, against the physics functions.
import { describe, expect, it } from 'vitest';
import { M_SUN_KG, GYR_S } from '../../src/physics/constants';
import { hardBinaryLifetime, lifetimeFunction } from '../../src/physics/hardeningLifetime';
import { environmentOfMass, massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA } from '../../src/physics/hostEnvironment';
import { stalledFractionByMass } from '../../src/physics/massDependentDelay';
import type { PopulationValue } from '../../src/builtins/populationValue';
import { errorOf, sheetOf, siOf, valueOf } from './sheetHelpers';

// An invented scenario.
const cells = {
  cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
  pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
  env: 'hostEnvironment(16)',
  slow: 'hostEnvironment(0.1)',
};
const scaled = (H: number) => ({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: H });

describe('hardening delays in the sheet', () => {
  it('hardeningLifetime gives the physics value in Gyr for one mass and a list', () => {
    const s = sheetOf({ ...cells, t1: 'hardeningLifetime(env, 1e9 Msun, 0.5)', tl: 'hardeningLifetime(env, [1e7, 1e10] Msun, 1)' });
    const m = 1e9 * M_SUN_KG;
    expect(Math.abs(siOf(valueOf(s, 't1')) / hardBinaryLifetime(m, 0.5, environmentOfMass(m, scaled(16))) - 1)).toBeLessThan(1e-12);
    const list = (valueOf(s, 'tl') as { toArray(): unknown[] }).toArray();
    expect(Math.abs(siOf(list[1]) / hardBinaryLifetime(1e10 * M_SUN_KG, 1, environmentOfMass(1e10 * M_SUN_KG, scaled(16))) - 1)).toBeLessThan(1e-12);
    expect(siOf(list[1]) / GYR_S).toBeGreaterThan(siOf(list[0]) / GYR_S); // heavier hosts: longer (fixture: 0.027 and 0.24 Gyr)
  });

  it('delayedPopulation and stalledFraction accept an environment in place of the lifetime', () => {
    const s = sheetOf({ ...cells, d: 'delayedPopulation(pop, slow)', st: 'stalledFraction(pop, slow)', a: 'amplitudeAtYear(d)', a0: 'amplitudeAtYear(pop)' });
    const pop = valueOf(s, 'pop') as PopulationValue;
    const expected = stalledFractionByMass(pop.population, pop.cosmology!, lifetimeFunction(massScaledEnvironment(scaled(0.1)), M_SUN_KG));
    expect(Number(valueOf(s, 'st'))).toBe(expected);
    expect(expected).toBeGreaterThan(0);
    expect(Number(valueOf(s, 'a'))).toBeLessThan(Number(valueOf(s, 'a0')));
    expect((valueOf(s, 'd') as PopulationValue).describe()).toMatch(/hardening by stars \(H 0.1\)/);
  });

  it('errors name the built-in and the argument', () => {
    const s = sheetOf({ ...cells, e1: 'delayedPopulation(pop, cosmo)', e2: 'hardeningLifetime(env, 1e9 Msun, 0)', e3: 'hardeningLifetime(pop, 1e9 Msun, 1)', e4: 'stalledFraction(pop, -1 Gyr)' });
    expect(errorOf(s, 'e1')).toMatch(/argument lifetime of delayedPopulation/);
    expect(errorOf(s, 'e2')).toMatch(/argument q of hardeningLifetime must be a mass ratio/);
    expect(errorOf(s, 'e3')).toMatch(/argument environment of hardeningLifetime/);
    expect(errorOf(s, 'e4')).toMatch(/argument lifetime of stalledFraction must not be negative/);
  });
});
