// Built-ins through the sheet: results equal the plain physics (the builtin layer adds only units and
// checks), the conversions follow their formulas, and bad input gives errors naming the argument.
import { describe, expect, it } from 'vitest';
import type { Matrix } from 'mathjs';
import { F_YR_HZ, KM_S_MPC_SI, YEAR_S } from '../../src/physics/constants';
import { characteristicStrainSquared } from '../../src/physics/backgroundIntegral';
import { FlatLambdaCdm } from '../../src/physics/cosmology';
import type { BinaryPopulation } from '../../src/physics/populationTypes';
import type { SpectrumValue } from '../../src/builtins/spectrumValue';
import { errorOf, sheetOf, siOf, valueOf } from './sheetHelpers';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('custom density through a function cell', () => {
  // The same closed-form density written as a function cell and as plain TypeScript.
  const plain: BinaryPopulation = {
    zMin: 0, zMax: 4, log10MMin: 6, log10MMax: 11, qMin: 0.01, qMax: 1,
    density: (z, lm, q) => 1e-4 * Math.exp(-((lm - 8.5) ** 2) / 0.5) * (1 + z) ** 2 * Math.exp(-z) * (0.5 + q),
  };
  const s = sheetOf({
    ndens: 'ndens(z, lm, q) = 1e-4 * exp(-(lm - 8.5)^2 / 0.5) * (1+z)^2 * exp(-z) * (0.5 + q)',
    ndensUnit: 'ndensUnit(z, lm, q) = 1e-4 Mpc^-3 * exp(-(lm - 8.5)^2 / 0.5) * (1+z)^2 * exp(-z) * (0.5 + q)',
    popA: 'customPopulation(ndens, 4)',
    popB: 'customPopulation(ndensUnit, 4, 1e6 Msun, 1e11 Msun, 0.01)',
    ampA: 'amplitudeAtYear(popA)',
    ampB: 'amplitudeAtYear(popB)',
  });
  it('gives the A_yr of the plain density (number taken as Mpc^-3, or a quantity of length^-3)', () => {
    const expected = Math.sqrt(characteristicStrainSquared(plain, [F_YR_HZ])[0]);
    expect(rel(siOf(valueOf(s, 'ampA')), expected)).toBeLessThan(1e-12);
    expect(rel(siOf(valueOf(s, 'ampB')), expected)).toBeLessThan(1e-12);
  });
});

describe('spectrum object', () => {
  const s = sheetOf({
    cosmo: 'flatCosmology(67.4 km/s/Mpc, 0.315)',
    pop: 'mergerPopulation(cosmo, 5e-4 Mpc^-3 Gyr^-1, -0.5, 3e8 Msun, redshiftPowerExp(1, 0.8, 3), massRatioPowerLaw(0, 0.25), 1e7 Msun, 10^10.5 Msun)',
    freqs: 'frequencyGrid(10 yr, 14 day, 12)',
    spectrum: 'strainSpectrum(pop, freqs)',
    A_yr: 'amplitudeAtYear(spectrum)',
    A_pop: 'amplitudeAtYear(pop)',
    h_list: 'strainValues(spectrum)',
    slopes: 'spectralSlope(spectrum)',
  });
  const spec = valueOf(s, 'spectrum') as SpectrumValue;
  it('describes itself and serialises frequencies, h_c and the extra series', () => {
    expect(spec.describe()).toMatch(/^spectrum, 12 frequencies, 3\.2 nHz to 38 nHz$/);
    const json = spec.toJSON() as Record<string, number[]>;
    expect(json.frequencyHz).toHaveLength(12);
    expect(json.hc).toHaveLength(12);
    const h0 = 67.4 * KM_S_MPC_SI;
    for (let i = 0; i < 12; i++) {
      const f = json.frequencyHz[i];
      const h = json.hc[i];
      // Omega_gw = 2 pi^2 f^2 h_c^2 / (3 H0^2) and P = h_c^2 / (12 pi^2 f^3) (Phinney 2001; Jenet et al. 2006, ApJ 653, 1571)
      expect(rel(json.omegaGw[i], (2 * Math.PI ** 2 * f * f * h * h) / (3 * h0 * h0))).toBeLessThan(1e-14);
      expect(rel(json.residualPsd[i], (h * h) / (12 * Math.PI ** 2 * f ** 3))).toBeLessThan(1e-14);
    }
  });
  it('A_yr of the spectrum equals A_yr of the population (computed at f_yr, not interpolated)', () => {
    expect(rel(siOf(valueOf(s, 'A_yr')), siOf(valueOf(s, 'A_pop')))).toBeLessThan(1e-15);
  });
  it('slopes are -2/3 below the ISCO cut (Phinney 2001) for this population', () => {
    const slopes = (valueOf(s, 'slopes') as Matrix).toArray() as number[];
    for (const a of slopes) expect(Math.abs(a + 2 / 3)).toBeLessThan(1e-9);
  });
});

describe('frequency grid (common practice, no source: k/T up to 1/(2 dt))', () => {
  const s = sheetOf({ grid: 'frequencyGrid(14 yr, 21 day)', few: 'frequencyGrid(14 yr, 21 day, 5)' });
  it('holds floor(T / (2 dt)) frequencies k/T', () => {
    const f = ((valueOf(s, 'grid') as Matrix).toArray() as unknown[]).map(siOf);
    expect(f).toHaveLength(Math.floor((14 * 365.25) / 42));
    const T = 14 * YEAR_S;
    f.forEach((x, i) => expect(rel(x, (i + 1) / T)).toBeLessThan(1e-14));
    expect(((valueOf(s, 'few') as Matrix).toArray() as unknown[]).length).toBe(5);
  });
});

describe('conversions', () => {
  const s = sheetOf({
    x_om: 'omegaGwOfStrain(1e-15, 1/(1 yr), 70 km/s/Mpc)',
    x_psd: 'residualPsdOfStrain(1e-15, 1/(1 yr))',
    x_res: 'equivalentResidualOfStrain(1e-15, 1/(1 yr))',
    x_rms: 'rmsResidualOfStrain(1e-15, 1/(1 yr), 1/(1 yr))',
    x_rms_bin: 'rmsResidualOfStrain(1e-15, 1/(1 yr), 1/(14 yr))',
    x_g: 'gammaOfSlope(-2/3)',
    x_al: 'slopeOfGamma(13/3)',
    x_mc: 'chirpMass(2e9 Msun, 1)',
    x_eta: 'symmetricMassRatio(0.5)',
    x_fisco: 'iscoFrequency(1e9 Msun)',
    x_age: 'cosmicAge(flatCosmology(70 km/s/Mpc, 0.3), 0)',
    x_rho: 'schechterMassDensity(1e-3 Mpc^-3, 1e9 Msun, -0.5, 1e3 Msun, 1e12 Msun)',
  });
  it('schechterMassDensity over (nearly) all masses is Phi* M* Gamma(2 + alpha) (Schechter 1976)', () => {
    const msunPerMpc3 = 1.3271244e20 / 6.6743e-11 / ((648000 / Math.PI) * 149597870700 * 1e6) ** 3;
    expect(rel(siOf(valueOf(s, 'x_rho')), 1e-3 * 1e9 * (Math.sqrt(Math.PI) / 2) * msunPerMpc3)).toBeLessThan(1e-6);
  });
  const h0 = 70 * KM_S_MPC_SI;
  it('follow the published conversions (Omega_gw: Phinney 2001; P = h_c^2/(12 pi^2 f^3): Jenet et al. 2006, ApJ 653, 1571; gamma = 3 - 2 alpha)', () => {
    expect(rel(siOf(valueOf(s, 'x_om')), (2 * Math.PI ** 2 * F_YR_HZ ** 2 * 1e-30) / (3 * h0 * h0))).toBeLessThan(1e-14);
    expect(rel(siOf(valueOf(s, 'x_psd')), 1e-30 / (12 * Math.PI ** 2 * F_YR_HZ ** 3))).toBeLessThan(1e-14);
    expect(rel(siOf(valueOf(s, 'x_res')), 1e-15 / (2 * Math.PI * F_YR_HZ))).toBeLessThan(1e-14);
    expect(siOf(valueOf(s, 'x_g'))).toBeCloseTo(13 / 3, 14);
    // rms in a band: sqrt(P df); at df = f it is h_c / (2 sqrt(3) pi f), sqrt(3) below the h_c/(2 pi f) scale
    expect(rel(siOf(valueOf(s, 'x_rms')), 1e-15 / (2 * Math.sqrt(3) * Math.PI * F_YR_HZ))).toBeLessThan(1e-14);
    expect(rel(siOf(valueOf(s, 'x_res')) / siOf(valueOf(s, 'x_rms')), Math.sqrt(3))).toBeLessThan(1e-14);
    expect(rel(siOf(valueOf(s, 'x_rms_bin')), Math.sqrt(1e-30 / (12 * Math.PI ** 2 * F_YR_HZ ** 3) / (14 * 365.25 * 86400)))).toBeLessThan(1e-14);
    expect(siOf(valueOf(s, 'x_al'))).toBeCloseTo(-2 / 3, 14);
  });
  it('mass combinations: M_c = 2^(-6/5) M for equal masses, eta(1/2) = 2/9', () => {
    const msun = 1.3271244e20 / 6.6743e-11;
    expect(rel(siOf(valueOf(s, 'x_mc')), 2e9 * msun * 2 ** (-6 / 5))).toBeLessThan(1e-12);
    expect(rel(siOf(valueOf(s, 'x_eta')), 2 / 9)).toBeLessThan(1e-15);
  });
  it('ISCO GW frequency c^3/(6^(3/2) pi G M) is 4.4 uHz for 1e9 Msun (about 4.4 kHz x Msun/M, common practice)', () => {
    const f = siOf(valueOf(s, 'x_fisco'));
    expect(rel(f, 299792458 ** 3 / (6 ** 1.5 * Math.PI * 1.3271244e20 * 1e9))).toBeLessThan(1e-12);
    expect(f).toBeGreaterThan(4.3e-6);
    expect(f).toBeLessThan(4.5e-6);
  });
  it('cosmicAge agrees with the physics class (Hogg 1999)', () => {
    const c = new FlatLambdaCdm({ hubbleSI: h0, omegaM: 0.3 });
    expect(rel(siOf(valueOf(s, 'x_age')), c.ageS(0))).toBeLessThan(1e-12);
  });
});

describe('bad input gives errors that name the argument', () => {
  const s = sheetOf({
    cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
    zshape: 'redshiftPowerExp(2, 1.5, 5)',
    qshape: 'massRatioPowerLaw(-0.5, 0.05)',
    h0Zero: 'flatCosmology(0 km/s/Mpc, 0.3)',
    h0Neg: 'flatCosmology(-70 km/s/Mpc, 0.3)',
    h0Plain: 'flatCosmology(70, 0.3)',
    omBad: 'flatCosmology(70 km/s/Mpc, 1.3)',
    negMass: 'chirpMass(-1 Msun, 0.5)',
    qBig: 'chirpMass(1 Msun, 1.5)',
    qZero: 'symmetricMassRatio(0)',
    qMinBad: 'massRatioPowerLaw(0, 1.2)',
    zMaxZero: 'redshiftPowerExp(2, 1.5, 0)',
    zMaxNeg: 'customPopulation(ndens, -1)',
    negRate: 'mergerPopulation(cosmo, -1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, zshape, qshape)',
    negCutoff: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, -1e9 Msun, zshape, qshape)',
    massOrder: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, zshape, qshape, 1e9 Msun, 1e8 Msun)',
    rateUnit: 'mergerPopulation(cosmo, 1e-3 Mpc^-3, 0.2, 1e9 Msun, zshape, qshape)',
    ndens: 'ndens(z, lm, q) = 1e-4',
    two: 'two(z, q) = z * q',
    arity: 'customPopulation(two, 4)',
    negDens: 'negDens(z, lm, q) = -1e-4',
    negPop: 'customPopulation(negDens, 4)',
    negSpec: 'strainSpectrum(negPop, [1, 2] nHz)',
    // Wrong dimensions of a custom density: a merger-rate density (per time) and a mass density.
    rateDens: 'rateDens(z, lm, q) = 1e-4 Mpc^-3 Gyr^-1',
    ratePop: 'customPopulation(rateDens, 4)',
    massDens: 'massDens(z, lm, q) = 1e5 Msun / Mpc^3',
    massPop: 'customPopulation(massDens, 4)',
    ratePopSpectrum: 'strainSpectrum(ratePop, [1, 2] nHz)',
    badFreq: 'strainSpectrum(customPopulation(ndens, 4), [1, -2] nHz)',
    notPop: 'strainSpectrum(cosmo, [1, 2] nHz)',
    badCadence: 'frequencyGrid(1 yr, 1 yr)',
  });
  const cases: [string, RegExp][] = [
    ['h0Zero', /argument H0 of flatCosmology must be positive/],
    ['h0Neg', /argument H0 of flatCosmology must be positive, got -70 km/],
    ['h0Plain', /argument H0 of flatCosmology needs a unit of hubble/],
    ['omBad', /argument omegaM of flatCosmology must lie in \(0, 1\]/],
    ['negMass', /argument totalMass of chirpMass must be positive/],
    ['qBig', /argument q of chirpMass must lie in \(0, 1\]/],
    ['qZero', /argument q of symmetricMassRatio must lie in \(0, 1\]/],
    ['qMinBad', /argument qMin of massRatioPowerLaw must lie in \(0, 1\)/],
    ['zMaxZero', /argument zMax of redshiftPowerExp must be a redshift in \(0/],
    ['zMaxNeg', /argument zMax of customPopulation must be a redshift in \(0/],
    ['negRate', /argument rateNorm of mergerPopulation must not be negative/],
    ['negCutoff', /argument cutoffMass of mergerPopulation must be positive/],
    ['massOrder', /argument maxMass of mergerPopulation must exceed minMass/],
    ['rateUnit', /argument rateNorm of mergerPopulation needs a unit of rateDensity/],
    ['arity', /argument density of customPopulation must take 3 arguments, the function given takes 2/],
    ['negPop', /argument density of customPopulation returned -0\.0001 at \(/],
    ['ratePop', /argument density of customPopulation must return a number density in Mpc\^-3 \(length\^-3; a plain number is read as Mpc\^-3\), got .*Gyr.* \(a rateDensity quantity\) at \(z, log10M, q\) = \(2\.000, 8\.500, 0\.1000\)/],
    ['ratePopSpectrum', /^ratePopSpectrum: input ratePop has an error/],
    ['massPop', /argument density of customPopulation must return a number density in Mpc\^-3 .*, got .*Msun.* \(a density quantity\) at/],
    ['badFreq', /argument freqs\[2\] of strainSpectrum/],
    ['notPop', /argument population of strainSpectrum must be a population, got a cosmology/],
    ['badCadence', /argument cadence of frequencyGrid must be shorter than half the span/],
  ];
  for (const [cell, pattern] of cases) it(`${cell}: ${pattern.source}`, () => expect(errorOf(s, cell)).toMatch(pattern));
});
