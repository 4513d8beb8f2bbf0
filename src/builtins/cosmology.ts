// Cosmology built-ins: a flat Lambda-CDM object and distances, volumes and times at redshift z
// (Hogg 1999, astro-ph/9905116). Radiation is neglected.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { quantity } from '../sheet/mathInstance';
import { FlatLambdaCdm } from '../physics/cosmology';
import { scalarSI, where } from './args';
import { CosmologyValue } from './cosmologyValue';
import { cosmologyArg, elementwise, positiveSI, redshiftValue } from './physicsArgs';

const HOGG = 'Hogg 1999, astro-ph/9905116';

function flatCosmology(H0: unknown, omegaM: unknown): CosmologyValue {
  const fn = 'flatCosmology';
  const h = positiveSI(H0, 'hubble', fn, 'H0');
  const om = scalarSI(omegaM, 'dimensionless', fn, 'omegaM');
  if (!(om > 0 && om <= 1)) throw new BuiltinError(`${where(fn, 'omegaM')} must lie in (0, 1] (flat: Omega_Lambda = 1 - Omega_m), got ${om}`);
  return new CosmologyValue(new FlatLambdaCdm({ hubbleSI: h, omegaM: om }));
}

/** A built-in of (cosmology, z) giving a quantity in the display unit. */
function ofRedshift(
  name: string,
  summary: string,
  returns: { unit: string; description: string; display: string },
  source: string,
  compute: (c: FlatLambdaCdm, z: number) => number,
  example: string,
): Builtin {
  return {
    name,
    category: 'cosmology',
    summary,
    args: [
      { name: 'cosmology', unit: 'cosmology', description: 'a flat Lambda-CDM model from flatCosmology' },
      { name: 'z', unit: 'dimensionless', description: 'redshift >= 0, or a list of redshifts (then a list is returned)' },
    ],
    returns: { unit: returns.unit, description: returns.description },
    source,
    example,
    fn: (cosmology: unknown, z: unknown) => {
      const c = cosmologyArg(cosmology, name).model;
      return elementwise(z, 'dimensionless', name, 'z', (x, arg) => {
        const v = compute(c, redshiftValue(x, name, arg));
        return returns.display === '' ? v : quantity(v, returns.display);
      });
    },
  };
}

export const cosmologyBuiltins: Builtin[] = [
  {
    name: 'flatCosmology',
    category: 'cosmology',
    summary: 'A flat Lambda-CDM cosmology (Omega_Lambda = 1 - Omega_m, radiation neglected) for distances, volumes and times.',
    args: [
      { name: 'H0', unit: 'km/s/Mpc', description: 'Hubble constant, > 0' },
      { name: 'omegaM', unit: 'dimensionless', description: 'matter density today Omega_m, in (0, 1]' },
    ],
    returns: { unit: 'cosmology', description: 'a cosmology object for the other cosmology and population built-ins' },
    source: `${HOGG}, eqs. 14-30 (flat, Omega_r = 0)`,
    example: 'flatCosmology(70 km/s/Mpc, 0.3)',
    fn: flatCosmology,
  },
  ofRedshift('expansionRate', 'Dimensionless Hubble rate E(z) = H(z)/H0 = sqrt(Omega_m (1+z)^3 + Omega_Lambda).', { unit: 'dimensionless', description: 'E(z)', display: '' }, `${HOGG}, eq. 14`, (c, z) => c.E(z), 'expansionRate(cosmo, 1) gives 1.76 for Omega_m = 0.3'),
  ofRedshift('comovingDistance', 'Line-of-sight comoving distance D_C = D_H Int_0^z dz/E(z).', { unit: 'Mpc', description: 'D_C', display: 'Mpc' }, `${HOGG}, eq. 15`, (c, z) => c.comovingDistanceM(z), 'comovingDistance(cosmo, 1) gives about 3300 Mpc for H0 = 70, Omega_m = 0.3'),
  ofRedshift('luminosityDistance', 'Luminosity distance D_L = (1+z) D_C.', { unit: 'Mpc', description: 'D_L', display: 'Mpc' }, `${HOGG}, eq. 21`, (c, z) => c.luminosityDistanceM(z), 'luminosityDistance(cosmo, 1)'),
  ofRedshift('comovingVolumeElement', 'Comoving volume per unit redshift over the whole sky, dV_c/dz = 4 pi D_H D_C^2 / E(z).', { unit: 'Gpc^3', description: 'dV_c/dz (per unit z, full sky)', display: 'Gpc^3' }, `${HOGG}, eq. 28 times 4 pi`, (c, z) => c.comovingVolumeElementM3(z), 'comovingVolumeElement(cosmo, 1)'),
  ofRedshift('timePerRedshift', 'Rest-frame time per unit redshift |dt/dz| = 1 / ((1+z) H0 E(z)).', { unit: 'Gyr', description: '|dt/dz|', display: 'Gyr' }, `${HOGG}, eq. 30 integrand`, (c, z) => c.dtdzS(z), 'timePerRedshift(cosmo, 0) gives 1/H0'),
  ofRedshift('lookbackTime', 'Lookback time to redshift z.', { unit: 'Gyr', description: 't_L', display: 'Gyr' }, `${HOGG}, eq. 30`, (c, z) => c.lookbackTimeS(z), 'lookbackTime(cosmo, 1)'),
  ofRedshift('cosmicAge', 'Age of the universe at redshift z (use z = 0 for today).', { unit: 'Gyr', description: 'age at z', display: 'Gyr' }, `${HOGG}, eq. 30 from z to infinity`, (c, z) => c.ageS(z), 'cosmicAge(cosmo, 0) gives about 13.5 Gyr for H0 = 70, Omega_m = 0.3'),
];
