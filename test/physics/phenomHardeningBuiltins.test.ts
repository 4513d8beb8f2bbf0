// The phenomenological hardening model through the sheet: the model's defaults, the residence factor
// against scipy (test/reference/phenom_hardening.json), phenomSpectrum as the delayed population with the
// model's emission, delayedPopulation and stalledFraction taking the model as their lifetime, and errors
// that name the built-in and the argument.
import { describe, expect, it } from 'vitest';
import fixture from '../reference/phenom_hardening.json';
import { GYR_S, PC_M } from '../../src/physics/constants';
import { stalledFraction } from '../../src/physics/delayedPopulation';
import type { PhenomHardeningValue } from '../../src/builtins/phenomHardening';
import type { PopulationValue } from '../../src/builtins/populationValue';
import type { SpectrumValue } from '../../src/builtins/spectrumValue';
import { errorOf, sheetOf, siOf, valueOf } from './sheetHelpers';

// An invented scenario.
const cells = {
  cosmo: 'flatCosmology(70 km/s/Mpc, 0.3)',
  pop: 'mergerPopulation(cosmo, 1e-3 Mpc^-3 Gyr^-1, 0.2, 1e9 Msun, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05))',
  freqs: '[2, 5, 10, 30] nHz',
  model: 'phenomHardening(3 Gyr)',
};

describe('phenomenological hardening in the sheet', () => {
  it('defaults: inner index -1, outer +2.5, break 100 pc, initial separation 1e4 pc (the fiducial values the header of src/physics/phenomHardening.ts cites)', () => {
    const s = sheetOf(cells);
    const h = (valueOf(s, 'model') as PhenomHardeningValue).model;
    expect(h.lifetimeS / GYR_S).toBeCloseTo(3, 12);
    expect([h.innerIndex, h.outerIndex]).toEqual([-1, 2.5]);
    expect(h.breakSeparationM / PC_M).toBeCloseTo(100, 10);
    expect(h.initialSeparationM / PC_M).toBeCloseTo(1e4, 8);
  });

  it('phenomResidence matches scipy for the default model at M = 1e8 Msun, q = 1 (absolute 1e-8)', () => {
    const c = fixture.lifetime_cases.find((x) => x.model === 'defaults' && x.M_sun === 1e8 && x.q === 1)!;
    const s = sheetOf({ ...cells, r: `phenomResidence(model, 1e8 Msun, 1, [${c.residence.map((r) => r.f_r_Hz * 1e9).join(', ')}] nHz)` });
    const got = (valueOf(s, 'r') as { toArray(): unknown[] }).toArray().map(siOf);
    c.residence.forEach((r, i) => expect(Math.abs(got[i] - r.R), `f_r = ${r.f_r_Hz}: expected ${r.R}, got ${got[i]}`).toBeLessThan(1e-8));
  });

  it('phenomSpectrum is strainSpectrum of delayedPopulation(pop, model) with phenomEmission(model), and bends below the delayed circular spectrum', () => {
    const s = sheetOf({
      ...cells,
      s1: 'phenomSpectrum(pop, freqs, model)',
      s2: 'strainSpectrum(delayedPopulation(pop, model), freqs, phenomEmission(model))',
      s3: 'strainSpectrum(delayedPopulation(pop, 3 Gyr), freqs)',
    });
    const a = (valueOf(s, 's1') as SpectrumValue).spectrum.hc;
    const b = (valueOf(s, 's2') as SpectrumValue).spectrum.hc;
    const c = (valueOf(s, 's3') as SpectrumValue).spectrum.hc;
    expect(Array.from(a)).toEqual(Array.from(b));
    // every lifetime is 3 Gyr (the GW time from 1e4 pc is far longer), so the delay is that of a fixed 3 Gyr
    a.forEach((x, i) => expect(x).toBeLessThan(c[i]));
    expect(a[3] / c[3]).toBeGreaterThan(a[0] / c[0]);
  });

  it('delayedPopulation and stalledFraction take the model as their lifetime (every lifetime 3 Gyr here)', () => {
    const s = sheetOf({ ...cells, d: 'delayedPopulation(pop, model)', st: 'stalledFraction(pop, model)' });
    const pop = valueOf(s, 'pop') as PopulationValue;
    expect(Number(valueOf(s, 'st'))).toBe(stalledFraction(pop.population, pop.cosmology!, 3 * GYR_S));
    expect((valueOf(s, 'd') as PopulationValue).describe()).toMatch(/coalescing 3 Gyr after formation \(phenomenological hardening\)/);
  });

  it('errors name the built-in and the argument', () => {
    const s = sheetOf({
      ...cells,
      e1: 'phenomHardening(-1 Gyr)',
      e2: 'phenomHardening(3 kg)',
      e3: 'phenomHardening(3 Gyr, -1, 2.5, -5 pc)',
      e4: 'phenomHardening(3 Gyr, -1, 2.5, 100 pc, 0 pc)',
      e5: 'phenomEmission(3)',
      e6: 'phenomSpectrum(pop, freqs, cosmo)',
      e7: 'phenomResidence(model, 1e9 Msun, 1.5, 3 nHz)',
      e8: 'delayedPopulation(pop, cosmo)',
      e9: 'phenomHardening(3 Gyr, 1/0)',
    });
    expect(errorOf(s, 'e1')).toMatch(/argument lifetime of phenomHardening must not be negative/);
    expect(errorOf(s, 'e2')).toMatch(/lifetime of phenomHardening/);
    expect(errorOf(s, 'e3')).toMatch(/argument breakSeparation of phenomHardening must be a positive finite length/);
    expect(errorOf(s, 'e4')).toMatch(/argument initialSeparation of phenomHardening must be a positive finite length/);
    expect(errorOf(s, 'e5')).toMatch(/argument hardening of phenomEmission must be a phenomHardening/);
    expect(errorOf(s, 'e6')).toMatch(/argument hardening of phenomSpectrum must be a phenomHardening/);
    expect(errorOf(s, 'e7')).toMatch(/argument q of phenomResidence must be a mass ratio/);
    expect(errorOf(s, 'e8')).toMatch(/argument lifetime of delayedPopulation must be a time, an environment or a phenomHardening, got cosmology/);
    expect(errorOf(s, 'e9')).toMatch(/argument innerIndex of phenomHardening is not finite/);
  });
});
