// Orbit built-ins: eccentric GW-driven binaries (Peters & Mathews 1963; Peters 1964; Enoki & Nagashima
// 2007) and the finite number of binaries per frequency bin (Sesana, Vecchio & Colacino 2008).
// Units and argument checks here; the physics is in src/physics.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { math } from '../sheet/mathInstance';
import { checkTimeNowIfHandingOff } from '../sheet/evaluationBudget';
import { M_SUN_KG } from '../physics/constants';
import type { SheetObject } from '../sheet/sheetObject';
import { isSheetObject } from '../sheet/sheetObject';
import { circularGwKernel } from '../physics/circularKernel';
import { eccentricityEnhancement, harmonicPower } from '../physics/petersMathews';
import { eccentricityAtOrbitalFrequency } from '../physics/petersEvolution';
import {
  ECCENTRIC_SPECTRUM_E0_LIMIT,
  eccentricEmissionKernel,
  eccentricityNodes,
  eccentricTables,
  truncatedNormalEccentricity,
  uniformEccentricity,
  type EccentricityDistribution,
} from '../physics/eccentricKernel';
import { finiteBinaryBins, type FiniteBinaryResult } from '../physics/finiteBinaries';
import type { EmissionKernel } from '../physics/populationTypes';
import type { ResidenceFactor } from '../physics/residenceFactor';
import { cosmologyAndEnvironment, RESIDENCE_ARG_HELP } from './residenceArg';
import { functionOf, objectOf, scalarSI, vectorSI, where } from './args';
import { cosmologyArg, elementwise, guardedPhysics, populationArg, positiveSI } from './physicsArgs';
import { SpectrumValue, type EmissionValue } from './spectrumValue';
import { spectrumBuiltins } from './spectrum';

const PETERS_MATHEWS = 'Peters & Mathews 1963, Phys. Rev. 131, 435';
const PETERS = 'Peters 1964, Phys. Rev. 136, B1224';
const ENOKI = 'Enoki & Nagashima 2007, Prog. Theor. Phys. 117, 241';
const SVC = 'Sesana, Vecchio & Colacino 2008, MNRAS 390, 192';

/** An eccentricity in [0, limit) (limit 1 unless given), from a plain number or a dimensionless quantity. */
export function eccentricityArg(v: unknown, fn: string, arg: string, limit = 1, closedAtLimit = false): number {
  const e = scalarSI(v, 'dimensionless', fn, arg);
  const ok = e >= 0 && (closedAtLimit ? e <= limit : e < limit);
  if (!ok) throw new BuiltinError(`${where(fn, arg)} must be an eccentricity in [0, ${limit}${closedAtLimit ? ']' : ')'}, got ${e}`);
  return e;
}

/** The 'eccentricityDistribution' SheetObject. */
export class EccentricityDistributionValue implements SheetObject {
  readonly kind = 'eccentricityDistribution';
  constructor(readonly distribution: EccentricityDistribution) {}
  describe(): string {
    return this.distribution.label;
  }
  toJSON(): unknown {
    return { kind: this.kind, label: this.distribution.label, lo: this.distribution.lo, hi: this.distribution.hi };
  }
}

/** An emission model (kernel + cut factor) as the spectrum built-ins expect it. */
export class EmissionModel implements EmissionValue {
  readonly kind = 'emission' as const;
  constructor(
    readonly kernel: EmissionKernel,
    readonly label: string,
    readonly parameters: Record<string, number | string>,
    readonly cutFactor = 1,
    /** For circular environment models: the kernel is the circular one times this residence factor (counts per bin use it). */
    readonly residence?: ResidenceFactor,
  ) {}
  describe(): string {
    return this.label;
  }
  toJSON(): unknown {
    return { kind: this.kind, label: this.label, parameters: this.parameters, cutFactor: this.cutFactor };
  }
}

/** e0 as one number (a cell with a number) or an eccentricityDistribution. */
export function initialEccentricityArg(v: unknown, fn: string, arg = 'e0'): number | EccentricityDistribution {
  if (isSheetObject(v)) return objectOf<EccentricityDistributionValue>(v, 'eccentricityDistribution', fn, arg).distribution;
  return eccentricityArg(v, fn, arg, ECCENTRIC_SPECTRUM_E0_LIMIT, true);
}

function describeE0(e0: number | EccentricityDistribution): string {
  return typeof e0 === 'number' ? `e0 = ${e0}` : e0.label;
}

function nHz(x: number): string {
  return `${(x * 1e9).toPrecision(3)} nHz`;
}

/** Checks the population and frequency arguments under the caller's name before strainSpectrum runs. */
export function checkSpectrumArgs(population: unknown, freqs: unknown, fn: string): void {
  populationArg(population, fn);
  const f = vectorSI(freqs, 'frequency', fn, 'freqs');
  if (f.length === 0) throw new BuiltinError(`${where(fn, 'freqs')} holds no frequency`);
  f.forEach((x, i) => {
    if (!(x > 0)) throw new BuiltinError(`${where(fn, `freqs[${i + 1}]`)} must be a positive frequency, got ${x} Hz`);
  });
}

/** The eccentric emission model (shared by eccentricEmission and eccentricSpectrum). */
function eccentricModel(e0v: unknown, f0v: unknown, fn: string): EmissionModel {
  const e0 = initialEccentricityArg(e0v, fn);
  const f0 = positiveSI(f0v, 'frequency', fn, 'f0');
  const kernel = guardedPhysics(fn, () => eccentricEmissionKernel(circularGwKernel, { e0, f0OrbitalHz: f0, table: { checkTime: checkTimeNowIfHandingOff } }));
  return new EmissionModel(kernel, `eccentric GW-driven, ${describeE0(e0)} at orbital ${nHz(f0)} (rest frame)`, { e0: describeE0(e0), f0OrbitalHz: f0 });
}

const strainSpectrumBuiltin = () => {
  const b = spectrumBuiltins.find((x) => x.name === 'strainSpectrum');
  if (!b) throw new BuiltinError('strainSpectrum is not available');
  return b;
};

function numberList(xs: ArrayLike<number>) {
  return math.matrix(Array.from(xs));
}

function finiteBins(population: unknown, freqs: unknown, span: unknown, extra1: unknown, extra2: unknown, fn: string): FiniteBinaryResult {
  const p = populationArg(population, fn);
  const { cosmology, residence } = cosmologyAndEnvironment(extra1, extra2, fn);
  const cosmo = cosmology !== undefined ? cosmologyArg(cosmology, fn).model : p.cosmology;
  if (!cosmo) throw new BuiltinError(`${where(fn, 'cosmology')} is needed: the population was built without one`);
  const f = vectorSI(freqs, 'frequency', fn, 'freqs');
  if (f.length === 0 || f.length > 2000) throw new BuiltinError(`${where(fn, 'freqs')} must hold 1 to 2000 frequencies, got ${f.length}`);
  f.forEach((x, i) => {
    if (!(x > 0)) throw new BuiltinError(`${where(fn, `freqs[${i + 1}]`)} must be a positive frequency, got ${x} Hz`);
  });
  const T = positiveSI(span, 'time', fn, 'span');
  // binariesPerBin, thinnedSpectrum and loudestBinaryStrain of one population, grid, span and
  // environment share one computation (the last one is kept; populations, cosmologies and models are immutable values).
  const last = lastFinite;
  const env = residence?.source;
  if (last && last.population === p.population && last.cosmology === cosmo && last.spanS === T && last.environment === env && sameNumbers(last.freqsHz, f)) return last.result;
  const result = guardedPhysics(fn, () => finiteBinaryBins(p.population, cosmo, f, T, {}, residence?.factor, checkTimeNowIfHandingOff));
  lastFinite = { population: p.population, cosmology: cosmo, spanS: T, environment: env, freqsHz: Float64Array.from(f), result };
  return result;
}

let lastFinite: { population: object; cosmology: object; spanS: number; environment: object | undefined; freqsHz: Float64Array; result: FiniteBinaryResult } | undefined;

function sameNumbers(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

const finiteArgs = [
  { name: 'population', unit: 'population', description: 'from mergerPopulation or customPopulation' },
  { name: 'freqs', unit: 'nHz', description: 'observed GW frequencies, the bin centres (a list, e.g. from frequencyGrid)' },
  { name: 'span', unit: 'yr', description: 'observing span T > 0; each bin is 1/T wide' },
  { name: 'cosmology', unit: 'cosmology', description: "for volumes and distances (default the population's own); may be swapped with environment", optional: true },
  { name: 'environment', unit: 'hardening or emission', description: `${RESIDENCE_ARG_HELP} (default: GW-driven)`, optional: true },
];

export const orbitBuiltins: Builtin[] = [
  {
    name: 'harmonicPower',
    category: 'orbits',
    summary: 'Fraction g(n, e) of the power of a circular orbit radiated in harmonic n of the orbital frequency by an orbit of eccentricity e.',
    args: [
      { name: 'n', unit: 'dimensionless', description: 'harmonic, a whole number >= 1' },
      { name: 'e', unit: 'dimensionless', description: 'eccentricity in [0, 1)' },
    ],
    returns: { unit: 'dimensionless', description: 'g(n, e); sum over n equals eccentricityEnhancement(e); g(2, 0) = 1' },
    source: `${PETERS_MATHEWS}, eq. 20 (Bessel functions by Miller's backward recurrence)`,
    example: 'harmonicPower(2, 0) gives 1',
    fn: (n: unknown, e: unknown) => {
      const fn = 'harmonicPower';
      const k = scalarSI(n, 'dimensionless', fn, 'n');
      if (!Number.isInteger(k) || k < 1 || k > 100_000) throw new BuiltinError(`${where(fn, 'n')} must be a whole number from 1 to 100000, got ${k}`);
      return harmonicPower(k, eccentricityArg(e, fn, 'e'));
    },
  },
  {
    name: 'eccentricityEnhancement',
    category: 'orbits',
    summary: 'F(e) = (1 + 73/24 e^2 + 37/96 e^4) / (1 - e^2)^(7/2): total GW power of an eccentric orbit relative to a circular one of the same semi-major axis.',
    args: [{ name: 'e', unit: 'dimensionless', description: 'eccentricity in [0, 1) (or a list)' }],
    returns: { unit: 'dimensionless', description: 'F(e) >= 1' },
    source: `${PETERS_MATHEWS}, eq. 17`,
    example: 'eccentricityEnhancement(0) gives 1',
    fn: (e: unknown) => {
      const fn = 'eccentricityEnhancement';
      return elementwise(e, 'dimensionless', fn, 'e', (x, arg) => eccentricityEnhancement(eccentricityArg(x, fn, arg)));
    },
  },
  {
    name: 'eccentricityAt',
    category: 'orbits',
    summary: 'Eccentricity of a GW-driven binary at orbital frequency f, given e0 at orbital frequency f0 (independent of the masses).',
    args: [
      { name: 'e0', unit: 'dimensionless', description: 'eccentricity at f0, in [0, 1)' },
      { name: 'f0', unit: 'nHz', description: 'orbital frequency where the eccentricity is e0, > 0' },
      { name: 'f', unit: 'nHz', description: 'orbital frequency > 0 (or a list); below f0 runs the orbit back in time' },
    ],
    returns: { unit: 'dimensionless', description: 'e at f (a list if f is a list)' },
    source: `${PETERS}, eq. 5.11 (a(e) closed form) with Kepler's third law`,
    example: 'eccentricityAt(0.9, 1 nHz, 10 nHz)',
    fn: (e0: unknown, f0: unknown, f: unknown) => {
      const fn = 'eccentricityAt';
      const e = eccentricityArg(e0, fn, 'e0');
      const start = positiveSI(f0, 'frequency', fn, 'f0');
      return elementwise(f, 'frequency', fn, 'f', (x, arg) => {
        if (!(x > 0)) throw new BuiltinError(`${where(fn, arg)} must be a positive frequency, got ${x} Hz`);
        return guardedPhysics(fn, () => eccentricityAtOrbitalFrequency(e, x / start));
      });
    },
  },
  {
    name: 'eccentricityUniform',
    category: 'orbits',
    summary: 'Initial eccentricity spread uniformly over [lo, hi], for eccentricEmission and eccentricSpectrum.',
    args: [
      { name: 'lo', unit: 'dimensionless', description: `lowest e0, >= 0` },
      { name: 'hi', unit: 'dimensionless', description: `highest e0, > lo and <= ${ECCENTRIC_SPECTRUM_E0_LIMIT}` },
    ],
    returns: { unit: 'eccentricityDistribution', description: 'averaged over by 12-point composite Gauss-Legendre quadrature in e0' },
    source: 'common practice, no source',
    example: 'eccentricityUniform(0.1, 0.6)',
    fn: (lo: unknown, hi: unknown) => {
      const fn = 'eccentricityUniform';
      const a = eccentricityArg(lo, fn, 'lo', ECCENTRIC_SPECTRUM_E0_LIMIT);
      const b = eccentricityArg(hi, fn, 'hi', ECCENTRIC_SPECTRUM_E0_LIMIT, true);
      if (!(b > a)) throw new BuiltinError(`${where(fn, 'hi')} must exceed lo (${a}), got ${b}`);
      return new EccentricityDistributionValue(uniformEccentricity(a, b));
    },
  },
  {
    name: 'eccentricityNormal',
    category: 'orbits',
    summary: 'Initial eccentricity with a normal density of given mean and standard deviation, truncated to [lo, hi].',
    args: [
      { name: 'mean', unit: 'dimensionless', description: 'mean of the untruncated normal' },
      { name: 'sd', unit: 'dimensionless', description: 'standard deviation > 0' },
      { name: 'lo', unit: 'dimensionless', description: 'lower truncation >= 0 (default 0)', optional: true },
      { name: 'hi', unit: 'dimensionless', description: `upper truncation <= ${ECCENTRIC_SPECTRUM_E0_LIMIT} (default ${ECCENTRIC_SPECTRUM_E0_LIMIT})`, optional: true },
    ],
    returns: { unit: 'eccentricityDistribution', description: 'averaged over by 12-point composite Gauss-Legendre quadrature in e0' },
    source: 'common practice, no source',
    example: 'eccentricityNormal(0.5, 0.1)',
    fn: (mean: unknown, sd: unknown, lo?: unknown, hi?: unknown) => {
      const fn = 'eccentricityNormal';
      const m = scalarSI(mean, 'dimensionless', fn, 'mean');
      const s = scalarSI(sd, 'dimensionless', fn, 'sd');
      if (!(s > 0)) throw new BuiltinError(`${where(fn, 'sd')} must be positive, got ${s}`);
      const a = lo === undefined ? 0 : eccentricityArg(lo, fn, 'lo', ECCENTRIC_SPECTRUM_E0_LIMIT);
      const b = hi === undefined ? ECCENTRIC_SPECTRUM_E0_LIMIT : eccentricityArg(hi, fn, 'hi', ECCENTRIC_SPECTRUM_E0_LIMIT, true);
      if (!(b > a)) throw new BuiltinError(`${where(fn, 'hi')} must exceed lo (${a}), got ${b}`);
      return new EccentricityDistributionValue(guardedPhysics(fn, () => truncatedNormalEccentricity(m, s, a, b)));
    },
  },
  {
    name: 'eccentricityCustom',
    category: 'orbits',
    summary: 'Initial eccentricity with a density given by a function cell of e on [lo, hi] (need not be normalised).',
    args: [
      { name: 'density', unit: 'function(e)', description: 'function cell of one argument returning a number >= 0' },
      { name: 'lo', unit: 'dimensionless', description: 'lowest e0, >= 0' },
      { name: 'hi', unit: 'dimensionless', description: `highest e0, > lo and <= ${ECCENTRIC_SPECTRUM_E0_LIMIT}` },
    ],
    returns: { unit: 'eccentricityDistribution', description: 'averaged over by 12-point composite Gauss-Legendre quadrature in e0' },
    source: 'common practice, no source',
    example: 'pe(x) = x * (1 - x), then eccentricityCustom(pe, 0, 0.9)',
    fn: (density: unknown, lo: unknown, hi: unknown) => {
      const fn = 'eccentricityCustom';
      const d = functionOf(density, 1, fn, 'density');
      const a = eccentricityArg(lo, fn, 'lo', ECCENTRIC_SPECTRUM_E0_LIMIT);
      const b = eccentricityArg(hi, fn, 'hi', ECCENTRIC_SPECTRUM_E0_LIMIT, true);
      if (!(b > a)) throw new BuiltinError(`${where(fn, 'hi')} must exceed lo (${a}), got ${b}`);
      const densityOf = (e: number): number => {
        const v = d(e);
        const x = scalarSI(v, 'dimensionless', fn, `density(${e})`);
        if (!(x >= 0)) throw new BuiltinError(`${where(fn, 'density')} must not be negative, got ${x} at e = ${e}`);
        return x;
      };
      // Evaluate once on the quadrature nodes now, so a bad density fails in this cell.
      const dist: EccentricityDistribution = { lo: a, hi: b, density: densityOf, label: `custom e0 density on [${a}, ${b}]` };
      guardedPhysics(fn, () => eccentricityNodes(dist));
      return new EccentricityDistributionValue(dist);
    },
  },
  {
    name: 'harmonicSumFactor',
    category: 'orbits',
    summary: 'Phi = sum_n (2/n)^(2/3) g(n, e_n)/F(e_n): eccentric emission per ln f_r relative to circular, at x = f_r / f0, for binaries starting at orbital frequency f0 with e0.',
    args: [
      { name: 'e0', unit: 'dimensionless or eccentricityDistribution', description: `initial eccentricity in [0, ${ECCENTRIC_SPECTRUM_E0_LIMIT}], or a distribution` },
      { name: 'x', unit: 'dimensionless', description: 'rest-frame GW frequency over the initial orbital frequency, > 0 (or a list)' },
    ],
    returns: { unit: 'dimensionless', description: 'Phi (0 below x = 1; 1 at every x >= 2 for e0 = 0)' },
    source: `${ENOKI}; ${PETERS_MATHEWS}; ${PETERS}`,
    example: 'harmonicSumFactor(0.5, 10)',
    fn: (e0: unknown, x: unknown) => {
      const fn = 'harmonicSumFactor';
      const e = initialEccentricityArg(e0, fn);
      const { tables, weights } = guardedPhysics(fn, () => eccentricTables({ e0: e, f0OrbitalHz: 1 }));
      return elementwise(x, 'dimensionless', fn, 'x', (v, arg) => {
        if (!(v > 0)) throw new BuiltinError(`${where(fn, arg)} must be positive, got ${v}`);
        let s = 0;
        for (let k = 0; k < tables.length; k++) s += weights[k] * tables[k].at(v);
        return s;
      });
    },
  },
  {
    name: 'eccentricEmission',
    category: 'orbits',
    summary: 'Emission model of eccentric binaries that start GW-driven decay at orbital frequency f0 with eccentricity e0 (one value or a distribution), for strainSpectrum.',
    args: [
      { name: 'e0', unit: 'dimensionless or eccentricityDistribution', description: `initial eccentricity in [0, ${ECCENTRIC_SPECTRUM_E0_LIMIT}], or a distribution` },
      { name: 'f0', unit: 'nHz', description: 'initial orbital frequency (rest frame), > 0' },
    ],
    returns: { unit: 'emission', description: 'dE/dln f_r = circular x Phi(f_r / f0; e0)' },
    source: `${ENOKI}; harmonics ${PETERS_MATHEWS}; e(f) ${PETERS}`,
    example: 'strainSpectrum(pop, freqs, eccentricEmission(0.5, 0.1 nHz))',
    fn: (e0: unknown, f0: unknown) => eccentricModel(e0, f0, 'eccentricEmission'),
  },
  {
    name: 'eccentricSpectrum',
    category: 'orbits',
    summary: 'Characteristic strain of a population of eccentric GW-driven binaries (e0 at orbital frequency f0): strainSpectrum with eccentricEmission.',
    args: [
      { name: 'population', unit: 'population', description: 'from mergerPopulation or customPopulation' },
      { name: 'freqs', unit: 'nHz', description: 'observed GW frequencies (a list)' },
      { name: 'e0', unit: 'dimensionless or eccentricityDistribution', description: `initial eccentricity in [0, ${ECCENTRIC_SPECTRUM_E0_LIMIT}], or a distribution` },
      { name: 'f0', unit: 'nHz', description: 'initial orbital frequency (rest frame), > 0' },
    ],
    returns: { unit: 'spectrum', description: 'h_c on the grid, with the series strainSpectrum gives' },
    source: `${ENOKI}, with the integrator of Phinney 2001, astro-ph/0108028`,
    example: 'eccentricSpectrum(pop, freqs, 0.9, 0.1 nHz)',
    fn: (population: unknown, freqs: unknown, e0: unknown, f0: unknown) => {
      checkSpectrumArgs(population, freqs, 'eccentricSpectrum');
      const model = eccentricModel(e0, f0, 'eccentricSpectrum');
      return strainSpectrumBuiltin().fn(population, freqs, model) as SpectrumValue;
    },
  },
  {
    name: 'binariesPerBin',
    category: 'spectrum',
    summary: 'Expected number of circular binaries emitting in each frequency bin of width 1/T: GW-driven, or with an environment the GW-driven number times its residence factor (dt/dln f)_total/(dt/dln f)_GW.',
    args: finiteArgs,
    returns: { unit: 'dimensionless', description: 'a list, one expected count per frequency' },
    source: `${SVC}; volumes Hogg 1999, astro-ph/9905116; residence factor Phinney 2001, astro-ph/0108028, and Sesana 2013, arXiv:1307.2600`,
    example: 'binariesPerBin(pop, freqs, 14 yr)',
    fn: (population: unknown, freqs: unknown, span: unknown, cosmology?: unknown, environment?: unknown) => numberList(finiteBins(population, freqs, span, cosmology, environment, 'binariesPerBin').expectedPerBin),
  },
  {
    name: 'longResidenceShare',
    category: 'spectrum',
    summary: 'Per frequency bin of width 1/T, the share of the expected binaries (those binariesPerBin counts) whose residence time dt/dln f (the total one when an environment is given) exceeds the age of the Universe at their redshift: near 1, the bin counts binaries that cannot have got there.',
    args: finiteArgs,
    returns: { unit: 'dimensionless', description: 'a list of shares in [0, 1], one per bin (0 for a bin with no binaries)' },
    source: 'residence time dt/dln f_r = (5/96)(G M_c/c^3)^(-5/3)(pi f_r)^(-8/3), Peters 1964, Phys. Rev. 136, B1224; age Hogg 1999, astro-ph/9905116',
    example: 'longResidenceShare(pop, freqs, 14 yr)',
    fn: (population: unknown, freqs: unknown, span: unknown, cosmology?: unknown, environment?: unknown) => {
      const r = finiteBins(population, freqs, span, cosmology, environment, 'longResidenceShare');
      return numberList(r.expectedPerBin.map((n, k) => (n > 0 ? r.longResidencePerBin[k] / n : 0)));
    },
  },
  {
    name: 'thinnedSpectrum',
    category: 'spectrum',
    summary: 'Characteristic strain expected when, in each bin of width 1/T, the heaviest binaries (those above the mass where fewer than one is expected) are absent.',
    args: finiteArgs,
    returns: {
      unit: 'spectrum',
      description: 'h_c on the grid; series smoothHc (all binaries), expectedPerBin, cutMass (Msun, total mass above which fewer than one binary is expected), loudestStrain',
    },
    source: `${SVC}`,
    example: 'thinnedSpectrum(pop, freqs, 14 yr)',
    fn: (population: unknown, freqs: unknown, span: unknown, cosmology?: unknown, environment?: unknown) => {
      const r = finiteBins(population, freqs, span, cosmology, environment, 'thinnedSpectrum');
      return new SpectrumValue(
        { frequencyHz: r.frequencyHz, hc: r.thinnedHc },
        {
          smoothHc: { unit: '', description: 'h_c of all binaries', values: r.smoothHc },
          expectedPerBin: { unit: '', description: 'expected binaries per bin', values: r.expectedPerBin },
          cutMass: { unit: 'kg', description: 'total mass above which fewer than one binary is expected per bin', values: r.cutLog10M.map((x) => Math.pow(10, x) * M_SUN_KG) },
          loudestStrain: { unit: '', description: 'strain of the loudest binary expected per bin', values: r.loudestStrain },
        },
        undefined,
      );
    },
  },
  {
    name: 'loudestBinaryStrain',
    category: 'spectrum',
    summary: 'Sky- and polarisation-averaged strain of the loudest binary expected in each bin of width 1/T (one binary expected above it); 0 where fewer than one binary is expected.',
    args: finiteArgs,
    returns: { unit: 'dimensionless', description: 'a list of strains h = sqrt(32/5) (G M_c)^(5/3) (pi f_r)^(2/3) / (c^4 D_C)' },
    source: `${SVC}`,
    example: 'loudestBinaryStrain(pop, freqs, 14 yr)',
    fn: (population: unknown, freqs: unknown, span: unknown, cosmology?: unknown, environment?: unknown) => numberList(finiteBins(population, freqs, span, cosmology, environment, 'loudestBinaryStrain').loudestStrain),
  },
];
