// Built-ins for the phenomenological hardening model with a total lifetime (src/physics/phenomHardening.ts,
// phenomHardeningSpectrum.ts): the model object, its emission (the low-frequency bend), the complete
// spectrum (delay and bend), and the residence-time factor. delayedPopulation and stalledFraction take the
// model as their lifetime (binaryEvolution.ts).
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import type { SheetObject } from '../sheet/sheetObject';
import { GYR_S, M_SUN_KG, PC_M } from '../physics/constants';
import { checkPhenomHardening, PHENOM_HARDENING_DEFAULTS, type PhenomHardening } from '../physics/phenomHardening';
import { normalisationOf, phenomDelayedPopulation, phenomEmissionKernel, phenomResidenceFactor, residenceRatio } from '../physics/phenomHardeningSpectrum';
import { objectOf, scalarSI, where } from './args';
import { elementwise, guardedPhysics, nonNegativeSI, populationArg } from './physicsArgs';
import { checkSpectrumArgs, EmissionModel } from './orbits';
import { PopulationValue } from './populationValue';
import { spectrumBuiltins } from './spectrum';
import type { SpectrumValue } from './spectrumValue';
import { threeSignificant as g } from './threeSignificant';

export const PHENOM_SOURCE =
  'Agazie et al. 2023, ApJL 952, L37 (hardening rate A x^(1-nu_in) (1+x)^(nu_in-nu_out), x = a/a_c, plus GW, normalised to a total lifetime; unverified: the form, defaults and equation number, none of which is in the abstract of arXiv:2306.16220, the only part of the paper reachable); GW rate Peters 1964, Phys. Rev. 136, B1224, eq. 5.6; residence time in h_c^2 Phinney 2001, astro-ph/0108028';

/** The phenomenological hardening model as a sheet value. */
export class PhenomHardeningValue implements SheetObject {
  readonly kind = 'phenomHardening' as const;
  constructor(readonly model: PhenomHardening) {}
  describe(): string {
    const h = this.model;
    return `phenomenological hardening: lifetime ${g(h.lifetimeS / GYR_S)} Gyr from ${g(h.initialSeparationM / PC_M)} pc, hardening-time index ${g(h.innerIndex)} inside ${g(h.breakSeparationM / PC_M)} pc and ${g(h.outerIndex)} outside, plus GW`;
  }
  toJSON(): unknown {
    const h = this.model;
    return { kind: this.kind, lifetimeGyr: h.lifetimeS / GYR_S, innerIndex: h.innerIndex, outerIndex: h.outerIndex, breakSeparationPc: h.breakSeparationM / PC_M, initialSeparationPc: h.initialSeparationM / PC_M };
  }
}

export function phenomHardeningArg(v: unknown, fn: string, arg = 'hardening'): PhenomHardeningValue {
  return objectOf<PhenomHardeningValue>(v, 'phenomHardening', fn, arg);
}

/** The model's numbers for a population's parameters. */
export function phenomParameters(h: PhenomHardeningValue): Record<string, number> {
  const { kind: _kind, ...rest } = h.toJSON() as Record<string, number | string>;
  return rest as Record<string, number>;
}

function indexArg(v: unknown, fallback: number, fn: string, arg: string): number {
  if (v === undefined) return fallback;
  const x = scalarSI(v, 'dimensionless', fn, arg);
  if (!Number.isFinite(x)) throw new BuiltinError(`${where(fn, arg)} must be a finite number, got ${x}`);
  return x;
}

function separationArg(v: unknown, fallback: number, fn: string, arg: string): number {
  if (v === undefined) return fallback;
  const x = scalarSI(v, 'length', fn, arg);
  if (!(x > 0) || !Number.isFinite(x)) throw new BuiltinError(`${where(fn, arg)} must be a positive finite length, got ${x} m`);
  return x;
}

function emissionModel(h: PhenomHardeningValue, fn: string): EmissionModel {
  const kernel = guardedPhysics(fn, () => phenomEmissionKernel(h.model, M_SUN_KG));
  const residence = guardedPhysics(fn, () => phenomResidenceFactor(h.model, M_SUN_KG));
  return new EmissionModel(kernel, `GW-driven with the residence time of ${h.describe()}`, phenomParameters(h), 1, residence);
}

const hardeningArgDoc = { name: 'hardening', unit: 'phenomHardening', description: 'from phenomHardening' };

const D = PHENOM_HARDENING_DEFAULTS;

export const phenomHardeningBuiltins: Builtin[] = [
  {
    name: 'phenomHardening',
    category: 'population',
    summary:
      'Phenomenological binary hardening with a total lifetime: da/dt = -A x^(1-nu_in) (1+x)^(nu_in-nu_out) - (64/5) G^3 m1 m2 M/(c^5 a^3), x = a/a_c, with A of each binary (M, q) set so that the time from the initial separation to the ISCO is the lifetime. The same model gives the delay (delayedPopulation, stalledFraction), the low-frequency bend (phenomEmission, phenomSpectrum), and the counts per bin and realisations as their environment argument (binariesPerBin, realiseBackground, ...).',
    args: [
      { name: 'lifetime', unit: 'Gyr', description: 'total time tau_f from formation to coalescence, >= 0 (a binary whose GW time alone is shorter keeps its GW time)' },
      { name: 'innerIndex', unit: 'dimensionless', description: `index nu_in of the hardening time a/|da/dt| inside the break (default ${D.innerIndex})`, optional: true },
      { name: 'outerIndex', unit: 'dimensionless', description: `index nu_out outside the break (default +${D.outerIndex})`, optional: true },
      { name: 'breakSeparation', unit: 'pc', description: `break separation a_c > 0 (default ${D.breakSeparationM / PC_M} pc)`, optional: true },
      { name: 'initialSeparation', unit: 'pc', description: `separation a_0 > 0 at formation (default ${D.initialSeparationM / PC_M} pc)`, optional: true },
    ],
    returns: { unit: 'phenomHardening', description: 'the model' },
    source: PHENOM_SOURCE,
    example: 'phenomHardening(3 Gyr)',
    fn: (lifetime: unknown, innerIndex?: unknown, outerIndex?: unknown, breakSeparation?: unknown, initialSeparation?: unknown) => {
      const fn = 'phenomHardening';
      const tau = nonNegativeSI(lifetime, 'time', fn, 'lifetime');
      if (!Number.isFinite(tau)) throw new BuiltinError(`${where(fn, 'lifetime')} must be finite`);
      const model: PhenomHardening = {
        lifetimeS: tau,
        innerIndex: indexArg(innerIndex, D.innerIndex, fn, 'innerIndex'),
        outerIndex: indexArg(outerIndex, D.outerIndex, fn, 'outerIndex'),
        breakSeparationM: separationArg(breakSeparation, D.breakSeparationM, fn, 'breakSeparation'),
        initialSeparationM: separationArg(initialSeparation, D.initialSeparationM, fn, 'initialSeparation'),
      };
      guardedPhysics(fn, () => checkPhenomHardening(model));
      return new PhenomHardeningValue(model);
    },
  },
  {
    name: 'phenomEmission',
    category: 'environment',
    summary: 'Emission model of circular binaries under phenomHardening: dE/dln f_r = (dE/dln f_r)_GW x (dt/dln f_r)_total/(dt/dln f_r)_GW = (dE/dln f_r)_GW B/(A g(a/a_c) a^3 + B). The bend only: for the delay as well use phenomSpectrum.',
    args: [hardeningArgDoc],
    returns: { unit: 'emission', description: 'for strainSpectrum; each binary bends where the environment and GW emission harden it equally' },
    source: PHENOM_SOURCE,
    example: 'strainSpectrum(pop, freqs, phenomEmission(phenomHardening(3 Gyr)))',
    fn: (hardening: unknown) => emissionModel(phenomHardeningArg(hardening, 'phenomEmission'), 'phenomEmission'),
  },
  {
    name: 'phenomSpectrum',
    category: 'environment',
    summary: 'Characteristic strain of a population under phenomHardening: the population delayed by each binary\'s lifetime (delayedPopulation), with the residence time of the model (phenomEmission).',
    args: [
      { name: 'population', unit: 'population', description: 'galaxy-merger population that knows its cosmology (its redshift is the formation redshift)' },
      { name: 'freqs', unit: 'nHz', description: 'observed GW frequencies (a list)' },
      hardeningArgDoc,
    ],
    returns: { unit: 'spectrum', description: 'h_c on the grid, with the series strainSpectrum gives' },
    source: `${PHENOM_SOURCE}; times from Hogg 1999, astro-ph/9905116`,
    example: 'phenomSpectrum(pop, freqs, phenomHardening(3 Gyr))',
    fn: (population: unknown, freqs: unknown, hardening: unknown) => {
      const fn = 'phenomSpectrum';
      checkSpectrumArgs(population, freqs, fn);
      const h = phenomHardeningArg(hardening, fn);
      const delayed = phenomDelayedPopulationValue(population, h, fn);
      const b = spectrumBuiltins.find((x) => x.name === 'strainSpectrum');
      if (!b) throw new BuiltinError('strainSpectrum is not available');
      return b.fn(delayed, freqs, emissionModel(h, fn)) as SpectrumValue;
    },
  },
  {
    name: 'phenomResidence',
    category: 'environment',
    summary: 'The factor phenomHardening puts on the GW-driven energy per ln f_r of one circular binary: (dt/dln f_r)_total/(dt/dln f_r)_GW = B/(A g(a/a_c) a^3 + B) at the separation of rest-frame GW frequency f_r (0 below the frequency of the initial separation).',
    args: [
      hardeningArgDoc,
      { name: 'totalMass', unit: 'Msun', description: 'total mass > 0' },
      { name: 'q', unit: 'dimensionless', description: 'mass ratio in (0, 1]' },
      { name: 'freqs', unit: 'nHz', description: 'rest-frame GW frequencies > 0 (a list or one value)' },
    ],
    returns: { unit: 'dimensionless', description: 'the factor in [0, 1] at each frequency' },
    source: PHENOM_SOURCE,
    example: 'phenomResidence(phenomHardening(3 Gyr), 1e9 Msun, 1, 3 nHz)',
    fn: (hardening: unknown, totalMass: unknown, q: unknown, freqs: unknown) => {
      const fn = 'phenomResidence';
      const h = phenomHardeningArg(hardening, fn);
      const m = scalarSI(totalMass, 'mass', fn, 'totalMass');
      if (!(m > 0) || !Number.isFinite(m)) throw new BuiltinError(`${where(fn, 'totalMass')} must be a positive mass, got ${m} kg`);
      const qq = scalarSI(q, 'dimensionless', fn, 'q');
      if (!(qq > 0 && qq <= 1)) throw new BuiltinError(`${where(fn, 'q')} must be a mass ratio in (0, 1], got ${qq}`);
      const A = guardedPhysics(fn, () => normalisationOf(m, qq, h.model));
      return elementwise(freqs, 'frequency', fn, 'freqs', (f, arg) => {
        if (!(f > 0) || !Number.isFinite(f)) throw new BuiltinError(`${where(fn, arg)} must be a positive frequency, got ${f} Hz`);
        return residenceRatio(f, m, qq, A, h.model);
      });
    },
  },
];

/** The population delayed by the model's lifetimes, as a population value (shared with delayedPopulation). */
export function phenomDelayedPopulationValue(population: unknown, h: PhenomHardeningValue, fn: string): PopulationValue {
  const p = populationArg(population, fn);
  if (!p.cosmology) throw new BuiltinError(`${where(fn, 'population')} has no cosmology, so a lifetime cannot be turned into redshifts (give customPopulation a cosmology argument)`);
  const cosmology = p.cosmology;
  return new PopulationValue(
    guardedPhysics(fn, () => phenomDelayedPopulation(p.population, cosmology, h.model, M_SUN_KG)),
    `${p.label}, coalescing ${g(h.model.lifetimeS / GYR_S)} Gyr after formation (phenomenological hardening)`,
    { ...p.parameters, ...phenomParameters(h) },
    cosmology,
  );
}
