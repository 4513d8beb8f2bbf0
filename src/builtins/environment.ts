// Environment built-ins: stellar hardening (Quinlan 1996) combined with GW emission, alone or with
// eccentric orbits that start where the environment lets go, and the generic low-frequency bend of
// Sampson, Cornish & McWilliams 2015. Units and argument checks here; physics in src/physics.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { isUnit, math, quantity } from '../sheet/mathInstance';
import { circularGwKernel } from '../physics/circularKernel';
import { stellarEccentricKernel, stellarEmissionKernel, stellarResidenceFactor, stellarTransitionFrequency, type StellarEnvironment } from '../physics/stellarHardening';
import { bendEmissionKernel, bentPowerLawStrain, BEND_INDEX } from '../physics/bendSpectrum';
import { scalarSI, vectorSI, where } from './args';
import { elementwise, guardedPhysics, positiveSI } from './physicsArgs';
import { checkSpectrumArgs, EmissionModel, initialEccentricityArg } from './orbits';
import { spectrumBuiltins } from './spectrum';
import { SpectrumValue } from './spectrumValue';
import { equivalentResidual, residualPowerSpectralDensity } from '../physics/spectrumConversions';

const QUINLAN = 'Quinlan 1996, New Astron. 1, 35';
const BEND = 'Sampson, Cornish & McWilliams 2015, Phys. Rev. D 91, 084055';

/** density, dispersion, hardening rate H: all checked, errors name the argument. */
/** A value as the user wrote it, for messages. */
function shown(v: unknown): string {
  return isUnit(v) ? (v as { toString(): string }).toString() : String(v);
}

function environmentArgs(density: unknown, dispersion: unknown, hardening: unknown, fn: string): StellarEnvironment {
  const rho = scalarSI(density, 'density', fn, 'density');
  if (!(rho > 0)) throw new BuiltinError(`${where(fn, 'density')} must be a positive stellar density, got ${shown(density)}`);
  const sigma = scalarSI(dispersion, 'velocity', fn, 'dispersion');
  if (!(sigma > 0)) throw new BuiltinError(`${where(fn, 'dispersion')} must be a positive velocity dispersion, got ${shown(dispersion)}`);
  const H = scalarSI(hardening, 'dimensionless', fn, 'hardening');
  if (!(H > 0)) throw new BuiltinError(`${where(fn, 'hardening')} must be a positive hardening rate H, got ${H}`);
  return { densityKgM3: rho, dispersionMS: sigma, hardeningRate: H };
}

const environmentArgDocs = [
  { name: 'density', unit: 'Msun/pc^3', description: 'stellar mass density around the binary, > 0' },
  { name: 'dispersion', unit: 'km/s', description: 'stellar velocity dispersion, > 0' },
  { name: 'hardening', unit: 'dimensionless', description: 'hardening rate H > 0 (about 15 to 20 for hard binaries, Quinlan 1996)' },
];

function describeEnvironment(env: StellarEnvironment): string {
  const msunPc3 = env.densityKgM3 / (math.unit('1 Msun/pc^3').toSI() as unknown as { value: number }).value;
  return `rho ${msunPc3.toPrecision(3)} Msun/pc^3, sigma ${(env.dispersionMS / 1e3).toPrecision(3)} km/s, H ${env.hardeningRate}`;
}

function stellarModel(density: unknown, dispersion: unknown, hardening: unknown, e0v: unknown, fn: string): EmissionModel {
  const env = environmentArgs(density, dispersion, hardening, fn);
  if (e0v === undefined) {
    const kernel = guardedPhysics(fn, () => stellarEmissionKernel(circularGwKernel, env));
    const residence = guardedPhysics(fn, () => stellarResidenceFactor(env));
    return new EmissionModel(kernel, `stellar hardening then GW, circular (${describeEnvironment(env)})`, { ...env }, 1, residence);
  }
  const e0 = initialEccentricityArg(e0v, fn);
  const kernel = guardedPhysics(fn, () => stellarEccentricKernel(circularGwKernel, env, e0));
  const e0Text = typeof e0 === 'number' ? `e0 = ${e0}` : e0.label;
  return new EmissionModel(kernel, `stellar hardening then eccentric GW decay from the transition, ${e0Text} (${describeEnvironment(env)})`, { ...env, e0: e0Text });
}

function strainSpectrumFn(population: unknown, freqs: unknown, model: EmissionModel): SpectrumValue {
  const b = spectrumBuiltins.find((x) => x.name === 'strainSpectrum');
  if (!b) throw new BuiltinError('strainSpectrum is not available');
  return b.fn(population, freqs, model) as SpectrumValue;
}

function bendIndexArg(v: unknown, fn: string): number {
  const k = scalarSI(v, 'dimensionless', fn, 'kappa');
  if (!(k > 0)) throw new BuiltinError(`${where(fn, 'kappa')} must be a positive bend index, got ${k}`);
  return k;
}

export const environmentBuiltins: Builtin[] = [
  {
    name: 'stellarTransitionFrequency',
    category: 'environment',
    summary: 'Rest-frame GW frequency where hardening by stars (da/dt = -G rho H a^2/sigma) equals hardening by GW emission, for a circular binary.',
    args: [
      { name: 'totalMass', unit: 'Msun', description: 'total mass m1 + m2 > 0 (or a list)' },
      { name: 'q', unit: 'dimensionless', description: 'mass ratio m2/m1 in (0, 1]' },
      ...environmentArgDocs,
    ],
    returns: { unit: 'nHz', description: 'f_t = 2 f_orb(a_t), a_t^5 = (64/5) G^2 m1 m2 M sigma / (c^5 rho H)' },
    source: `${QUINLAN}; GW rate Peters 1964, Phys. Rev. 136, B1224`,
    example: 'stellarTransitionFrequency(1e9 Msun, 1, 100 Msun/pc^3, 200 km/s, 16)',
    fn: (totalMass: unknown, q: unknown, density: unknown, dispersion: unknown, hardening: unknown) => {
      const fn = 'stellarTransitionFrequency';
      const qq = scalarSI(q, 'dimensionless', fn, 'q');
      if (!(qq > 0 && qq <= 1)) throw new BuiltinError(`${where(fn, 'q')} must be a mass ratio in (0, 1], got ${qq}`);
      const env = environmentArgs(density, dispersion, hardening, fn);
      return elementwise(totalMass, 'mass', fn, 'totalMass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where(fn, arg)} must be a positive mass, got ${m} kg`);
        return quantity(stellarTransitionFrequency(m, qq, env), 'nHz');
      });
    },
  },
  {
    name: 'stellarEmission',
    category: 'environment',
    summary: 'Emission model of binaries hardened by stars, then by GW emission: dE/dln f_r = (dE/dln f_r)_GW / (1 + (f_t/f_r)^(10/3)); with e0, eccentric GW decay from the transition instead.',
    args: [
      ...environmentArgDocs,
      { name: 'e0', unit: 'dimensionless or eccentricityDistribution', description: 'eccentricity at the transition (default: circular, smooth turnover)', optional: true },
    ],
    returns: { unit: 'emission', description: 'for strainSpectrum; each binary has its own f_t from its masses' },
    source: `${QUINLAN}; with e0: Enoki & Nagashima 2007, Prog. Theor. Phys. 117, 241 (see docs/orbits.md for the decoupling assumption)`,
    example: 'strainSpectrum(pop, freqs, stellarEmission(100 Msun/pc^3, 200 km/s, 16))',
    fn: (density: unknown, dispersion: unknown, hardening: unknown, e0?: unknown) => stellarModel(density, dispersion, hardening, e0, 'stellarEmission'),
  },
  {
    name: 'stellarSpectrum',
    category: 'environment',
    summary: 'Characteristic strain of a population hardened by stars then by GW emission (strainSpectrum with stellarEmission).',
    args: [
      { name: 'population', unit: 'population', description: 'from mergerPopulation or customPopulation' },
      { name: 'freqs', unit: 'nHz', description: 'observed GW frequencies (a list)' },
      ...environmentArgDocs,
      { name: 'e0', unit: 'dimensionless or eccentricityDistribution', description: 'eccentricity at the transition (default circular)', optional: true },
    ],
    returns: { unit: 'spectrum', description: 'h_c on the grid, with the series strainSpectrum gives' },
    source: `${QUINLAN}; Phinney 2001, astro-ph/0108028`,
    example: 'stellarSpectrum(pop, freqs, 100 Msun/pc^3, 200 km/s, 16)',
    fn: (population: unknown, freqs: unknown, density: unknown, dispersion: unknown, hardening: unknown, e0?: unknown) => {
      checkSpectrumArgs(population, freqs, 'stellarSpectrum');
      return strainSpectrumFn(population, freqs, stellarModel(density, dispersion, hardening, e0, 'stellarSpectrum'));
    },
  },
  {
    name: 'bentStrain',
    category: 'environment',
    summary: 'Power law with a low-frequency bend: h_c = A (f/f_yr)^(-2/3) [1 + (f_bend/f)^kappa]^(-1/2); kappa 10/3 for stars, 7/3 for gas.',
    args: [
      { name: 'freqs', unit: 'nHz', description: 'frequencies > 0 (a list or one value)' },
      { name: 'amplitude', unit: 'dimensionless', description: 'A = h_c at f_yr without the bend, > 0' },
      { name: 'fBend', unit: 'nHz', description: 'bend frequency >= 0' },
      { name: 'kappa', unit: 'dimensionless', description: `bend index > 0 (${BEND_INDEX.stellar.toFixed(4)} stellar, ${BEND_INDEX.gas.toFixed(4)} gas)` },
    ],
    returns: { unit: 'dimensionless', description: 'h_c at each frequency' },
    source: BEND,
    example: 'bentStrain(freqs, 2e-15, 3 nHz, 10/3)',
    fn: (freqs: unknown, amplitude: unknown, fBend: unknown, kappa: unknown) => {
      const fn = 'bentStrain';
      const A = positiveSI(amplitude, 'dimensionless', fn, 'amplitude');
      const fb = scalarSI(fBend, 'frequency', fn, 'fBend');
      if (!(fb >= 0)) throw new BuiltinError(`${where(fn, 'fBend')} must not be negative, got ${fb} Hz`);
      const k = bendIndexArg(kappa, fn);
      return elementwise(freqs, 'frequency', fn, 'freqs', (f, arg) => {
        if (!(f > 0)) throw new BuiltinError(`${where(fn, arg)} must be a positive frequency, got ${f} Hz`);
        return bentPowerLawStrain(f, A, fb, k);
      });
    },
  },
  {
    name: 'bentSpectrum',
    category: 'environment',
    summary: 'The bent power law h_c = A (f/f_yr)^(-2/3) [1 + (f_bend/f)^kappa]^(-1/2) as a spectrum (for plots and comparisons), with the timing-residual series.',
    args: [
      { name: 'freqs', unit: 'nHz', description: 'frequencies > 0 (a list)' },
      { name: 'amplitude', unit: 'dimensionless', description: 'A = h_c at f_yr without the bend, > 0' },
      { name: 'fBend', unit: 'nHz', description: 'bend frequency >= 0' },
      { name: 'kappa', unit: 'dimensionless', description: 'bend index > 0 (10/3 stellar, 7/3 gas)' },
    ],
    returns: { unit: 'spectrum', description: 'h_c on the grid; series residualPsd (s^3) and equivalentResidual (s)' },
    source: `${BEND}; residual conversions common practice (see docs/physics.md)`,
    example: 'bentSpectrum(freqs, 2e-15, 3 nHz, 10/3)',
    fn: (freqs: unknown, amplitude: unknown, fBend: unknown, kappa: unknown) => {
      const fn = 'bentSpectrum';
      const A = positiveSI(amplitude, 'dimensionless', fn, 'amplitude');
      const fb = scalarSI(fBend, 'frequency', fn, 'fBend');
      if (!(fb >= 0)) throw new BuiltinError(`${where(fn, 'fBend')} must not be negative, got ${fb} Hz`);
      const k = bendIndexArg(kappa, fn);
      const f = vectorSI(freqs, 'frequency', fn, 'freqs');
      if (f.length === 0 || f.length > 10_000) throw new BuiltinError(`${where(fn, 'freqs')} must hold 1 to 10000 frequencies, got ${f.length}`);
      f.forEach((x, i) => {
        if (!(x > 0)) throw new BuiltinError(`${where(fn, `freqs[${i + 1}]`)} must be a positive frequency, got ${x} Hz`);
      });
      const hc = f.map((x) => bentPowerLawStrain(x, A, fb, k));
      return new SpectrumValue(
        { frequencyHz: f, hc },
        {
          residualPsd: { unit: 's^3', description: 'one-sided timing-residual PSD', values: hc.map((h, i) => residualPowerSpectralDensity(f[i], h)) },
          equivalentResidual: { unit: 's', description: 'h_c / (2 pi f)', values: hc.map((h, i) => equivalentResidual(f[i], h)) },
        },
        undefined,
      );
    },
  },
  {
    name: 'bendEmission',
    category: 'environment',
    summary: 'Emission model with a generic bend in the rest frame: dE/dln f_r = (dE/dln f_r)_GW / (1 + (f_bend/f_r)^kappa).',
    args: [
      { name: 'fBend', unit: 'nHz', description: 'rest-frame bend frequency >= 0' },
      { name: 'kappa', unit: 'dimensionless', description: 'bend index > 0 (10/3 stellar, 7/3 gas)' },
    ],
    returns: { unit: 'emission', description: 'for strainSpectrum; a population at redshift z bends at f_bend / (1+z) observed' },
    source: BEND,
    example: 'strainSpectrum(pop, freqs, bendEmission(5 nHz, 10/3))',
    fn: (fBend: unknown, kappa: unknown) => {
      const fn = 'bendEmission';
      const fb = scalarSI(fBend, 'frequency', fn, 'fBend');
      if (!(fb >= 0)) throw new BuiltinError(`${where(fn, 'fBend')} must not be negative, got ${fb} Hz`);
      const k = bendIndexArg(kappa, fn);
      return new EmissionModel(guardedPhysics(fn, () => bendEmissionKernel(circularGwKernel, fb, k)), `GW-driven with a bend at ${(fb * 1e9).toPrecision(3)} nHz (rest frame), kappa ${k.toPrecision(4)}`, { fBendHz: fb, kappa: k });
    },
  },
];

