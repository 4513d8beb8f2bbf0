// Built-ins for stellar environments scaled by the host: sigma from the M-sigma relation of McConnell &
// Ma 2013, the density at the influence radius of a singular isothermal sphere, and the stellar
// hardening (Quinlan 1996) that follows, so each binary turns over at its own transition frequency.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import type { SheetObject } from '../sheet/sheetObject';
import { quantity } from '../sheet/mathInstance';
import { circularGwKernel } from '../physics/circularKernel';
import {
  copyMassScaledEnvironment,
  dispersionOfMass,
  environmentOfMass,
  massScaledEnvironment,
  MCCONNELL_MA_2013_M_SIGMA,
  type MassScaledEnvironment,
  type MSigmaRelation,
} from '../physics/hostEnvironment';
import { frictionPhaseTime } from '../physics/hardeningLifetime';
import { PC_M } from '../physics/constants';
import { threeSignificant as g } from './threeSignificant';
import { stellarEccentricKernel, stellarEmissionKernel, stellarResidenceFactor, transitionFrequencyFunction } from '../physics/stellarHardening';
import { objectOf, scalarSI, where } from './args';
import { elementwise, guardedPhysics } from './physicsArgs';
import { checkSpectrumArgs, EmissionModel, initialEccentricityArg } from './orbits';
import { spectrumBuiltins } from './spectrum';
import type { SpectrumValue } from './spectrumValue';

const M_SIGMA_SOURCE = 'McConnell & Ma 2013, ApJ 764, 184 (M-sigma, full sample: log10 M = 8.32 + 5.64 log10(sigma/200 km/s))';
const PROFILE_SOURCE = 'singular isothermal sphere rho = sigma^2/(2 pi G r^2) (Binney & Tremaine 2008, Galactic Dynamics), influence radius enclosing 2M in stars; density at the influence radius sets the hardening (Sesana & Khan 2015, MNRAS 454, L66)';
const QUINLAN = 'Quinlan 1996, New Astron. 1, 35';
const DEHNEN_SOURCE = 'Dehnen 1993, MNRAS 265, 250 (profile); stellar mass from the M_BH-M_bulge relation of McConnell & Ma 2013, ApJ 764, 184 (log10 M = 8.46 + 1.05 log10(M_bulge/1e11 Msun)); r_inf = G M/sigma^2 enclosing 2M (our choice, docs/orbits.md)';
const FRICTION_SOURCE = 'Chandrasekhar drag on a circular orbit in a singular isothermal sphere, t = (r_i^2 - r_f^2) v_c/(2 chi lnL G m2), chi = erf(1) - 2e^-1/sqrt(pi), i.e. 1.17 r_i^2 v_c/(lnL G M) of Binney & Tremaine 2008, Galactic Dynamics, 2nd ed., section 8.1 (equation number unverified); the friction phase in binary lifetimes as in Kelley, Blecha & Hernquist 2017, MNRAS 464, 3131';

/** A stellar environment that follows each binary's total mass. */
export class EnvironmentValue implements SheetObject {
  readonly kind = 'environment' as const;
  constructor(readonly scaled: MassScaledEnvironment) {}
  describe(): string {
    const { norm, slope } = this.scaled.mSigma;
    const p = this.scaled.profile;
    const profile = p?.kind === 'dehnen' ? `Dehnen density (gamma ${p.gamma})` : 'isothermal density';
    const f = this.scaled.friction;
    const friction = f ? `, dynamical friction from ${g(f.startRadiusM / (1e3 * PC_M))} kpc (ln Lambda ${g(f.coulombLog)})` : '';
    return `host-scaled stars: M-sigma ${norm} + ${slope} log10(sigma/200 km/s), ${profile} at the influence radius, H ${this.scaled.hardeningRate}${friction}`;
  }
  toJSON(): unknown {
    const s = this.scaled;
    return {
      kind: this.kind,
      mSigmaNorm: s.mSigma.norm,
      mSigmaSlope: s.mSigma.slope,
      hardeningRate: s.hardeningRate,
      ...(s.profile?.kind === 'dehnen' ? { dehnenGamma: s.profile.gamma } : {}),
      ...(s.friction ? { frictionStartKpc: s.friction.startRadiusM / (1e3 * PC_M), coulombLog: s.friction.coulombLog } : {}),
    };
  }
}

/** The optional M-sigma normalisation and slope (defaults McConnell & Ma 2013, full sample), checked. */
function mSigmaArgs(norm: unknown, slope: unknown, fn: string): MSigmaRelation {
  const a = norm === undefined ? MCCONNELL_MA_2013_M_SIGMA.norm : scalarSI(norm, 'dimensionless', fn, 'mSigmaNorm');
  if (!Number.isFinite(a)) throw new BuiltinError(`${where(fn, 'mSigmaNorm')} must be a finite number, got ${a}`);
  const b = slope === undefined ? MCCONNELL_MA_2013_M_SIGMA.slope : scalarSI(slope, 'dimensionless', fn, 'mSigmaSlope');
  if (!(b > 0) || !Number.isFinite(b)) throw new BuiltinError(`${where(fn, 'mSigmaSlope')} must be a positive slope, got ${b}`);
  return { norm: a, slope: b };
}

function massArg(totalMass: unknown, fn: string, f: (mKg: number) => unknown): unknown {
  return elementwise(totalMass, 'mass', fn, 'totalMass', (m, arg) => {
    if (!(m > 0) || !Number.isFinite(m)) throw new BuiltinError(`${where(fn, arg)} must be a positive mass, got ${m} kg`);
    return f(m);
  });
}

export function environmentArg(v: unknown, fn: string, arg = 'environment'): EnvironmentValue {
  return objectOf<EnvironmentValue>(v, 'environment', fn, arg);
}

const mSigmaArgDocs = [
  { name: 'mSigmaNorm', unit: 'dimensionless', description: 'normalisation a of log10(M/Msun) = a + b log10(sigma/200 km/s) (default 8.32)', optional: true },
  { name: 'mSigmaSlope', unit: 'dimensionless', description: 'slope b > 0 (default 5.64)', optional: true },
];

function ratioArg(q: unknown, fn: string): number {
  const qq = scalarSI(q, 'dimensionless', fn, 'q');
  if (!(qq > 0 && qq <= 1)) throw new BuiltinError(`${where(fn, 'q')} must be a mass ratio in (0, 1], got ${qq}`);
  return qq;
}

function scaledModel(environment: unknown, e0v: unknown, fn: string): EmissionModel {
  const env = environmentArg(environment, fn);
  const scaled = massScaledEnvironment(env.scaled);
  const params = env.toJSON() as Record<string, number | string>;
  if (e0v === undefined) {
    const kernel = guardedPhysics(fn, () => stellarEmissionKernel(circularGwKernel, scaled));
    const residence = guardedPhysics(fn, () => stellarResidenceFactor(scaled));
    return new EmissionModel(kernel, `stellar hardening then GW, circular, environment scaled by mass (H ${env.scaled.hardeningRate})`, params, 1, residence);
  }
  const e0 = initialEccentricityArg(e0v, fn);
  const kernel = guardedPhysics(fn, () => stellarEccentricKernel(circularGwKernel, scaled, e0));
  const e0Text = typeof e0 === 'number' ? `e0 = ${e0}` : e0.label;
  return new EmissionModel(kernel, `stellar hardening then eccentric GW decay from each binary's own transition, ${e0Text}, environment scaled by mass (H ${env.scaled.hardeningRate})`, { ...params, e0: e0Text });
}

export const hostEnvironmentBuiltins: Builtin[] = [
  {
    name: 'hostDispersion',
    category: 'environment',
    summary: 'Stellar velocity dispersion of the host of a black hole (or binary) of the given mass, from the M-sigma relation.',
    args: [{ name: 'totalMass', unit: 'Msun', description: 'mass > 0 (or a list)' }, ...mSigmaArgDocs],
    returns: { unit: 'km/s', description: 'sigma = 200 km/s x 10^((log10(M/Msun) - a)/b)' },
    source: M_SIGMA_SOURCE,
    example: 'hostDispersion(1e9 Msun)',
    fn: (totalMass: unknown, norm?: unknown, slope?: unknown) => {
      const fn = 'hostDispersion';
      const rel = mSigmaArgs(norm, slope, fn);
      return massArg(totalMass, fn, (m) => quantity(dispersionOfMass(m, rel), 'km/s'));
    },
  },
  {
    name: 'hostDensity',
    category: 'environment',
    summary: 'Stellar density at the influence radius of a binary of the given total mass: singular isothermal sphere with sigma from M-sigma, r_inf = G M / sigma^2 (enclosing 2M in stars), rho = sigma^6 / (2 pi G^3 M^2).',
    args: [{ name: 'totalMass', unit: 'Msun', description: 'total mass > 0 (or a list)' }, ...mSigmaArgDocs],
    returns: { unit: 'Msun/pc^3', description: 'rho at the influence radius' },
    source: `${PROFILE_SOURCE}; ${M_SIGMA_SOURCE}`,
    example: 'hostDensity(1e9 Msun)',
    fn: (totalMass: unknown, norm?: unknown, slope?: unknown) => {
      const fn = 'hostDensity';
      const rel = mSigmaArgs(norm, slope, fn);
      return massArg(totalMass, fn, (m) => quantity(environmentOfMass(m, { mSigma: rel, hardeningRate: 1 }).densityKgM3, 'Msun/pc^3'));
    },
  },
  {
    name: 'hostEnvironment',
    category: 'environment',
    summary: 'Stellar environment that follows each binary\'s total mass: sigma from M-sigma, density at the influence radius of an isothermal sphere, hardening rate H. For environmentEmission, environmentSpectrum, environmentTransition and (as a lifetime) delayedPopulation.',
    args: [{ name: 'hardening', unit: 'dimensionless', description: 'hardening rate H > 0 (about 15 to 20 for hard binaries, Quinlan 1996)' }, ...mSigmaArgDocs],
    returns: { unit: 'environment', description: 'the mass-scaled environment' },
    source: `${M_SIGMA_SOURCE}; ${PROFILE_SOURCE}; ${QUINLAN}`,
    example: 'hostEnvironment(16)',
    fn: (hardening: unknown, norm?: unknown, slope?: unknown) => {
      const fn = 'hostEnvironment';
      const H = scalarSI(hardening, 'dimensionless', fn, 'hardening');
      if (!(H > 0) || !Number.isFinite(H)) throw new BuiltinError(`${where(fn, 'hardening')} must be a positive hardening rate H, got ${H}`);
      return new EnvironmentValue({ mSigma: mSigmaArgs(norm, slope, fn), hardeningRate: H });
    },
  },
  {
    name: 'dehnenHost',
    category: 'environment',
    summary: 'The environment with the stars of each host in a Dehnen profile of inner slope gamma instead of the isothermal sphere: stellar mass M_s from the M_BH-M_bulge relation, influence radius r_inf = G M/sigma^2 holding 2M in stars, rho(r_inf) = (3 - gamma) M (1 - x)/(2 pi r_inf^3), x = (2M/M_s)^(1/(3 - gamma)).',
    args: [
      { name: 'environment', unit: 'environment', description: 'from hostEnvironment (its friction phase, if any, is kept)' },
      { name: 'gamma', unit: 'dimensionless', description: 'inner slope in [0, 3): 1 a Hernquist-like cusp, 2 close to the isothermal sphere' },
    ],
    returns: { unit: 'environment', description: 'the environment with the Dehnen density at the influence radius' },
    source: DEHNEN_SOURCE,
    example: 'dehnenHost(hostEnvironment(16), 1)',
    fn: (environment: unknown, gamma: unknown) => {
      const fn = 'dehnenHost';
      const env = environmentArg(environment, fn);
      const g = scalarSI(gamma, 'dimensionless', fn, 'gamma');
      if (!(g >= 0 && g < 3)) throw new BuiltinError(`${where(fn, 'gamma')} must be an inner slope in [0, 3), got ${g}`);
      return new EnvironmentValue({ ...copyMassScaledEnvironment(env.scaled), profile: { kind: 'dehnen', gamma: g } });
    },
  },
  {
    name: 'environmentDensity',
    category: 'environment',
    summary: 'Stellar density at the influence radius of a binary of the given total mass in an environment: the isothermal sphere of hostEnvironment, or the Dehnen profile of dehnenHost.',
    args: [
      { name: 'environment', unit: 'environment', description: 'from hostEnvironment or dehnenHost' },
      { name: 'totalMass', unit: 'Msun', description: 'total mass > 0 (or a list)' },
    ],
    returns: { unit: 'Msun/pc^3', description: 'rho at the influence radius' },
    source: `${PROFILE_SOURCE}; with dehnenHost, ${DEHNEN_SOURCE}`,
    example: 'environmentDensity(dehnenHost(hostEnvironment(16), 1), 1e9 Msun)',
    fn: (environment: unknown, totalMass: unknown) => {
      const fn = 'environmentDensity';
      const env = environmentArg(environment, fn);
      return massArg(totalMass, fn, (m) => quantity(guardedPhysics(fn, () => environmentOfMass(m, env.scaled).densityKgM3), 'Msun/pc^3'));
    },
  },
  {
    name: 'frictionPhase',
    category: 'environment',
    summary: 'The environment with a dynamical-friction phase before the binary becomes hard: the lighter black hole sinks from startRadius to a_h = G m2/(4 sigma^2) on a circular orbit in a singular isothermal sphere of the host\'s sigma, and that time is added to each binary\'s lifetime (hardeningLifetime, delayedPopulation, stalledFraction). Spectra are unchanged: the phase ends far below the band.',
    args: [
      { name: 'environment', unit: 'environment', description: 'from hostEnvironment or dehnenHost' },
      { name: 'startRadius', unit: 'kpc', description: 'separation where friction starts, >= 0 (0 or anything inside a_h: no friction time)' },
      { name: 'coulombLog', unit: 'dimensionless', description: 'Coulomb logarithm ln Lambda > 0 of Chandrasekhar\'s formula (of order a few to ten)' },
    ],
    returns: { unit: 'environment', description: 'the environment with the friction phase' },
    source: FRICTION_SOURCE,
    example: 'frictionPhase(hostEnvironment(16), 1 kpc, 5)',
    fn: (environment: unknown, startRadius: unknown, coulombLog: unknown) => {
      const fn = 'frictionPhase';
      const env = environmentArg(environment, fn);
      const r = scalarSI(startRadius, 'length', fn, 'startRadius');
      if (!(r >= 0) || !Number.isFinite(r)) throw new BuiltinError(`${where(fn, 'startRadius')} must be a finite length >= 0, got ${r} m`);
      const lnL = scalarSI(coulombLog, 'dimensionless', fn, 'coulombLog');
      if (!(lnL > 0) || !Number.isFinite(lnL)) throw new BuiltinError(`${where(fn, 'coulombLog')} must be a positive Coulomb logarithm, got ${lnL}`);
      return new EnvironmentValue({ ...copyMassScaledEnvironment(env.scaled), friction: { startRadiusM: r, coulombLog: lnL } });
    },
  },
  {
    name: 'frictionTime',
    category: 'environment',
    summary: 'Time the lighter black hole of a binary takes to sink by dynamical friction from the environment\'s start radius to the hard-binary separation (the friction phase of frictionPhase).',
    args: [
      { name: 'environment', unit: 'environment', description: 'from frictionPhase' },
      { name: 'totalMass', unit: 'Msun', description: 'total mass > 0 (or a list)' },
      { name: 'q', unit: 'dimensionless', description: 'mass ratio in (0, 1]' },
    ],
    returns: { unit: 'Gyr', description: 't = (r_i^2 - a_h^2) v_c/(2 chi lnL G m2), v_c = sqrt(2) sigma, chi = 0.428' },
    source: FRICTION_SOURCE,
    example: 'frictionTime(frictionPhase(hostEnvironment(16), 1 kpc, 5), 1e9 Msun, 0.5)',
    fn: (environment: unknown, totalMass: unknown, q: unknown) => {
      const fn = 'frictionTime';
      const env = environmentArg(environment, fn);
      const friction = env.scaled.friction;
      if (!friction) throw new BuiltinError(`${where(fn, 'environment')} has no friction phase: give frictionPhase(environment, startRadius, coulombLog)`);
      const qq = ratioArg(q, fn);
      return massArg(totalMass, fn, (m) => quantity(guardedPhysics(fn, () => frictionPhaseTime(m, qq, environmentOfMass(m, env.scaled), friction)), 'Gyr'));
    },
  },
  {
    name: 'environmentTransition',
    category: 'environment',
    summary: 'Rest-frame GW frequency where stellar and GW hardening are equal, for a circular binary in a mass-scaled environment: for the isothermal host f_t = (c sigma)^(3/2)/(pi G M) (5H/(128 pi eta))^(3/10), proportional to M^(3/(2b) - 1).',
    args: [
      { name: 'environment', unit: 'environment', description: 'from hostEnvironment' },
      { name: 'totalMass', unit: 'Msun', description: 'total mass > 0 (or a list)' },
      { name: 'q', unit: 'dimensionless', description: 'mass ratio in (0, 1]' },
    ],
    returns: { unit: 'nHz', description: 'f_t of each mass' },
    source: `${QUINLAN}; GW rate Peters 1964, Phys. Rev. 136, B1224; ${M_SIGMA_SOURCE}`,
    example: 'environmentTransition(hostEnvironment(16), 1e9 Msun, 0.5)',
    fn: (environment: unknown, totalMass: unknown, q: unknown) => {
      const fn = 'environmentTransition';
      const env = environmentArg(environment, fn);
      const qq = scalarSI(q, 'dimensionless', fn, 'q');
      if (!(qq > 0 && qq <= 1)) throw new BuiltinError(`${where(fn, 'q')} must be a mass ratio in (0, 1], got ${qq}`);
      const ft = transitionFrequencyFunction(massScaledEnvironment(env.scaled));
      return massArg(totalMass, fn, (m) => quantity(ft(m, qq), 'nHz'));
    },
  },
  {
    name: 'environmentEmission',
    category: 'environment',
    summary: 'Emission model of binaries hardened by stars of a mass-scaled environment, then by GW emission: each binary turns over at its own f_t; with e0, eccentric GW decay starts at each binary\'s own decoupling frequency (f0 = f_t(e0)/2).',
    args: [
      { name: 'environment', unit: 'environment', description: 'from hostEnvironment' },
      { name: 'e0', unit: 'dimensionless or eccentricityDistribution', description: 'eccentricity at decoupling (default circular, smooth turnover)', optional: true },
    ],
    returns: { unit: 'emission', description: 'for strainSpectrum' },
    source: `${QUINLAN}; ${M_SIGMA_SOURCE}; with e0: Enoki & Nagashima 2007, Prog. Theor. Phys. 117, 241 (see docs/orbits.md)`,
    example: 'strainSpectrum(pop, freqs, environmentEmission(hostEnvironment(16)))',
    fn: (environment: unknown, e0?: unknown) => scaledModel(environment, e0, 'environmentEmission'),
  },
  {
    name: 'environmentSpectrum',
    category: 'environment',
    summary: 'Characteristic strain of a population in a mass-scaled stellar environment (strainSpectrum with environmentEmission).',
    args: [
      { name: 'population', unit: 'population', description: 'from mergerPopulation or customPopulation' },
      { name: 'freqs', unit: 'nHz', description: 'observed GW frequencies (a list)' },
      { name: 'environment', unit: 'environment', description: 'from hostEnvironment' },
      { name: 'e0', unit: 'dimensionless or eccentricityDistribution', description: 'eccentricity at decoupling (default circular)', optional: true },
    ],
    returns: { unit: 'spectrum', description: 'h_c on the grid, with the series strainSpectrum gives' },
    source: `${QUINLAN}; ${M_SIGMA_SOURCE}; Phinney 2001, astro-ph/0108028`,
    example: 'environmentSpectrum(pop, freqs, hostEnvironment(16))',
    fn: (population: unknown, freqs: unknown, environment: unknown, e0?: unknown) => {
      const fn = 'environmentSpectrum';
      checkSpectrumArgs(population, freqs, fn);
      const model = scaledModel(environment, e0, fn);
      const b = spectrumBuiltins.find((x) => x.name === 'strainSpectrum');
      if (!b) throw new BuiltinError('strainSpectrum is not available');
      return b.fn(population, freqs, model) as SpectrumValue;
    },
  },
];
