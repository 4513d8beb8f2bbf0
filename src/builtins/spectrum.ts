// Spectrum built-ins: frequency grids, h_c(f) of a population (Phinney 2001, astro-ph/0108028), A_yr,
// conversions to Omega_gw and timing-residual power, local slopes, and where the signal comes from.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { math, quantity } from '../sheet/mathInstance';
import type { SheetObject } from '../sheet/sheetObject';
import { F_YR_HZ, M_SUN_KG } from '../physics/constants';
import { backgroundSpectrum, characteristicStrainSquared, type BackgroundOptions } from '../physics/backgroundIntegral';
import { frequencyGridFromSpan, logFrequencyGrid } from '../physics/frequencyGrid';
import { alphaFromGamma, equivalentResidual, gammaFromAlpha, rmsResidualInBand, localSpectralSlope, omegaGw, residualPowerSpectralDensity, strainAtFrequency } from '../physics/spectrumConversions';
import { iscoGwFrequencyHz } from '../physics/circularKernel';
import { chirpMassOrigin, redshiftOrigin, type OriginProfile } from '../physics/signalOrigin';
import { objectOf, scalarSI, vectorSI, where } from './args';
import { elementwise, countArg, guardedPhysics, isList, populationArg, positiveSI } from './physicsArgs';
import { isEmissionValue, SpectrumValue, type SpectrumSeries } from './spectrumValue';
import type { PopulationValue } from './populationValue';

const PHINNEY = 'Phinney 2001, astro-ph/0108028';

function emissionOptions(v: unknown, fn: string): { options: BackgroundOptions; label?: string } {
  if (v === undefined) return { options: {} };
  if (!isEmissionValue(v)) throw new BuiltinError(`${where(fn, 'emission')} must be an emission model (from the orbit or environment built-ins), got ${v === null ? 'nothing' : typeof v === 'object' && 'kind' in (v as object) ? `a ${(v as SheetObject).kind}` : typeof v}`);
  return { options: { kernel: v.kernel, cutFactor: v.cutFactor ?? 1 }, label: v.describe() };
}

function frequenciesArg(v: unknown, fn: string, arg: string): Float64Array {
  const f = vectorSI(v, 'frequency', fn, arg);
  if (f.length === 0) throw new BuiltinError(`${where(fn, arg)} holds no frequency`);
  if (f.length > 10_000) throw new BuiltinError(`${where(fn, arg)} holds ${f.length} frequencies; at most 10000 are allowed`);
  f.forEach((x, i) => {
    if (!(x > 0)) throw new BuiltinError(`${where(fn, `${arg}[${i + 1}]`)} must be a positive frequency, got ${x} Hz`);
  });
  return f;
}

function hzList(f: Float64Array) {
  return math.matrix(Array.from(f, (x) => quantity(x, 'nHz')) as never[]);
}

function spectrumArg(v: unknown, fn: string): SpectrumValue {
  return objectOf<SpectrumValue>(v, 'spectrum', fn, 'spectrum');
}

/** h_c^2 at frequency f for a spectrum: exact from its population when known, else interpolated. */
function strainOfSpectrum(s: SpectrumValue, fHz: number, fn: string): number {
  if (s.origin) return Math.sqrt(guardedPhysics(fn, () => characteristicStrainSquared(s.origin!.population, [fHz], s.origin!.options))[0]);
  return guardedPhysics(fn, () => strainAtFrequency(s.spectrum, fHz));
}

class OriginValue implements SheetObject {
  readonly kind = 'origin';
  constructor(
    readonly variable: 'z' | 'log10Mc',
    readonly profile: OriginProfile,
    readonly frequencyHz: number,
  ) {}
  describe(): string {
    const p = this.profile;
    const show = (x: number) => (this.variable === 'z' ? x.toFixed(2) : `10^${x.toFixed(2)} Msun`);
    const what = this.variable === 'z' ? 'z' : 'M_c';
    return `h_c^2 at ${(this.frequencyHz * 1e9).toPrecision(3)} nHz: 50% from ${what} ${show(p.range50[0])} to ${show(p.range50[1])}, 90% from ${show(p.range90[0])} to ${show(p.range90[1])}`;
  }
  toJSON(): unknown {
    const p = this.profile;
    return { kind: this.kind, variable: this.variable, frequencyHz: this.frequencyHz, grid: Array.from(p.grid), density: Array.from(p.density), cumulative: Array.from(p.cumulative), median: p.median, range50: p.range50, range90: p.range90 };
  }
}

function originOf(variable: 'z' | 'log10Mc', population: unknown, frequency: unknown, emission: unknown, fn: string): OriginValue {
  const p = populationArg(population, fn);
  const f = frequency === undefined ? F_YR_HZ : positiveSI(frequency, 'frequency', fn, 'frequency');
  const { options } = emissionOptions(emission, fn);
  const opts = { kernel: options.kernel, cutFactor: options.cutFactor };
  const profile = guardedPhysics(fn, () => (variable === 'z' ? redshiftOrigin(p.population, f, opts) : chirpMassOrigin(p.population, f, opts)));
  if (!(profile.total > 0)) throw new BuiltinError(`${fn}: the population gives no signal at ${f} Hz`);
  return new OriginValue(variable, profile, f);
}

const frequencyArgDoc = { name: 'frequency', unit: 'nHz', description: 'observed GW frequency (default f_yr = 1/yr)', optional: true };
const emissionArgDoc = { name: 'emission', unit: 'emission', description: 'emission model from the orbit or environment built-ins (default circular, GW-driven)', optional: true };

export const spectrumBuiltins: Builtin[] = [
  {
    name: 'frequencyGrid',
    category: 'spectrum',
    summary: 'Frequencies an array resolves: k / span for k = 1, 2, ... up to the Nyquist frequency 1 / (2 cadence), optionally only the first maxCount.',
    args: [
      { name: 'span', unit: 'yr', description: 'observing span T, > 0' },
      { name: 'cadence', unit: 'd', description: 'time between observations, less than half the span' },
      { name: 'maxCount', unit: 'dimensionless', description: 'keep only the lowest maxCount frequencies', optional: true },
    ],
    returns: { unit: 'nHz', description: 'list of frequencies' },
    source: 'common practice, no source',
    example: 'frequencyGrid(14 yr, 21 d, 40)',
    fn: (span: unknown, cadence: unknown, maxCount?: unknown) => {
      const fn = 'frequencyGrid';
      const t = positiveSI(span, 'time', fn, 'span');
      const dt = positiveSI(cadence, 'time', fn, 'cadence');
      const n = maxCount === undefined ? Infinity : countArg(maxCount, fn, 'maxCount', 100_000);
      if (!(dt < t / 2)) throw new BuiltinError(`${where(fn, 'cadence')} must be shorter than half the span`);
      return hzList(guardedPhysics(fn, () => frequencyGridFromSpan(t, dt, n)));
    },
  },
  {
    name: 'logFrequencyGrid',
    category: 'spectrum',
    summary: 'count frequencies spaced evenly in log f from fMin to fMax.',
    args: [
      { name: 'fMin', unit: 'nHz', description: 'lowest frequency, > 0' },
      { name: 'fMax', unit: 'nHz', description: 'highest frequency, > fMin' },
      { name: 'count', unit: 'dimensionless', description: 'number of frequencies, 2 or more' },
    ],
    returns: { unit: 'nHz', description: 'list of frequencies' },
    source: 'common practice, no source',
    example: 'logFrequencyGrid(1 nHz, 100 nHz, 30)',
    fn: (fMin: unknown, fMax: unknown, count: unknown) => {
      const fn = 'logFrequencyGrid';
      const a = positiveSI(fMin, 'frequency', fn, 'fMin');
      const b = positiveSI(fMax, 'frequency', fn, 'fMax');
      if (!(b > a)) throw new BuiltinError(`${where(fn, 'fMax')} must exceed fMin`);
      const n = countArg(count, fn, 'count', 100_000);
      if (n < 2) throw new BuiltinError(`${where(fn, 'count')} must be at least 2`);
      return hzList(logFrequencyGrid(a, b, n));
    },
  },
  {
    name: 'strainSpectrum',
    category: 'spectrum',
    summary: 'Characteristic strain h_c(f) of a population of inspiralling binaries, h_c^2 = 4G/(pi c^2 f^2) Int n/(1+z) dE/dln f_r, with Omega_gw and residual power as extra series.',
    args: [
      { name: 'population', unit: 'population', description: 'from mergerPopulation, customPopulation or galaxyMergerPopulation' },
      { name: 'freqs', unit: 'nHz', description: 'observed GW frequencies (a list, e.g. from frequencyGrid)' },
      emissionArgDoc,
    ],
    returns: { unit: 'spectrum', description: 'h_c on the grid; series omegaGw (if the population has a cosmology), residualPsd (s^3) and equivalentResidual (s)' },
    source: `${PHINNEY}; circular kernel and ISCO cut c^3/(6^(3/2) pi G M)`,
    example: 'strainSpectrum(pop, freqs)',
    fn: (population: unknown, freqs: unknown, emission?: unknown) => {
      const fn = 'strainSpectrum';
      const p = populationArg(population, fn) as PopulationValue;
      const f = frequenciesArg(freqs, fn, 'freqs');
      const { options, label } = emissionOptions(emission, fn);
      const s = guardedPhysics(fn, () => backgroundSpectrum(p.population, f, options));
      const series: Record<string, SpectrumSeries> = {};
      if (p.cosmology) series.omegaGw = { unit: '', description: 'Omega_gw(f)', values: s.hc.map((h, i) => omegaGw(f[i], h, p.cosmology!.hubbleSI)) };
      series.residualPsd = { unit: 's^3', description: 'one-sided timing-residual PSD', values: s.hc.map((h, i) => residualPowerSpectralDensity(f[i], h)) };
      series.equivalentResidual = { unit: 's', description: 'h_c / (2 pi f)', values: s.hc.map((h, i) => equivalentResidual(f[i], h)) };
      return new SpectrumValue(s, series, { population: p.population, options, hubbleSI: p.cosmology?.hubbleSI, emission: label });
    },
  },
  {
    name: 'iscoFrequency',
    category: 'spectrum',
    summary: 'Rest-frame GW frequency at the innermost stable circular orbit, c^3 / (6^(3/2) pi G M), where a circular inspiral stops emitting in strainSpectrum.',
    args: [{ name: 'totalMass', unit: 'Msun', description: 'total mass > 0 (or a list)' }],
    returns: { unit: 'nHz', description: 'f_ISCO,gw in the rest frame (divide by 1+z for the observed frequency)' },
    source: 'Schwarzschild ISCO at r = 6GM/c^2 (Misner, Thorne & Wheeler 1973, Gravitation); GW frequency twice the orbital',
    example: 'iscoFrequency(1e10 Msun) gives about 440 nHz',
    fn: (totalMass: unknown) =>
      elementwise(totalMass, 'mass', 'iscoFrequency', 'totalMass', (m, arg) => {
        if (!(m > 0)) throw new BuiltinError(`${where('iscoFrequency', arg)} must be positive`);
        return quantity(iscoGwFrequencyHz(m), 'nHz');
      }),
  },
  {
    name: 'strainAt',
    category: 'spectrum',
    summary: "h_c at a frequency: computed exactly from the spectrum's population (or interpolated as a power law between grid points if it has none).",
    args: [
      { name: 'spectrum', unit: 'spectrum', description: 'from strainSpectrum' },
      { name: 'frequency', unit: 'nHz', description: 'observed GW frequency > 0 (or a list)' },
    ],
    returns: { unit: 'dimensionless', description: 'h_c' },
    source: `${PHINNEY}`,
    example: 'strainAt(spectrum, 10 nHz)',
    fn: (spectrum: unknown, frequency: unknown) => {
      const s = spectrumArg(spectrum, 'strainAt');
      return elementwise(frequency, 'frequency', 'strainAt', 'frequency', (f, arg) => {
        if (!(f > 0)) throw new BuiltinError(`${where('strainAt', arg)} must be positive`);
        return strainOfSpectrum(s, f, 'strainAt');
      });
    },
  },
  {
    name: 'amplitudeAtYear',
    category: 'spectrum',
    summary: 'A_yr = h_c(f_yr), f_yr = 1 / Julian year, of a spectrum or straight from a population.',
    args: [
      { name: 'source', unit: 'spectrum or population', description: 'a spectrum from strainSpectrum, or a population (circular, GW-driven)' },
      emissionArgDoc,
    ],
    returns: { unit: 'dimensionless', description: 'A_yr' },
    source: `${PHINNEY}, at f = 1/yr`,
    example: 'amplitudeAtYear(spectrum)',
    fn: (source: unknown, emission?: unknown) => {
      const fn = 'amplitudeAtYear';
      if (typeof source === 'object' && source !== null && (source as SheetObject).kind === 'population') {
        const p = populationArg(source, fn, 'source');
        const { options } = emissionOptions(emission, fn);
        return Math.sqrt(guardedPhysics(fn, () => characteristicStrainSquared(p.population, [F_YR_HZ], options))[0]);
      }
      if (emission !== undefined) throw new BuiltinError(`${where(fn, 'emission')} is only used with a population; a spectrum already has its emission`);
      const s = objectOf<SpectrumValue>(source, 'spectrum', fn, 'source');
      return strainOfSpectrum(s, F_YR_HZ, fn);
    },
  },
  {
    name: 'strainValues',
    category: 'spectrum',
    summary: 'The h_c values of a spectrum as a list (same order as its frequencies).',
    args: [{ name: 'spectrum', unit: 'spectrum', description: 'from strainSpectrum' }],
    returns: { unit: 'dimensionless', description: 'list of h_c' },
    source: `${PHINNEY}`,
    example: 'strainValues(spectrum)',
    fn: (spectrum: unknown) => math.matrix(Array.from(spectrumArg(spectrum, 'strainValues').hc)),
  },
  {
    name: 'spectrumFrequencies',
    category: 'spectrum',
    summary: 'The frequencies of a spectrum as a list.',
    args: [{ name: 'spectrum', unit: 'spectrum', description: 'from strainSpectrum' }],
    returns: { unit: 'nHz', description: 'list of frequencies' },
    source: 'common practice, no source',
    example: 'spectrumFrequencies(spectrum)',
    fn: (spectrum: unknown) => hzList(spectrumArg(spectrum, 'spectrumFrequencies').frequencyHz),
  },
  {
    name: 'omegaGwOfStrain',
    category: 'spectrum',
    summary: 'Energy density of the background per ln f over the critical density, Omega_gw = 2 pi^2 f^2 h_c^2 / (3 H0^2).',
    args: [
      { name: 'hc', unit: 'dimensionless', description: 'characteristic strain >= 0 (or a list matching frequency)' },
      { name: 'frequency', unit: 'nHz', description: 'frequency > 0 (or a list)' },
      { name: 'H0', unit: 'km/s/Mpc', description: 'Hubble constant > 0' },
    ],
    returns: { unit: 'dimensionless', description: 'Omega_gw' },
    source: `${PHINNEY}, with rho_c = 3 H0^2 / (8 pi G)`,
    example: 'omegaGwOfStrain(2e-15, 31.7 nHz, 70 km/s/Mpc)',
    fn: (hc: unknown, frequency: unknown, H0: unknown) => {
      const fn = 'omegaGwOfStrain';
      const h0 = positiveSI(H0, 'hubble', fn, 'H0');
      return pairwise(hc, frequency, fn, (h, f) => omegaGw(f, h, h0));
    },
  },
  {
    name: 'residualPsdOfStrain',
    category: 'spectrum',
    summary: 'One-sided timing-residual power spectral density P(f) = h_c^2 / (12 pi^2 f^3).',
    args: [
      { name: 'hc', unit: 'dimensionless', description: 'characteristic strain >= 0 (or a list matching frequency)' },
      { name: 'frequency', unit: 'nHz', description: 'frequency > 0 (or a list)' },
    ],
    returns: { unit: 's^3', description: 'P(f) in s^2/Hz' },
    source: 'Hazboun, Romano & Smith 2019, PRD 100, 104028 (one-sided: residual response 1/(12 pi^2 f^2) times S_h = h_c^2/f)',
    example: 'residualPsdOfStrain(2e-15, 31.7 nHz)',
    fn: (hc: unknown, frequency: unknown) => pairwise(hc, frequency, 'residualPsdOfStrain', (h, f) => quantity(residualPowerSpectralDensity(f, h), 's^3')),
  },
  {
    name: 'equivalentResidualOfStrain',
    category: 'spectrum',
    summary: 'Order of the timing residual a background causes, h_c / (2 pi f): a scale, not an rms (see rmsResidualOfStrain, sqrt(3) smaller at a bandwidth equal to f).',
    args: [
      { name: 'hc', unit: 'dimensionless', description: 'characteristic strain >= 0 (or a list matching frequency)' },
      { name: 'frequency', unit: 'nHz', description: 'frequency > 0 (or a list)' },
    ],
    returns: { unit: 'ns', description: 'residual' },
    source: 'common practice, no source',
    example: 'equivalentResidualOfStrain(2e-15, 31.7 nHz) gives about 10 ns',
    fn: (hc: unknown, frequency: unknown) => pairwise(hc, frequency, 'equivalentResidualOfStrain', (h, f) => quantity(equivalentResidual(f, h), 'ns')),
  },
  {
    name: 'rmsResidualOfStrain',
    category: 'spectrum',
    summary: 'rms timing residual of the background in a band of width bandwidth around f, sqrt(P(f) bandwidth) with P = h_c^2 / (12 pi^2 f^3); h_c / (2 sqrt(3) pi f) at bandwidth = f.',
    args: [
      { name: 'hc', unit: 'dimensionless', description: 'characteristic strain >= 0 (or a list matching frequency)' },
      { name: 'frequency', unit: 'nHz', description: 'frequency > 0 (or a list)' },
      { name: 'bandwidth', unit: 'nHz', description: 'width of the band > 0 (1/T for one bin of a span T; f for a band of one e-fold)' },
    ],
    returns: { unit: 'ns', description: 'rms residual' },
    source: 'follows from the one-sided residual PSD P = h_c^2 / (12 pi^2 f^3) (Jenet et al. 2006, ApJ 653, 1571)',
    example: 'rmsResidualOfStrain(2e-15, 31.7 nHz, 31.7 nHz) gives about 5.8 ns',
    fn: (hc: unknown, frequency: unknown, bandwidth: unknown) => {
      const fn = 'rmsResidualOfStrain';
      const df = positiveSI(bandwidth, 'frequency', fn, 'bandwidth');
      return pairwise(hc, frequency, fn, (h, f) => quantity(rmsResidualInBand(f, h, df), 'ns'));
    },
  },
  {
    name: 'spectralSlope',
    category: 'spectrum',
    summary: 'Local slope alpha = dln h_c / dln f at each frequency of a spectrum (-2/3 for circular GW-driven binaries below the ISCO cut).',
    args: [{ name: 'spectrum', unit: 'spectrum', description: 'from strainSpectrum (2 or more frequencies)' }],
    returns: { unit: 'dimensionless', description: 'list of local slopes' },
    source: `${PHINNEY} (alpha = -2/3); finite differences in ln f`,
    example: 'spectralSlope(spectrum)',
    fn: (spectrum: unknown) => {
      const s = spectrumArg(spectrum, 'spectralSlope');
      if (s.frequencyHz.length < 2) throw new BuiltinError(`${where('spectralSlope', 'spectrum')} needs 2 or more frequencies`);
      if (s.hc.some((h) => !(h > 0))) throw new BuiltinError(`${where('spectralSlope', 'spectrum')} has h_c = 0 at some frequency; its slope is undefined there`);
      return math.matrix(Array.from(localSpectralSlope(s.spectrum)));
    },
  },
  {
    name: 'gammaOfSlope',
    category: 'spectrum',
    summary: 'Residual-power slope gamma = 3 - 2 alpha for h_c proportional to f^alpha (13/3 for alpha = -2/3).',
    args: [{ name: 'alpha', unit: 'dimensionless', description: 'strain slope (or a list)' }],
    returns: { unit: 'dimensionless', description: 'gamma' },
    source: 'follows from P = h_c^2 / (12 pi^2 f^3) (Hazboun, Romano & Smith 2019, PRD 100, 104028)',
    example: 'gammaOfSlope(-2/3) gives 4.333',
    fn: (alpha: unknown) => elementwise(alpha, 'dimensionless', 'gammaOfSlope', 'alpha', (a) => gammaFromAlpha(a)),
  },
  {
    name: 'slopeOfGamma',
    category: 'spectrum',
    summary: 'Strain slope alpha = (3 - gamma) / 2 from the residual-power slope gamma.',
    args: [{ name: 'gammaValue', unit: 'dimensionless', description: 'residual-power slope (or a list)' }],
    returns: { unit: 'dimensionless', description: 'alpha' },
    source: 'follows from P = h_c^2 / (12 pi^2 f^3)',
    example: 'slopeOfGamma(13/3) gives -0.667',
    fn: (gammaValue: unknown) => elementwise(gammaValue, 'dimensionless', 'slopeOfGamma', 'gammaValue', (g) => alphaFromGamma(g)),
  },
  {
    name: 'redshiftOrigin',
    category: 'spectrum',
    summary: 'Where in redshift h_c^2 at one frequency comes from: dh_c^2/dz on an even grid, its median and the z ranges holding the central 50% and 90%.',
    args: [{ name: 'population', unit: 'population', description: 'any population' }, frequencyArgDoc, emissionArgDoc],
    returns: { unit: 'origin', description: 'grid, density, cumulative fraction, median, range50, range90 (see originRange)' },
    source: `${PHINNEY}, without the z integral`,
    example: 'redshiftOrigin(pop)',
    fn: (population: unknown, frequency?: unknown, emission?: unknown) => originOf('z', population, frequency, emission, 'redshiftOrigin'),
  },
  {
    name: 'chirpMassOrigin',
    category: 'spectrum',
    summary: 'Where in chirp mass h_c^2 at one frequency comes from: dh_c^2/dlog10 M_c, its median and the ranges holding the central 50% and 90%.',
    args: [{ name: 'population', unit: 'population', description: 'any population' }, frequencyArgDoc, emissionArgDoc],
    returns: { unit: 'origin', description: 'grid in log10(M_c/Msun), density, cumulative fraction, median, range50, range90' },
    source: `${PHINNEY}, with the mass integral taken at fixed chirp mass`,
    example: 'chirpMassOrigin(pop)',
    fn: (population: unknown, frequency?: unknown, emission?: unknown) => originOf('log10Mc', population, frequency, emission, 'chirpMassOrigin'),
  },
  {
    name: 'originRange',
    category: 'spectrum',
    summary: 'The central range [lo, hi] of redshift (or chirp mass) holding the given fraction of h_c^2, from redshiftOrigin or chirpMassOrigin.',
    args: [
      { name: 'origin', unit: 'origin', description: 'from redshiftOrigin or chirpMassOrigin' },
      { name: 'fraction', unit: 'dimensionless', description: 'fraction in (0, 1), e.g. 0.5 or 0.9' },
    ],
    returns: { unit: 'dimensionless or Msun', description: 'list [lo, hi]: redshifts, or chirp masses in Msun' },
    source: 'common practice, no source (central quantiles of the cumulative fraction)',
    example: 'originRange(redshiftOrigin(pop), 0.9)',
    fn: (origin: unknown, fraction: unknown) => {
      const fn = 'originRange';
      const o = objectOf<OriginValue>(origin, 'origin', fn, 'origin');
      const p = scalarSI(fraction, 'dimensionless', fn, 'fraction');
      if (!(p > 0 && p < 1)) throw new BuiltinError(`${where(fn, 'fraction')} must lie in (0, 1), got ${p}`);
      const lo = quantileOf(o.profile, (1 - p) / 2);
      const hi = quantileOf(o.profile, (1 + p) / 2);
      if (o.variable === 'z') return math.matrix([lo, hi]);
      return math.matrix([quantity(Math.pow(10, lo) * M_SUN_KG, 'Msun'), quantity(Math.pow(10, hi) * M_SUN_KG, 'Msun')] as never[]);
    },
  },
];

function quantileOf(p: OriginProfile, x: number): number {
  const c = p.cumulative;
  let i = 1;
  while (i < c.length - 1 && c[i] < x) i++;
  const t = c[i] > c[i - 1] ? (x - c[i - 1]) / (c[i] - c[i - 1]) : 0;
  return p.grid[i - 1] + t * (p.grid[i] - p.grid[i - 1]);
}

/** f(hc, frequency) for scalars, or element by element for lists of equal length. */
function pairwise(hc: unknown, frequency: unknown, fn: string, f: (h: number, fHz: number) => unknown): unknown {
  const hs = vectorSI(hc, 'dimensionless', fn, 'hc');
  const fs = vectorSI(frequency, 'frequency', fn, 'frequency');
  hs.forEach((h, i) => {
    if (!(h >= 0)) throw new BuiltinError(`${where(fn, isList(hc) ? `hc[${i + 1}]` : 'hc')} must not be negative, got ${h}`);
  });
  fs.forEach((x, i) => {
    if (!(x > 0)) throw new BuiltinError(`${where(fn, isList(frequency) ? `frequency[${i + 1}]` : 'frequency')} must be positive, got ${x} Hz`);
  });
  if (!isList(hc) && !isList(frequency)) return f(hs[0], fs[0]);
  const n = Math.max(hs.length, fs.length);
  if (hs.length !== n && hs.length !== 1) throw new BuiltinError(`${where(fn, 'hc')} has ${hs.length} values but frequency has ${fs.length}`);
  if (fs.length !== n && fs.length !== 1) throw new BuiltinError(`${where(fn, 'frequency')} has ${fs.length} values but hc has ${hs.length}`);
  const out: unknown[] = [];
  for (let i = 0; i < n; i++) out.push(f(hs[hs.length === 1 ? 0 : i], fs[fs.length === 1 ? 0 : i]));
  return math.matrix(out as never[]);
}
