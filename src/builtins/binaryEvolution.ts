// Built-ins for what happens between a galaxy merger and the binary's coalescence: a fixed total
// lifetime (src/physics/delayedPopulation.ts) or one set by hardening in a mass-scaled stellar
// environment (src/physics/hardeningLifetime.ts, massDependentDelay.ts), and the share that stalls.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { delayedPopulation, stalledFraction } from '../physics/delayedPopulation';
import { GYR_S, M_SUN_KG } from '../physics/constants';
import { frictionPhaseTime, hardBinaryLifetime, lifetimeFunction } from '../physics/hardeningLifetime';
import { environmentOfMass, massScaledEnvironment } from '../physics/hostEnvironment';
import { delayedPopulationByMass, stalledFractionByMass, type LifetimeOf } from '../physics/massDependentDelay';
import { isSheetObject } from '../sheet/sheetObject';
import { checkTimeNowIfHandingOff, handOffOnTimeout } from '../sheet/evaluationBudget';
import { quantity } from '../sheet/mathInstance';
import { scalarSI, where } from './args';
import { environmentArg, type EnvironmentValue } from './hostEnvironment';
import { elementwise, guardedPhysics, nonNegativeSI, populationArg } from './physicsArgs';
import { PopulationValue } from './populationValue';
import { phenomDelayedPopulationValue, type PhenomHardeningValue } from './phenomHardening';
import { phenomStalledFraction } from '../physics/phenomHardeningSpectrum';

const SOURCE = 'Agazie et al. 2023, ApJL 952, L37 (a total lifetime from formation to coalescence); times from Hogg 1999, astro-ph/9905116; with phenomHardening, see that built-in';
const HARDENING_SOURCE = 'hardening from a_h = G m2/(4 sigma^2) by stars (Quinlan 1996, New Astron. 1, 35) and GW emission (Peters 1964, Phys. Rev. 136, B1224) in a mass-scaled environment (McConnell & Ma 2013, ApJ 764, 184; Sesana & Khan 2015, MNRAS 454, L66); with frictionPhase, a dynamical-friction phase before it (Binney & Tremaine 2008, Galactic Dynamics, 2nd ed., section 8.1; Kelley, Blecha & Hernquist 2017, MNRAS 464, 3131)';

/**
 * The population (which must know its cosmology) and the lifetime: a time in s, a mass-scaled
 * environment, or a phenomenological hardening model.
 */
function populationAndLifetime(population: unknown, lifetime: unknown, fn: string) {
  const p = populationArg(population, fn);
  if (!p.cosmology) throw new BuiltinError(`${where(fn, 'population')} has no cosmology, so a lifetime cannot be turned into redshifts (give customPopulation a cosmology argument)`);
  const none = { env: undefined as EnvironmentValue | undefined, phenom: undefined as PhenomHardeningValue | undefined };
  if (isSheetObject(lifetime) && lifetime.kind === 'phenomHardening') return { p, cosmology: p.cosmology, tau: 0, ...none, phenom: lifetime as PhenomHardeningValue };
  if (isSheetObject(lifetime)) {
    if (lifetime.kind !== 'environment') throw new BuiltinError(`${where(fn, 'lifetime')} must be a time, an environment or a phenomHardening, got ${lifetime.kind}`, 'domain');
    const env = environmentArg(lifetime, fn, 'lifetime');
    return { p, cosmology: p.cosmology, tau: 0, ...none, env };
  }
  const tau = nonNegativeSI(lifetime, 'time', fn, 'lifetime');
  if (!Number.isFinite(tau)) throw new BuiltinError(`${where(fn, 'lifetime')} must be finite`);
  return { p, cosmology: p.cosmology, tau, ...none };
}

/** The environment's numbers for a population's parameters (without its kind). */
function environmentParameters(env: EnvironmentValue): Record<string, number> {
  const { kind: _kind, ...rest } = env.toJSON() as Record<string, number | string>;
  return rest as Record<string, number>;
}

const lifetimeArgDoc = { name: 'lifetime', unit: 'Gyr, environment or phenomHardening', description: 'time from formation to coalescence, >= 0, the same for every binary; or a hostEnvironment, whose hardening from the hard-binary separation sets each binary\'s lifetime by its mass and mass ratio; or a phenomHardening model (its lifetime, or the GW time where that is shorter)' };

/**
 * The lifetime of each (log10 M, q) in an environment (an ODE solved per call, tens of us). Where a
 * slow cell is handed off (the app's page) each call checks the cell's clock, so the set-up of a
 * delayed population (hundreds of calls) stops on the page; elsewhere it is the function itself.
 */
function environmentLifetime(env: EnvironmentValue): LifetimeOf {
  const lifetimeOf = lifetimeFunction(massScaledEnvironment(env.scaled), M_SUN_KG, env.scaled.friction);
  if (!handOffOnTimeout()) return lifetimeOf;
  return (log10M, q) => (checkTimeNowIfHandingOff(), lifetimeOf(log10M, q));
}

export const binaryEvolutionBuiltins: Builtin[] = [
  {
    name: 'delayedPopulation',
    category: 'population',
    summary:
      'The population by coalescence redshift when every binary coalesces a fixed lifetime after its galaxies merge: dn/dz_c = dn/dz_f |dt/dz|(z_c) / |dt/dz|(z_f). Binaries that would coalesce after today stall and drop out; a lifetime of 0 gives the population unchanged.',
    args: [
      { name: 'population', unit: 'population', description: 'galaxy-merger population that knows its cosmology (its redshift is the formation redshift)' },
      lifetimeArgDoc,
    ],
    returns: { unit: 'population', description: 'the same binaries, per unit coalescence redshift' },
    source: `${SOURCE}; with an environment, ${HARDENING_SOURCE}`,
    example: 'delayedPopulation(pop, 3 Gyr)',
    fn: (population: unknown, lifetime: unknown) => {
      const fn = 'delayedPopulation';
      const { p, cosmology, tau, env, phenom } = populationAndLifetime(population, lifetime, fn);
      if (phenom) return phenomDelayedPopulationValue(population, phenom, fn);
      if (env) {
        const lifetimeOf = environmentLifetime(env);
        const friction = env.scaled.friction ? 'dynamical friction, then ' : '';
        return new PopulationValue(
          guardedPhysics(fn, () => delayedPopulationByMass(p.population, cosmology, lifetimeOf)),
          `${p.label}, coalescing after ${friction}hardening by stars (H ${env.scaled.hardeningRate}) and GW emission`,
          { ...p.parameters, ...environmentParameters(env) },
          cosmology,
        );
      }
      return new PopulationValue(
        delayedPopulation(p.population, cosmology, tau),
        `${p.label}, coalescing ${(tau / GYR_S).toPrecision(3)} Gyr after formation`,
        { ...p.parameters, lifetimeGyr: tau / GYR_S },
        cosmology,
      );
    },
  },
  {
    name: 'stalledFraction',
    category: 'population',
    summary: 'Share of a population\'s binaries (by number) that their lifetime (fixed, or set by hardening in a mass-scaled environment) carries past today: they never coalesce and add nothing to the background.',
    args: [
      { name: 'population', unit: 'population', description: 'galaxy-merger population that knows its cosmology' },
      lifetimeArgDoc,
    ],
    returns: { unit: 'dimensionless', description: 'fraction in [0, 1]' },
    source: `${SOURCE}; with an environment, ${HARDENING_SOURCE}`,
    example: 'stalledFraction(pop, 3 Gyr)',
    fn: (population: unknown, lifetime: unknown) => {
      const fn = 'stalledFraction';
      const { p, cosmology, tau, env, phenom } = populationAndLifetime(population, lifetime, fn);
      if (phenom) return guardedPhysics(fn, () => phenomStalledFraction(p.population, cosmology, phenom.model, M_SUN_KG));
      if (env) {
        const lifetimeOf = environmentLifetime(env);
        return guardedPhysics(fn, () => stalledFractionByMass(p.population, cosmology, lifetimeOf));
      }
      return stalledFraction(p.population, cosmology, tau);
    },
  },
  {
    name: 'hardeningLifetime',
    category: 'population',
    summary: 'Time a circular binary takes from the hard-binary separation a_h = G m2/(4 sigma^2) to coalescence, hardened by stars (da/dt = -G rho H a^2/sigma) and by GW emission, in a mass-scaled environment; with a friction phase (frictionPhase), plus the dynamical-friction time to a_h.',
    args: [
      { name: 'environment', unit: 'environment', description: 'from hostEnvironment' },
      { name: 'totalMass', unit: 'Msun', description: 'total mass > 0 (or a list)' },
      { name: 'q', unit: 'dimensionless', description: 'mass ratio in (0, 1]' },
    ],
    returns: { unit: 'Gyr', description: 'T = I(a_h/a_t)/(A a_t), I(X) = Int_0^X x^3/(1+x^5) dx, A = G rho H/sigma, a_t where the two rates are equal' },
    source: HARDENING_SOURCE,
    example: 'hardeningLifetime(hostEnvironment(16), 1e9 Msun, 0.5)',
    fn: (environment: unknown, totalMass: unknown, q: unknown) => {
      const fn = 'hardeningLifetime';
      const env = environmentArg(environment, fn);
      const qq = scalarSI(q, 'dimensionless', fn, 'q');
      if (!(qq > 0 && qq <= 1)) throw new BuiltinError(`${where(fn, 'q')} must be a mass ratio in (0, 1], got ${qq}`);
      return elementwise(totalMass, 'mass', fn, 'totalMass', (m, arg) => {
        if (!(m > 0) || !Number.isFinite(m)) throw new BuiltinError(`${where(fn, arg)} must be a positive mass, got ${m} kg`);
        return quantity(
          guardedPhysics(fn, () => {
            const local = environmentOfMass(m, env.scaled);
            const friction = env.scaled.friction;
            return hardBinaryLifetime(m, qq, local) + (friction ? frictionPhaseTime(m, qq, local, friction) : 0);
          }),
          'Gyr',
        );
      });
    },
  },
];
