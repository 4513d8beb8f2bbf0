// The same population entered in different units gives the same A_yr through the sheet (unit
// conversion facts: 1 Mpc^-3 Gyr^-1 = 1e9 Gpc^-3 x 1e-3 Myr^-1; M_sun = GM_sun / G with IAU 2015
// Resolution B3 and CODATA 2018; 1 pc = 648000/pi au, IAU 2015 Resolution B2; 1 Julian yr = 365.25 d).
import { describe, expect, it } from 'vitest';
import { sheetOf, siOf, valueOf } from './sheetHelpers';

function demoLike(units: { H0: string; rate: string; cutoff: string; minMass: string; maxMass: string; span: string; cadence: string }) {
  return sheetOf({
    cosmo: `flatCosmology(${units.H0}, 0.3)`,
    pop: `mergerPopulation(cosmo, ${units.rate}, 0.2, ${units.cutoff}, redshiftPowerExp(2, 1.5, 5), massRatioPowerLaw(-0.5, 0.05), ${units.minMass}, ${units.maxMass})`,
    freqs: `frequencyGrid(${units.span}, ${units.cadence}, 30)`,
    spectrum: 'strainSpectrum(pop, freqs)',
    A_yr: 'amplitudeAtYear(spectrum)',
    h_top: 'strainAt(spectrum, 90 nHz)',
  });
}

describe('units', () => {
  const base = demoLike({ H0: '70 km/s/Mpc', rate: '1e-3 Mpc^-3 Gyr^-1', cutoff: '1e9 Msun', minMass: '1e6 Msun', maxMass: '1e11 Msun', span: '14 yr', cadence: '21 day' });
  const other = demoLike({
    H0: '70e3 m/s/(1e6 pc)',
    rate: '1e3 Gpc^-3 Myr^-1',
    cutoff: '(1e9 * 1.3271244e20 / 6.6743e-11) kg',
    minMass: '(1e6 * 1.3271244e20 / 6.6743e-11) kg',
    maxMass: '1e5 (1e6 Msun)',
    span: '(14 * 365.25) day',
    cadence: '3 week',
  });
  it('A_yr is the same (relative 1e-12)', () => {
    const a = siOf(valueOf(base, 'A_yr'));
    const b = siOf(valueOf(other, 'A_yr'));
    expect(a).toBeGreaterThan(1e-16);
    expect(Math.abs(a / b - 1)).toBeLessThan(1e-12);
  });
  it('h_c at 90 nHz, where the ISCO cut acts, is the same', () => {
    expect(Math.abs(siOf(valueOf(base, 'h_top')) / siOf(valueOf(other, 'h_top')) - 1)).toBeLessThan(1e-12);
  });
});
