// Units of the trade against their defining resolutions. The defining numbers are typed here from
// the resolutions themselves, not read from src/physics/constants.ts.
import { describe, expect, it } from 'vitest';
import { sheetOf, si } from './helpers';

// IAU 2015 Resolution B3: nominal solar mass parameter GM_sun = 1.3271244e20 m^3 s^-2.
const GM_SUN = 1.3271244e20;
// CODATA 2018 (Tiesinga et al. 2021, Rev. Mod. Phys. 93, 025010): G = 6.67430e-11 m^3 kg^-1 s^-2.
const G = 6.6743e-11;
// IAU 2012 Resolution B2: au = 149597870700 m exactly.
const AU = 149597870700;

describe('units of the trade', () => {
  const s = sheetOf({
    msun: '1 Msun to kg',
    pc_m: '1 pc to m',
    mpc_pc: '(1 Mpc) / (1 pc)',
    yr_s: '1 yr to s',
    gyr_yr: '(1 Gyr) / (1 yr)',
    au_m: '1 au to m',
    f_yr: '(1 / (1 yr)) to nHz',
  });

  it('Msun is GM_sun / G (IAU 2015 B3 with CODATA 2018 G)', () => {
    expect(si(s.value('msun'))).toBeCloseTo(GM_SUN / G, -20); // absolute 1e20 kg of 2e30: 5e-11 relative
    expect(Math.abs(si(s.value('msun')) / (GM_SUN / G) - 1)).toBeLessThan(1e-14);
  });

  it('pc is 648000/pi au (IAU 2015 B2) and au is exact (IAU 2012 B2)', () => {
    expect(si(s.value('au_m'))).toBe(AU);
    expect(Math.abs(si(s.value('pc_m')) / ((648000 / Math.PI) * AU) - 1)).toBeLessThan(1e-15);
    // Numerical value of the parsec, 3.085677581491367e16 m (astropy.constants.pc, Debian python3-astropy).
    expect(Math.abs(si(s.value('pc_m')) / 3.085677581491367e16 - 1)).toBeLessThan(1e-15);
    expect(si(s.value('mpc_pc'))).toBeCloseTo(1e6, 6);
  });

  it('yr is the Julian year, 365.25 days of 86400 s (IAU)', () => {
    expect(si(s.value('yr_s'))).toBe(365.25 * 86400);
    expect(si(s.value('gyr_yr'))).toBeCloseTo(1e9, 3);
  });

  it('f_yr = 1/yr is about 31.69 nHz (1e9 / 31557600, independent arithmetic)', () => {
    const v = s.value('f_yr') as { toNumber(u: string): number };
    expect(v.toNumber('nHz')).toBeCloseTo(1e9 / 31557600, 10);
  });
});
