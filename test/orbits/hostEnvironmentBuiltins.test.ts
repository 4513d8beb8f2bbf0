// Mass-scaled environment built-ins through the sheet: values against the physics functions, units,
// and error messages that name the argument.
import { describe, expect, it } from 'vitest';
import type { Matrix } from 'mathjs';
import { sheetOf, si } from '../sheet/helpers';
import type { SpectrumValue } from '../../src/builtins/spectrumValue';
import { M_SUN_KG } from '../../src/physics/constants';
import { dispersionOfMass, environmentOfMass, massScaledEnvironment, MCCONNELL_MA_2013_M_SIGMA } from '../../src/physics/hostEnvironment';
import { transitionFrequencyFunction } from '../../src/physics/stellarHardening';

// An invented scenario: population and cosmology parameters are made up for the test.
const base = {
  cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
  pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
  freqs: 'frequencyGrid(12 yr, 14 day, 8)',
  env: 'hostEnvironment(16)',
};

function errorOf(sheet: ReturnType<typeof sheetOf>, name: string): string {
  const s = sheet.state(name);
  if (s.status !== 'error') throw new Error(`${name} has no error (status ${s.status})`);
  return s.error.message;
}

describe('mass-scaled environment built-ins', () => {
  it('hostDispersion, hostDensity and environmentTransition return the physics values in km/s, Msun/pc^3 and nHz', () => {
    const s = sheetOf({
      ...base,
      sig: 'hostDispersion(1e9 Msun)',
      sigList: 'hostDispersion([1e8, 1e9] Msun, 8.5, 4.4)',
      rho: 'hostDensity(1e9 Msun)',
      f_t: 'environmentTransition(env, 1e9 Msun, 0.5)',
    });
    const m = 1e9 * M_SUN_KG;
    expect(si(s.value('sig'))).toBeCloseTo(dispersionOfMass(m), 6);
    const list = (s.value('sigList') as Matrix).toArray() as unknown[];
    expect(si(list[0])).toBeCloseTo(dispersionOfMass(1e8 * M_SUN_KG, { norm: 8.5, slope: 4.4 }), 6);
    expect(Math.abs(si(s.value('rho')) / environmentOfMass(m, { mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: 16 }).densityKgM3 - 1)).toBeLessThan(1e-12);
    const expected = transitionFrequencyFunction(massScaledEnvironment({ mSigma: MCCONNELL_MA_2013_M_SIGMA, hardeningRate: 16 }))(m, 0.5);
    expect(Math.abs(si(s.value('f_t')) / expected - 1)).toBeLessThan(1e-12);
    expect(String(s.value('sig'))).toMatch(/km \/ s/);
  });

  it('environmentSpectrum equals strainSpectrum with environmentEmission, lies below the circular spectrum, approaching it with frequency (within 1% at the highest bin, where only binaries below about 1e7 Msun still feel the stars)', () => {
    const s = sheetOf({
      ...base,
      circ: 'strainSpectrum(pop, freqs)',
      envSpec: 'environmentSpectrum(pop, freqs, env)',
      viaEmission: 'strainSpectrum(pop, freqs, environmentEmission(env))',
      ecc: 'environmentSpectrum(pop, freqs, env, 0.5)',
    });
    const circ = (s.value('circ') as SpectrumValue).hc;
    const env = (s.value('envSpec') as SpectrumValue).hc;
    const via = (s.value('viaEmission') as SpectrumValue).hc;
    const ecc = (s.value('ecc') as SpectrumValue).hc;
    for (let k = 0; k < env.length; k++) expect(env[k]).toBe(via[k]);
    for (let k = 0; k < env.length; k++) {
      expect(env[k]).toBeLessThan(circ[k]);
      if (k > 0) expect(env[k] / circ[k]).toBeGreaterThan(env[k - 1] / circ[k - 1]);
    }
    expect(env[env.length - 1] / circ[circ.length - 1]).toBeGreaterThan(0.99);
    expect(ecc.every((h) => Number.isFinite(h) && h >= 0)).toBe(true);
  });

  it('errors name the built-in and the argument', () => {
    const s = sheetOf({
      ...base,
      e1: 'hostEnvironment(0)',
      e2: 'hostEnvironment(16, 8.3, -1)',
      e3: 'hostDispersion(-1 Msun)',
      e4: 'environmentTransition(env, 1e9 Msun, 2)',
      e5: 'environmentEmission(pop)',
      e6: 'environmentSpectrum(pop, freqs, env, 1.2)',
      e7: 'hostDensity(1e9 km)',
    });
    expect(errorOf(s, 'e1')).toMatch(/argument hardening of hostEnvironment must be a positive hardening rate H/);
    expect(errorOf(s, 'e2')).toMatch(/argument mSigmaSlope of hostEnvironment must be a positive slope/);
    expect(errorOf(s, 'e3')).toMatch(/argument totalMass of hostDispersion must be a positive mass/);
    expect(errorOf(s, 'e4')).toMatch(/argument q of environmentTransition must be a mass ratio in \(0, 1\]/);
    expect(errorOf(s, 'e5')).toMatch(/argument environment of environmentEmission/);
    expect(errorOf(s, 'e6')).toMatch(/environmentSpectrum/);
    expect(errorOf(s, 'e7')).toMatch(/argument totalMass of hostDensity/);
  });
});
