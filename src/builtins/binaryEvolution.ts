// Built-ins for what happens between a galaxy merger and the binary's coalescence: a fixed total
// lifetime (src/physics/delayedPopulation.ts) and the share of binaries that stall past today.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { delayedPopulation, stalledFraction } from '../physics/delayedPopulation';
import { GYR_S } from '../physics/constants';
import { where } from './args';
import { nonNegativeSI, populationArg } from './physicsArgs';
import { PopulationValue } from './populationValue';

const SOURCE = 'Agazie et al. 2023, ApJL 952, L37 (a total lifetime from formation to coalescence); times from Hogg 1999, astro-ph/9905116';

/** The population (which must know its cosmology) and the lifetime in s, checked. */
function populationAndLifetime(population: unknown, lifetime: unknown, fn: string) {
  const p = populationArg(population, fn);
  if (!p.cosmology) throw new BuiltinError(`${where(fn, 'population')} has no cosmology, so a lifetime cannot be turned into redshifts (give customPopulation a cosmology argument)`);
  const tau = nonNegativeSI(lifetime, 'time', fn, 'lifetime');
  if (!Number.isFinite(tau)) throw new BuiltinError(`${where(fn, 'lifetime')} must be finite`);
  return { p, cosmology: p.cosmology, tau };
}

export const binaryEvolutionBuiltins: Builtin[] = [
  {
    name: 'delayedPopulation',
    category: 'population',
    summary:
      'The population by coalescence redshift when every binary coalesces a fixed lifetime after its galaxies merge: dn/dz_c = dn/dz_f |dt/dz|(z_c) / |dt/dz|(z_f). Binaries that would coalesce after today stall and drop out; a lifetime of 0 gives the population unchanged.',
    args: [
      { name: 'population', unit: 'population', description: 'galaxy-merger population that knows its cosmology (its redshift is the formation redshift)' },
      { name: 'lifetime', unit: 'Gyr', description: 'time from formation to coalescence, >= 0' },
    ],
    returns: { unit: 'population', description: 'the same binaries, per unit coalescence redshift' },
    source: SOURCE,
    example: 'delayedPopulation(pop, 3 Gyr)',
    fn: (population: unknown, lifetime: unknown) => {
      const { p, cosmology, tau } = populationAndLifetime(population, lifetime, 'delayedPopulation');
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
    summary: 'Share of a population\'s binaries (by number) that a fixed lifetime carries past today: they never coalesce and add nothing to the background.',
    args: [
      { name: 'population', unit: 'population', description: 'galaxy-merger population that knows its cosmology' },
      { name: 'lifetime', unit: 'Gyr', description: 'time from formation to coalescence, >= 0' },
    ],
    returns: { unit: 'dimensionless', description: 'fraction in [0, 1]' },
    source: SOURCE,
    example: 'stalledFraction(pop, 3 Gyr)',
    fn: (population: unknown, lifetime: unknown) => {
      const { p, cosmology, tau } = populationAndLifetime(population, lifetime, 'stalledFraction');
      return stalledFraction(p.population, cosmology, tau);
    },
  },
];
