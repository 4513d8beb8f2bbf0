// Orbit and environment built-ins through the sheet: values, units and error messages.
import { describe, expect, it } from 'vitest';
import type { Matrix } from 'mathjs';
import { sheetOf, si } from '../sheet/helpers';
import type { SpectrumValue } from '../../src/builtins/spectrumValue';
import { eccentricityEnhancement, harmonicPower } from '../../src/physics/petersMathews';

// An invented scenario: population and cosmology parameters are made up for the test.
const base = {
  cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
  pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
  freqs: 'frequencyGrid(12 yr, 14 day, 8)',
};

function errorOf(sheet: ReturnType<typeof sheetOf>, name: string): string {
  const s = sheet.state(name);
  if (s.status !== 'error') throw new Error(`${name} has no error (status ${s.status})`);
  return s.error.message;
}

describe('orbit built-ins', () => {
  it('harmonicPower and eccentricityEnhancement give the physics values (Peters & Mathews 1963): g(2,0) = 1', () => {
    const s = sheetOf({ g2: 'harmonicPower(2, 0)', g7: 'harmonicPower(7, 0.6)', enh: 'eccentricityEnhancement([0, 0.5])' });
    expect(s.value('g2')).toBe(1);
    expect(s.value('g7')).toBe(harmonicPower(7, 0.6));
    expect(((s.value('enh') as Matrix).toArray() as number[])[1]).toBe(eccentricityEnhancement(0.5));
  });

  it('eccentricSpectrum with e0 = 0 and a start frequency below the band equals strainSpectrum (circular limit), to 1e-12', () => {
    const s = sheetOf({ ...base, circ: 'strainSpectrum(pop, freqs)', ecc: 'eccentricSpectrum(pop, freqs, 0, 1e-4 nHz)' });
    const a = s.value('circ') as SpectrumValue;
    const b = s.value('ecc') as SpectrumValue;
    expect(b.kind).toBe('spectrum');
    for (let k = 0; k < a.hc.length; k++) expect(Math.abs(b.hc[k] / a.hc[k] - 1)).toBeLessThan(1e-12);
  });

  it('the same environment in different units gives the same spectrum', () => {
    const s = sheetOf({
      ...base,
      inSolar: 'stellarSpectrum(pop, freqs, 100 Msun/pc^3, 200 km/s, 16)',
      inSI: 'stellarSpectrum(pop, freqs, (100 Msun/pc^3) to kg/m^3, 200000 m/s, 16)',
    });
    const a = s.value('inSolar') as SpectrumValue;
    const b = s.value('inSI') as SpectrumValue;
    for (let k = 0; k < a.hc.length; k++) expect(Math.abs(b.hc[k] / a.hc[k] - 1)).toBeLessThan(1e-12);
  });

  it('a custom e0 density from a function cell is accepted; eccentricityAt maps lists', () => {
    const s = sheetOf({ pe: 'pe(x) = x * (1 - x)', dist: 'eccentricityCustom(pe, 0, 0.9)', phiAt: 'harmonicSumFactor(dist, 30)', eAt: 'eccentricityAt(0.5, 1 nHz, [1, 4] nHz)' });
    expect(si(s.value('phiAt'))).toBeGreaterThan(0);
    const e = (s.value('eAt') as Matrix).toArray() as number[];
    expect(e[0]).toBe(0.5);
    expect(e[1]).toBeLessThan(0.5);
  });

  it('bentSpectrum is the bent power law of bentStrain as a spectrum object (Sampson, Cornish & McWilliams 2015)', () => {
    const s = sheetOf({ ...base, list: 'bentStrain(freqs, 2e-15, 3 nHz, 10/3)', spec: 'bentSpectrum(freqs, 2e-15, 3 nHz, 10/3)' });
    const list = (s.value('list') as Matrix).toArray() as number[];
    const spec = s.value('spec') as SpectrumValue;
    expect(spec.kind).toBe('spectrum');
    for (let k = 0; k < list.length; k++) expect(spec.hc[k]).toBe(list[k]);
  });

  it('finite-number built-ins return counts, a thinned spectrum and strains', () => {
    const s = sheetOf({ ...base, n: 'binariesPerBin(pop, freqs, 12 yr)', thin: 'thinnedSpectrum(pop, freqs, 12 yr)', loud: 'loudestBinaryStrain(pop, freqs, 12 yr)' });
    const n = (s.value('n') as Matrix).toArray() as number[];
    const thin = s.value('thin') as SpectrumValue;
    expect(n.length).toBe(8);
    expect(thin.series.smoothHc.values.length).toBe(8);
    for (let k = 0; k < 8; k++) expect(thin.hc[k]).toBeLessThanOrEqual(thin.series.smoothHc.values[k]);
  });

  it('bad arguments give domain or unit errors that name the function and the argument', () => {
    const s = sheetOf({
      ...base,
      e1: 'harmonicPower(2, 1)',
      e2: 'harmonicPower(0, 0.3)',
      e3: 'eccentricEmission(0.97, 1 nHz)',
      e4: 'eccentricityAt(-0.1, 1 nHz, 2 nHz)',
      e5: 'stellarEmission(-1 Msun/pc^3, 200 km/s, 16)',
      e6: 'stellarEmission(100 Msun/pc^3, -5 km/s, 16)',
      e7: 'stellarEmission(100 Msun/pc^3, 200 km/s, 0)',
      e8: 'bendEmission(3 nHz, 0)',
      e9: 'bentStrain(freqs, 2e-15, 3 nHz, -1)',
      e10: 'binariesPerBin(pop, freqs, 0 yr)',
      e11: 'eccentricEmission(0.5, 1 Msun)',
      e12: 'eccentricityUniform(0.6, 0.2)',
      e13: 'stellarTransitionFrequency(1e9 Msun, 1.5, 100 Msun/pc^3, 200 km/s, 16)',
      negDensity: 'negDensity(x) = x - 0.5',
      e14: 'eccentricityCustom(negDensity, 0, 0.9)',
      e15: 'eccentricSpectrum(cosmo, freqs, 0.5, 1 nHz)',
      e16: 'stellarSpectrum(pop, [1, -2] nHz, 100 Msun/pc^3, 200 km/s, 16)',
    });
    expect(errorOf(s, 'e1')).toMatch(/argument e of harmonicPower must be an eccentricity in \[0, 1\), got 1/);
    expect(errorOf(s, 'e2')).toMatch(/argument n of harmonicPower must be a whole number/);
    expect(errorOf(s, 'e3')).toMatch(/argument e0 of eccentricEmission must be an eccentricity in \[0, 0.95\], got 0.97/);
    expect(errorOf(s, 'e4')).toMatch(/argument e0 of eccentricityAt/);
    expect(errorOf(s, 'e5')).toMatch(/argument density of stellarEmission must be a positive stellar density, got -1 Msun/);
    expect(errorOf(s, 'e6')).toMatch(/argument dispersion of stellarEmission must be a positive velocity dispersion/);
    expect(errorOf(s, 'e7')).toMatch(/argument hardening of stellarEmission must be a positive hardening rate/);
    expect(errorOf(s, 'e8')).toMatch(/argument kappa of bendEmission must be a positive bend index, got 0/);
    expect(errorOf(s, 'e9')).toMatch(/argument kappa of bentStrain/);
    expect(errorOf(s, 'e10')).toMatch(/argument span of binariesPerBin must be positive/);
    expect(errorOf(s, 'e11')).toMatch(/argument f0 of eccentricEmission needs a unit of frequency/);
    expect(errorOf(s, 'e12')).toMatch(/argument hi of eccentricityUniform must exceed lo/);
    expect(errorOf(s, 'e13')).toMatch(/argument q of stellarTransitionFrequency must be a mass ratio in \(0, 1\]/);
    expect(errorOf(s, 'e14')).toMatch(/argument density of eccentricityCustom must not be negative/);
    expect(errorOf(s, 'e15')).toMatch(/argument population of eccentricSpectrum must be a population, got a cosmology/);
    expect(errorOf(s, 'e16')).toMatch(/argument freqs\[2\] of stellarSpectrum must be a positive frequency/);
  });
});
