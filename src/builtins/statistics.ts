// Sheet built-ins for measurements, comparisons, distributions and per-bin values. They check and
// convert arguments (units to SI) and hand plain numbers to src/statistics.
import type { Matrix, Unit } from 'mathjs';
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { math, isUnit } from '../sheet/mathInstance';
import { isSheetObject } from '../sheet/sheetObject';
import { F_YR_HZ } from '../physics/constants';
import { kindOf, objectOf, scalarSI, where } from './args';
import {
  GAMMA_CIRCULAR,
  MeasurementError,
  atReferenceFrequency,
  measurementFromInterval,
  measurementFromLog10,
  measurementFromSymmetric,
  measurementInterval,
  type AmplitudeMeasurement,
} from '../statistics/measurement';
import { compareAmplitude, probabilityInsideLogNormal } from '../statistics/comparison';
import { amplitudeAtNewReference, amplitudeForNewIndex, omegaGwFromStrain, powerLawStrain } from '../statistics/powerLaw';
import {
  DistributionError,
  lognormalDistribution,
  loguniformDistribution,
  normalDistribution,
  uniformDistribution,
  type UncertainDistribution,
} from '../statistics/distributions';
import { BinnedSpectrumError, binsFromCsv, binsFromRows, type BinQuantity } from '../statistics/binnedSpectrum';
import { AllowedRateObject, BinnedSpectrumObject, ComparisonObject, DistributionObject, MeasurementObject, type SlopeCheck } from './statisticsObjects';
import { fitEffectivePowerLaw } from '../statistics/effectivePowerLaw';

/** The f_yr comparison warns when the model's slope over its lowest SLOPE_CHECK_BINS frequencies departs from
 * the measurement's assumed gamma by more than this (our threshold; common practice, no source). */
const SLOPE_WARNING_LIMIT = 0.5;
const SLOPE_CHECK_BINS = 5;
import { ONE_SIGMA_LEVEL } from '../statistics/sampleSummary';
import { binTensions } from '../statistics/binnedComparison';
import type { SheetObject } from '../sheet/sheetObject';

const TWO_HALF_NORMALS =
  'two half-normals in log10 A joined at the median, each holding 1/2, so median and interval ends are reproduced (common practice, no source)';

/** Runs plain code, turning its argument errors into BuiltinErrors that name the function and argument. */
function guarded<T>(fn: string, body: () => T): T {
  try {
    return body();
  } catch (e) {
    if (e instanceof MeasurementError || e instanceof DistributionError) throw new BuiltinError(`${where(fn, e.argument)}: ${e.message}`);
    if (e instanceof BinnedSpectrumError || e instanceof RangeError) throw new BuiltinError(`${fn}: ${e.message}`);
    throw e;
  }
}

function optionalNumber(v: unknown, fallback: number, fn: string, arg: string): number {
  return v === undefined ? fallback : scalarSI(v, 'dimensionless', fn, arg);
}
function optionalFrequency(v: unknown, fallback: number, fn: string, arg: string): number {
  return v === undefined ? fallback : scalarSI(v, 'frequency', fn, arg);
}
function level(v: unknown, fn: string): number {
  if (v === undefined) throw new BuiltinError(`${where(fn, 'level')} is required: give the interval's credibility, e.g. 0.9 or 90%`);
  if (typeof v === 'string') {
    throw new BuiltinError(`${where(fn, 'level')} must be a number such as 0.68 or 68% (without quotes), got the text "${v}"`);
  }
  const x = scalarSI(v, 'dimensionless', fn, 'level');
  if (!(x > 0 && x < 1)) {
    throw new BuiltinError(`${where(fn, 'level')} must be a fraction in (0, 1), e.g. 0.9 or 90%, got ${x}${x > 1 && x < 100 ? ` (for a percentage write ${x}%)` : ''}`);
  }
  return x;
}
function amplitude(v: unknown, fn: string, arg: string): number {
  const x = scalarSI(v, 'dimensionless', fn, arg);
  if (!(x > 0)) throw new BuiltinError(`${where(fn, arg)} must be a positive amplitude, got ${x}`);
  return x;
}
function measurementArg(v: unknown, fn: string, arg: string): AmplitudeMeasurement {
  return objectOf<MeasurementObject>(v, 'measurement', fn, arg).measurement;
}

/** A distribution parameter in SI, remembering its unit; all parameters must share one dimension. */
function unitParams(fn: string, entries: Array<[string, unknown]>): { values: number[]; template: Unit | null } {
  let template: Unit | null = null;
  let templateArg = '';
  const values: number[] = [];
  for (const [arg, v] of entries) {
    if (isUnit(v)) {
      const u = v as Unit & { value: number | null };
      if (template && !u.equalBase(template)) {
        throw new BuiltinError(`${where(fn, arg)} has unit ${u.formatUnits()}, which does not match ${template.formatUnits()} of ${templateArg}`, 'unit');
      }
      if (!template) {
        template = u.clone();
        templateArg = arg;
      }
      if (u.value === null || !Number.isFinite(u.value)) throw new BuiltinError(`${where(fn, arg)} must be a finite quantity`);
      values.push(u.value);
    } else if (typeof v === 'number') {
      values.push(v);
    } else {
      throw new BuiltinError(`${where(fn, arg)} must be a number or a quantity, got ${kindOf(v)}`);
    }
  }
  if (template) {
    entries.forEach(([arg, v]) => {
      if (typeof v === 'number' && !(template as Unit).dimensions.every((d: number) => d === 0)) {
        throw new BuiltinError(`${where(fn, arg)} is a plain number but ${templateArg} has unit ${(template as Unit).formatUnits()}: give both in units`, 'unit');
      }
    });
  }
  return { values, template };
}

function distribution(fn: string, make: () => UncertainDistribution, template: Unit | null): DistributionObject {
  return new DistributionObject(guarded(fn, make), template);
}

function matrixRows(v: unknown, fn: string, arg: string): unknown[][] {
  let arr = math.isMatrix(v) ? ((v as Matrix).toArray() as unknown[]) : Array.isArray(v) ? v : null;
  // A single row [f, value, lower, upper] is a table of one bin.
  if (arr && arr.length === 4 && arr.every((r) => !Array.isArray(r))) arr = [arr];
  if (!arr || !arr.every((r) => Array.isArray(r))) {
    throw new BuiltinError(`${where(fn, arg)} must be a table with one row per bin, [frequency, value, lower, upper; ...], got ${kindOf(v)}`);
  }
  return arr as unknown[][];
}

const QUANTITIES: Record<string, BinQuantity> = { hc: 'hc', omega_gw: 'omegaGw', omegagw: 'omegaGw', power: 'residualPower', residualpower: 'residualPower' };

function binComparisonArgs(fn: string, spec: unknown, bins: unknown, h0?: unknown) {
  const sp = objectOf<SheetObject & { frequencyHz?: Float64Array; hc?: Float64Array }>(spec, 'spectrum', fn, 'spectrum');
  if (!(sp.frequencyHz instanceof Float64Array) || !(sp.hc instanceof Float64Array)) {
    throw new BuiltinError(`${where(fn, 'spectrum')} must be a spectrum with frequencies and h_c values`);
  }
  const b = objectOf<BinnedSpectrumObject>(bins, 'binnedSpectrum', fn, 'bins').bins;
  let H: number | undefined;
  if (h0 !== undefined) {
    H = scalarSI(h0, 'hubble', fn, 'H0');
    if (!(H > 0)) throw new BuiltinError(`${where(fn, 'H0')} must be positive`);
  }
  if (b.quantity === 'omegaGw' && H === undefined) throw new BuiltinError(`${where(fn, 'H0')} is needed to compare Omega_gw bins`);
  return guarded(fn, () => binTensions(sp.frequencyHz!, sp.hc!, b, H));
}

export const statisticsBuiltins: Builtin[] = [
  {
    name: 'measuredAmplitude',
    category: 'statistics',
    summary: 'A measured amplitude A at the reference frequency: median and interval at a stated credibility (a value conditional on the assumed gamma, not marginalised over it)',
    args: [
      { name: 'median', unit: 'dimensionless', description: 'median amplitude A' },
      { name: 'lower', unit: 'dimensionless', description: 'lower end of the interval' },
      { name: 'upper', unit: 'dimensionless', description: 'upper end of the interval' },
      { name: 'level', unit: 'fraction in (0,1)', description: 'credibility of the interval, e.g. 0.9 or 90% (required)' },
      { name: 'gamma', unit: 'dimensionless', description: 'spectral index of the residual power assumed (default 13/3)', optional: true },
      { name: 'fRef', unit: 'frequency', description: 'reference frequency of A (default 1/yr)', optional: true },
    ],
    returns: { unit: 'measurement', description: `the measurement, modelled as ${TWO_HALF_NORMALS}` },
    source: 'common practice, no source (interval to two half-normals in log10 A)',
    example: 'measuredAmplitude(3.0e-15, 2.2e-15, 4.1e-15, 90%) gives a measurement (invented values)',
    fn: (median: unknown, lower: unknown, upper: unknown, lev: unknown, gamma?: unknown, fRef?: unknown) => {
      const fn = 'measuredAmplitude';
      const args = [amplitude(median, fn, 'median'), amplitude(lower, fn, 'lower'), amplitude(upper, fn, 'upper'), level(lev, fn)] as const;
      const gm = optionalNumber(gamma, GAMMA_CIRCULAR, fn, 'gamma');
      const f = optionalFrequency(fRef, F_YR_HZ, fn, 'fRef');
      return new MeasurementObject(guarded(fn, () => measurementFromInterval(...args, gm, f)));
    },
  },
  {
    name: 'measuredAmplitudePlusMinus',
    category: 'statistics',
    summary: 'A measured amplitude given as median plus or minus a half-width (in A) at a stated credibility',
    args: [
      { name: 'median', unit: 'dimensionless', description: 'median amplitude A' },
      { name: 'halfWidth', unit: 'dimensionless', description: 'half-width of the symmetric interval, in A' },
      { name: 'level', unit: 'fraction in (0,1)', description: 'credibility of the interval (required)' },
      { name: 'gamma', unit: 'dimensionless', description: 'spectral index (default 13/3)', optional: true },
      { name: 'fRef', unit: 'frequency', description: 'reference frequency (default 1/yr)', optional: true },
    ],
    returns: { unit: 'measurement', description: 'the measurement; the interval is symmetric in A, so asymmetric in log10 A' },
    source: 'common practice, no source',
    example: 'measuredAmplitudePlusMinus(3e-15, 1e-15, 68%)',
    fn: (median: unknown, half: unknown, lev: unknown, gamma?: unknown, fRef?: unknown) => {
      const fn = 'measuredAmplitudePlusMinus';
      const m = amplitude(median, fn, 'median');
      const h = amplitude(half, fn, 'halfWidth');
      const l = level(lev, fn);
      return new MeasurementObject(
        guarded(fn, () => measurementFromSymmetric(m, h, l, optionalNumber(gamma, GAMMA_CIRCULAR, fn, 'gamma'), optionalFrequency(fRef, F_YR_HZ, fn, 'fRef'))),
      );
    },
  },
  {
    name: 'measuredLog10Amplitude',
    category: 'statistics',
    summary: 'A measured amplitude given as the mean and standard deviation of log10 A (a log-normal in A)',
    args: [
      { name: 'mean', unit: 'dimensionless', description: 'mean of log10 A, e.g. -14.6' },
      { name: 'sigma', unit: 'dex', description: 'standard deviation of log10 A' },
      { name: 'gamma', unit: 'dimensionless', description: 'spectral index (default 13/3)', optional: true },
      { name: 'fRef', unit: 'frequency', description: 'reference frequency (default 1/yr)', optional: true },
    ],
    returns: { unit: 'measurement', description: 'the measurement' },
    source: 'common practice, no source',
    example: 'measuredLog10Amplitude(-14.55, 0.12)',
    fn: (mean: unknown, sigma: unknown, gamma?: unknown, fRef?: unknown) => {
      const fn = 'measuredLog10Amplitude';
      const mu = scalarSI(mean, 'dimensionless', fn, 'mean');
      const s = scalarSI(sigma, 'dimensionless', fn, 'sigma');
      return new MeasurementObject(guarded(fn, () => measurementFromLog10(mu, s, optionalNumber(gamma, GAMMA_CIRCULAR, fn, 'gamma'), optionalFrequency(fRef, F_YR_HZ, fn, 'fRef'))));
    },
  },
  {
    name: 'amplitudeAtFrequency',
    category: 'statistics',
    summary: 'The amplitude of a power law quoted at another reference frequency (a number, or a measurement moved whole)',
    args: [
      { name: 'amplitude', unit: 'dimensionless or measurement', description: 'A at fRef, or a measurement' },
      { name: 'fNew', unit: 'frequency', description: 'the new reference frequency' },
      { name: 'gamma', unit: 'dimensionless', description: 'spectral index (default 13/3; a measurement uses its own)', optional: true },
      { name: 'fRef', unit: 'frequency', description: 'the old reference frequency (default 1/yr; a measurement uses its own)', optional: true },
    ],
    returns: { unit: 'dimensionless or measurement', description: 'A (f_new/f_ref)^((3-gamma)/2)' },
    source: 'Thrane & Romano 2013, PRD 88, 124032 (P ~ h_c^2 f^-3 ~ f^-gamma)',
    example: 'amplitudeAtFrequency(2e-15, 10 nHz) gives 2e-15 (10 nHz / (1/yr))^(-2/3)',
    fn: (a: unknown, fNew: unknown, gamma?: unknown, fRef?: unknown) => {
      const fn = 'amplitudeAtFrequency';
      const f = scalarSI(fNew, 'frequency', fn, 'fNew');
      if (!(f > 0)) throw new BuiltinError(`${where(fn, 'fNew')} must be positive, got ${f} Hz`);
      if (isSheetObject(a)) return new MeasurementObject(guarded(fn, () => atReferenceFrequency(measurementArg(a, fn, 'amplitude'), f)));
      const A = amplitude(a, fn, 'amplitude');
      const fr = optionalFrequency(fRef, F_YR_HZ, fn, 'fRef');
      return guarded(fn, () => amplitudeAtNewReference(A, optionalNumber(gamma, GAMMA_CIRCULAR, fn, 'gamma'), fr, f));
    },
  },
  {
    name: 'amplitudeForIndex',
    category: 'statistics',
    summary: 'Amplitude at fRef of a power law of another index that agrees with the given one at a pivot frequency',
    args: [
      { name: 'amplitude', unit: 'dimensionless', description: 'A at fRef for gammaOld' },
      { name: 'gammaOld', unit: 'dimensionless', description: 'index the amplitude was quoted for' },
      { name: 'gammaNew', unit: 'dimensionless', description: 'the new index' },
      { name: 'fPivot', unit: 'frequency', description: 'frequency where both power laws agree' },
      { name: 'fRef', unit: 'frequency', description: 'reference frequency (default 1/yr)', optional: true },
    ],
    returns: { unit: 'dimensionless', description: 'A (f_pivot/f_ref)^(alpha_old - alpha_new), alpha = (3 - gamma)/2' },
    source: 'common practice, no source (power-law pivot)',
    example: 'amplitudeForIndex(2e-15, 13/3, 3.2, 5 nHz)',
    fn: (a: unknown, gOld: unknown, gNew: unknown, fPivot: unknown, fRef?: unknown) => {
      const fn = 'amplitudeForIndex';
      const A = amplitude(a, fn, 'amplitude');
      const go = scalarSI(gOld, 'dimensionless', fn, 'gammaOld');
      const gn = scalarSI(gNew, 'dimensionless', fn, 'gammaNew');
      const fp = scalarSI(fPivot, 'frequency', fn, 'fPivot');
      const fr = optionalFrequency(fRef, F_YR_HZ, fn, 'fRef');
      return guarded(fn, () => amplitudeForNewIndex(A, go, gn, fr, fp));
    },
  },
  {
    name: 'omegaGwAt',
    category: 'statistics',
    summary: 'Omega_gw at a frequency of a power-law background (an amplitude, or a measurement\'s median)',
    args: [
      { name: 'amplitude', unit: 'dimensionless or measurement', description: 'A at the reference frequency, or a measurement' },
      { name: 'f', unit: 'frequency', description: 'where to evaluate Omega_gw' },
      { name: 'H0', unit: 'km/s/Mpc', description: 'Hubble constant' },
      { name: 'gamma', unit: 'dimensionless', description: 'spectral index (default 13/3; a measurement uses its own)', optional: true },
    ],
    returns: { unit: 'dimensionless', description: '2 pi^2 f^2 h_c(f)^2 / (3 H0^2)' },
    source: 'Phinney 2001, astro-ph/0108028; Thrane & Romano 2013, PRD 88, 124032',
    example: 'omegaGwAt(2e-15, 1/yr, 70 km/s/Mpc)',
    fn: (a: unknown, f: unknown, h0: unknown, gamma?: unknown) => {
      const fn = 'omegaGwAt';
      const fHz = scalarSI(f, 'frequency', fn, 'f');
      if (!(fHz > 0)) throw new BuiltinError(`${where(fn, 'f')} must be positive, got ${fHz} Hz`);
      const H = scalarSI(h0, 'hubble', fn, 'H0');
      if (!(H > 0)) throw new BuiltinError(`${where(fn, 'H0')} must be positive`);
      let A: number;
      let gm: number;
      let fr: number;
      if (isSheetObject(a)) {
        const m = measurementArg(a, fn, 'amplitude');
        A = Math.pow(10, m.log10Median);
        gm = m.gamma;
        fr = m.fRefHz;
      } else {
        A = amplitude(a, fn, 'amplitude');
        gm = optionalNumber(gamma, GAMMA_CIRCULAR, fn, 'gamma');
        fr = F_YR_HZ;
      }
      return guarded(fn, () => omegaGwFromStrain(powerLawStrain(A, gm, fr, fHz), fHz, H));
    },
  },
  {
    name: 'compareToMeasured',
    category: 'statistics',
    summary: 'Compares a predicted A_yr with a measurement: ratio, tension, likelihood, inside the interval',
    args: [
      { name: 'predicted', unit: 'dimensionless', description: 'predicted A_yr = h_c(1/yr)' },
      { name: 'measured', unit: 'measurement', description: 'the measurement' },
      {
        name: 'spectrum',
        unit: 'spectrum',
        description: `the model spectrum: warns when its slope over the lowest ${SLOPE_CHECK_BINS} frequencies departs from the measurement's gamma by more than ${SLOPE_WARNING_LIMIT}`,
        optional: true,
      },
    ],
    returns: { unit: 'comparison', description: 'ratio, tension in sigma of log10 A (side-dependent), likelihood per dex, percentile, inside (and the slope warning)' },
    source: 'common practice, no source',
    example: 'compareToMeasured(A_yr, measured, spectrum)',
    fn: (p: unknown, m: unknown, spectrum?: unknown) => {
      const fn = 'compareToMeasured';
      const A = amplitude(p, fn, 'predicted');
      const meas = measurementArg(m, fn, 'measured');
      let check: SlopeCheck | null = null;
      if (spectrum !== undefined) {
        const o = spectrum as { frequencyHz?: unknown; hc?: unknown };
        if (!isSheetObject(spectrum) || !(o.frequencyHz instanceof Float64Array) || !(o.hc instanceof Float64Array)) {
          throw new BuiltinError(`${where(fn, 'spectrum')} must be a spectrum, got ${kindOf(spectrum)}`);
        }
        const n = Math.min(SLOPE_CHECK_BINS, o.frequencyHz.length);
        const fit = guarded(fn, () => fitEffectivePowerLaw(o.frequencyHz as Float64Array, o.hc as Float64Array, F_YR_HZ, n));
        check = { modelGamma: fit.gamma, assumedGamma: meas.gamma, bins: n, limit: SLOPE_WARNING_LIMIT, warn: Math.abs(fit.gamma - meas.gamma) > SLOPE_WARNING_LIMIT };
      }
      return new ComparisonObject(guarded(fn, () => compareAmplitude(A, meas)), check);
    },
  },
  {
    name: 'tensionSigma',
    category: 'statistics',
    summary: 'Signed tension of a predicted A_yr with a measurement, in sigma of log10 A (positive: prediction high)',
    args: [
      { name: 'predicted', unit: 'dimensionless', description: 'predicted A_yr' },
      { name: 'measured', unit: 'measurement', description: 'the measurement' },
    ],
    returns: { unit: 'dimensionless', description: '(log10 A_pred - log10 A_med) / sigma of that side' },
    source: 'common practice, no source',
    example: 'tensionSigma(A_yr, measured)',
    fn: (p: unknown, m: unknown) => {
      const fn = 'tensionSigma';
      return guarded(fn, () => compareAmplitude(amplitude(p, fn, 'predicted'), measurementArg(m, fn, 'measured')).tensionSigma);
    },
  },
  {
    name: 'amplitudeRatio',
    category: 'statistics',
    summary: 'Predicted A_yr divided by the measured median at 1/yr',
    args: [
      { name: 'predicted', unit: 'dimensionless', description: 'predicted A_yr' },
      { name: 'measured', unit: 'measurement', description: 'the measurement' },
    ],
    returns: { unit: 'dimensionless', description: 'A_pred / A_med' },
    source: 'common practice, no source',
    fn: (p: unknown, m: unknown) => {
      const fn = 'amplitudeRatio';
      return guarded(fn, () => compareAmplitude(amplitude(p, fn, 'predicted'), measurementArg(m, fn, 'measured')).ratio);
    },
  },
  {
    name: 'measuredLikelihood',
    category: 'statistics',
    summary: 'Likelihood of a predicted A_yr under the measurement, relative to its peak (1 at the median)',
    args: [
      { name: 'predicted', unit: 'dimensionless', description: 'predicted A_yr' },
      { name: 'measured', unit: 'measurement', description: 'the measurement' },
    ],
    returns: { unit: 'dimensionless', description: 'exp(-t^2/2), t the tension in sigma' },
    source: 'common practice, no source',
    fn: (p: unknown, m: unknown) => {
      const fn = 'measuredLikelihood';
      return guarded(fn, () => compareAmplitude(amplitude(p, fn, 'predicted'), measurementArg(m, fn, 'measured')).relativeLikelihood);
    },
  },
  {
    name: 'insideProbability',
    category: 'statistics',
    summary: "Probability that an uncertain (log-normal) prediction lies inside the measurement's interval",
    args: [
      { name: 'predicted', unit: 'dimensionless', description: 'median predicted A_yr' },
      { name: 'sigmaDex', unit: 'dex', description: 'width of the prediction in log10 A (0 for a sure prediction: gives 0 or 1)' },
      { name: 'measured', unit: 'measurement', description: 'the measurement (its stated interval, or 68.27% if none)' },
    ],
    returns: { unit: 'dimensionless', description: 'Phi((log hi - mu)/s) - Phi((log lo - mu)/s)' },
    source: 'common practice, no source',
    fn: (p: unknown, s: unknown, m: unknown) => {
      const fn = 'insideProbability';
      const A = amplitude(p, fn, 'predicted');
      const sd = scalarSI(s, 'dimensionless', fn, 'sigmaDex');
      if (sd < 0) throw new BuiltinError(`${where(fn, 'sigmaDex')} must not be negative, got ${sd}`);
      let meas = measurementArg(m, fn, 'measured');
      if (meas.fRefHz !== F_YR_HZ) meas = atReferenceFrequency(meas, F_YR_HZ);
      const iv = meas.stated ?? measurementInterval(meas, ONE_SIGMA_LEVEL);
      if (sd === 0) return A >= iv.lower && A <= iv.upper ? 1 : 0;
      return probabilityInsideLogNormal(A, sd, iv.lower, iv.upper);
    },
  },
  {
    name: 'allowedRate',
    category: 'statistics',
    summary: 'The merger-rate normalisation (or any quantity A_yr^2 is proportional to) that a measurement allows, and the local density it implies',
    args: [
      { name: 'rateNorm', unit: 'any (e.g. Mpc^-3 Gyr^-1)', description: 'the normalisation the prediction was made with' },
      { name: 'predicted', unit: 'dimensionless', description: 'predicted A_yr at that normalisation' },
      { name: 'measured', unit: 'measurement', description: 'the measurement' },
      { name: 'density', unit: 'any', description: 'a quantity proportional to rateNorm at the same point, e.g. the local merger-rate density; scaled the same way', optional: true },
    ],
    returns: {
      unit: 'allowedRate',
      description: 'rateNorm (A_meas/A_pred)^2 at the median and interval ends. Assumes A_yr^2 proportional to rateNorm (true when the population density scales with it); the sheet-level solver checks this with two probes',
    },
    source: 'Phinney 2001, astro-ph/0108028 (h_c^2 linear in the number density)',
    example: 'allowedRate(rate_norm, A_yr, measured, rate_today)',
    fn: (r: unknown, p: unknown, m: unknown, density?: unknown) => {
      const fn = 'allowedRate';
      let r0: number;
      let template: Unit | null = null;
      let display = '';
      if (isUnit(r)) {
        const u = r as Unit & { value: number | null };
        if (u.value === null) throw new BuiltinError(`${where(fn, 'rateNorm')} is a unit without a value`);
        r0 = u.value;
        template = u.clone();
        display = u.formatUnits();
      } else r0 = scalarSI(r, 'dimensionless', fn, 'rateNorm');
      if (!(r0 > 0 && Number.isFinite(r0))) throw new BuiltinError(`${where(fn, 'rateNorm')} must be positive, got ${r0}`);
      const A = amplitude(p, fn, 'predicted');
      let meas = measurementArg(m, fn, 'measured');
      if (meas.fRefHz !== F_YR_HZ) meas = atReferenceFrequency(meas, F_YR_HZ);
      const lev = meas.stated ? meas.stated.level : ONE_SIGMA_LEVEL;
      const iv = meas.stated ?? measurementInterval(meas, lev);
      const scale = (a: number) => r0 * (a / A) ** 2;
      const out = new AllowedRateObject(scale(10 ** meas.log10Median), scale(iv.lower), scale(iv.upper), lev, template, display);
      if (density === undefined) return out;
      let d0: number;
      let dTemplate: Unit | null = null;
      if (isUnit(density)) {
        const u = density as Unit & { value: number | null };
        if (u.value === null) throw new BuiltinError(`${where(fn, 'density')} is a unit without a value`);
        d0 = u.value;
        dTemplate = u.clone();
      } else d0 = scalarSI(density, 'dimensionless', fn, 'density');
      if (!(Number.isFinite(d0) && d0 > 0)) throw new BuiltinError(`${where(fn, 'density')} must be positive, got ${d0}`);
      const k = d0 / r0;
      out.density = { median: k * out.median, lower: k * out.lower, upper: k * out.upper, unitTemplate: dTemplate };
      return out;
    },
  },
  {
    name: 'partOf',
    category: 'statistics',
    summary: 'One number out of a statistics result: e.g. partOf(cmp, "tensionSigma"), partOf(allowed, "median")',
    args: [
      { name: 'result', unit: 'measurement, comparison or allowedRate', description: 'a statistics result' },
      { name: 'part', unit: 'text', description: 'measurement: median, lower, upper, level, gamma; comparison: ratio, tensionSigma, likelihood, relativeLikelihood, percentile, inside; allowedRate: median, lower, upper, level' },
    ],
    returns: { unit: 'number (allowedRate parts keep the rate unit)', description: 'the part asked for' },
    source: 'common practice, no source',
    fn: (obj: unknown, part: unknown) => {
      const fn = 'partOf';
      if (typeof part !== 'string') throw new BuiltinError(`${where(fn, 'part')} must be text in quotes, e.g. "median", got ${kindOf(part)}`);
      if (obj instanceof MeasurementObject) {
        const m = obj.measurement;
        const parts: Record<string, number | undefined> = {
          median: obj.median,
          lower: m.stated?.lower ?? measurementInterval(m, ONE_SIGMA_LEVEL).lower,
          upper: m.stated?.upper ?? measurementInterval(m, ONE_SIGMA_LEVEL).upper,
          level: m.stated?.level ?? ONE_SIGMA_LEVEL,
          gamma: m.gamma,
          log10Median: m.log10Median,
        };
        if (part in parts) return parts[part];
        throw new BuiltinError(`${where(fn, 'part')}: a measurement has no part "${part}"; parts: ${Object.keys(parts).join(', ')}`);
      }
      if (obj instanceof ComparisonObject) {
        const c = obj.comparison as unknown as Record<string, number | boolean>;
        const names = ['ratio', 'tensionSigma', 'likelihood', 'relativeLikelihood', 'percentile', 'inside', 'level', 'measuredMedian', 'predicted'];
        if (names.includes(part)) return typeof c[part] === 'boolean' ? (c[part] ? 1 : 0) : c[part];
        throw new BuiltinError(`${where(fn, 'part')}: a comparison has no part "${part}"; parts: ${names.join(', ')}`);
      }
      if (obj instanceof AllowedRateObject) {
        const parts: Record<string, number> = { median: obj.median, lower: obj.lower, upper: obj.upper };
        if (part === 'level') return obj.level;
        if (part in parts) return obj.valueOf(parts[part]);
        const d = obj.density;
        const dParts: Record<string, number> | null = d ? { densityMedian: d.median, densityLower: d.lower, densityUpper: d.upper } : null;
        if (dParts && part in dParts) return obj.densityValueOf(dParts[part]);
        throw new BuiltinError(
          `${where(fn, 'part')}: an allowed rate has no part "${part}"; parts: median, lower, upper, level${dParts ? ', densityMedian, densityLower, densityUpper' : ''}`,
        );
      }
      throw new BuiltinError(`${where(fn, 'result')} must be a measurement, comparison or allowedRate, got ${kindOf(obj)}`);
    },
  },
  {
    name: 'normalDist',
    category: 'statistics',
    summary: 'Normal distribution for an uncertain input (parameters may carry a unit)',
    args: [
      { name: 'mean', unit: 'any', description: 'mean' },
      { name: 'sd', unit: 'same as mean', description: 'standard deviation (> 0)' },
    ],
    returns: { unit: 'distribution', description: 'use in a cell\'s uncertainty field' },
    source: 'common practice, no source',
    example: 'normalDist(0.7, 0.05)',
    fn: (mean: unknown, sd: unknown) => {
      const fn = 'normalDist';
      const { values, template } = unitParams(fn, [['mean', mean], ['sd', sd]]);
      return distribution(fn, () => normalDistribution(values[0], values[1]), template);
    },
  },
  {
    name: 'lognormalDist',
    category: 'statistics',
    summary: 'Log-normal distribution given by its median and the spread of log10 in dex',
    args: [
      { name: 'median', unit: 'any', description: 'median (> 0)' },
      { name: 'sigmaDex', unit: 'dex', description: 'standard deviation of log10 of the value (> 0)' },
    ],
    returns: { unit: 'distribution', description: 'log10 x ~ Normal(log10 median, sigmaDex)' },
    source: 'common practice, no source',
    example: 'lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)',
    fn: (median: unknown, sigma: unknown) => {
      const fn = 'lognormalDist';
      const { values, template } = unitParams(fn, [['median', median]]);
      const s = scalarSI(sigma, 'dimensionless', fn, 'sigmaDex');
      return distribution(fn, () => lognormalDistribution(values[0], s), template);
    },
  },
  {
    name: 'uniformDist',
    category: 'statistics',
    summary: 'Uniform distribution between lo and hi (parameters may carry a unit)',
    args: [
      { name: 'lo', unit: 'any', description: 'lower end' },
      { name: 'hi', unit: 'same as lo', description: 'upper end (> lo)' },
    ],
    returns: { unit: 'distribution', description: 'uniform on [lo, hi]' },
    source: 'common practice, no source',
    example: 'uniformDist(0.5, 1.5)',
    fn: (lo: unknown, hi: unknown) => {
      const fn = 'uniformDist';
      const { values, template } = unitParams(fn, [['lo', lo], ['hi', hi]]);
      return distribution(fn, () => uniformDistribution(values[0], values[1]), template);
    },
  },
  {
    name: 'logUniformDist',
    category: 'statistics',
    summary: 'Log-uniform distribution between lo and hi (uniform in log of the value)',
    args: [
      { name: 'lo', unit: 'any', description: 'lower end (> 0)' },
      { name: 'hi', unit: 'same as lo', description: 'upper end (> lo)' },
    ],
    returns: { unit: 'distribution', description: 'log-uniform on [lo, hi]' },
    source: 'common practice, no source',
    example: 'logUniformDist(1e-4 Mpc^-3 Gyr^-1, 1e-2 Mpc^-3 Gyr^-1)',
    fn: (lo: unknown, hi: unknown) => {
      const fn = 'logUniformDist';
      const { values, template } = unitParams(fn, [['lo', lo], ['hi', hi]]);
      return distribution(fn, () => loguniformDistribution(values[0], values[1]), template);
    },
  },
  {
    name: 'binsFromText',
    category: 'statistics',
    summary: 'Measured per-bin values (h_c, Omega_gw or residual power with intervals) from CSV text',
    args: [
      { name: 'csv', unit: 'text', description: 'header f_Hz|f_nHz|f_per_yr, hc|omega_gw|power_s3, lo, hi; then one row per bin; # comments' },
      { name: 'level', unit: 'fraction in (0,1)', description: 'credibility of the per-bin intervals (required)' },
    ],
    returns: { unit: 'binnedSpectrum', description: 'the bins, validated' },
    source: 'common practice, no source',
    example: 'binsFromText("f_nHz,hc,lo,hi\\n2.2,8e-15,5e-15,1.2e-14", 90%)',
    fn: (csv: unknown, lev: unknown) => {
      const fn = 'binsFromText';
      if (typeof csv !== 'string') throw new BuiltinError(`${where(fn, 'csv')} must be text in quotes, got ${kindOf(csv)}`);
      const l = level(lev, fn);
      return new BinnedSpectrumObject(guarded(fn, () => binsFromCsv(csv, l)));
    },
  },
  {
    name: 'binsFromTable',
    category: 'statistics',
    summary: 'Measured per-bin values from a table [f, value, lower, upper; ...] with f in frequency units',
    args: [
      { name: 'rows', unit: 'table', description: 'one row per bin: frequency (with unit), value, lower end, upper end' },
      { name: 'quantity', unit: 'text', description: '"hc", "omega_gw" or "power" (residual power, s^3)' },
      { name: 'level', unit: 'fraction in (0,1)', description: 'credibility of the per-bin intervals (required)' },
    ],
    returns: { unit: 'binnedSpectrum', description: 'the bins, validated' },
    source: 'common practice, no source',
    example: 'binsFromTable([2.2 nHz, 8e-15, 5e-15, 1.2e-14; 4.5 nHz, 5e-15, 3e-15, 7e-15], "hc", 90%)',
    fn: (rows: unknown, quantity: unknown, lev: unknown) => {
      const fn = 'binsFromTable';
      const table = matrixRows(rows, fn, 'rows');
      if (typeof quantity !== 'string' || !(quantity.toLowerCase() in QUANTITIES)) {
        throw new BuiltinError(`${where(fn, 'quantity')} must be "hc", "omega_gw" or "power", got ${typeof quantity === 'string' ? `"${quantity}"` : kindOf(quantity)}`);
      }
      const q = QUANTITIES[quantity.toLowerCase()];
      const l = level(lev, fn);
      const numeric = table.map((r, i) => {
        if (r.length !== 4) throw new BuiltinError(`${where(fn, 'rows')}: row ${i + 1} has ${r.length} entries; need frequency, value, lower, upper`);
        return [
          scalarSI(r[0], 'frequency', fn, `rows[${i + 1}] frequency`),
          ...[1, 2, 3].map((j) => {
            const v = r[j];
            if (q === 'residualPower' && isUnit(v)) {
              const u = v as Unit;
              if (!u.equalBase(math.unit('s^3'))) throw new BuiltinError(`${where(fn, `rows[${i + 1}]`)}: residual power needs a unit of s^3 (s^2/Hz), got ${u.formatUnits()}`, 'unit');
              return (u as Unit & { value: number }).value;
            }
            return scalarSI(v, 'dimensionless', fn, `rows[${i + 1}][${j + 1}]`);
          }),
        ];
      });
      return new BinnedSpectrumObject(guarded(fn, () => binsFromRows(numeric, q, l)));
    },
  },
  {
    name: 'binTension',
    category: 'statistics',
    summary: 'Tension of a model spectrum with measured per-bin values, bin by bin, in sigma of log10 (positive: model high)',
    args: [
      { name: 'spectrum', unit: 'spectrum', description: 'the model, from strainSpectrum' },
      { name: 'bins', unit: 'binnedSpectrum', description: 'from binsFromText or binsFromTable' },
      { name: 'H0', unit: 'km/s/Mpc', description: 'Hubble constant, needed for Omega_gw bins', optional: true },
    ],
    returns: { unit: 'dimensionless list', description: 'one tension per bin; the model h_c is interpolated log-log at the bin frequencies' },
    source: 'common practice, no source (each bin as two half-normals in log10, as for measuredAmplitude)',
    example: 'binTension(spectrum, bins)',
    fn: (spec: unknown, bins: unknown, h0?: unknown) => {
      const fn = 'binTension';
      const r = binComparisonArgs(fn, spec, bins, h0);
      return math.matrix(Array.from(r.tension));
    },
  },
  {
    name: 'binChiSquare',
    category: 'statistics',
    summary: 'Sum over bins of the squared tensions of a model spectrum with measured per-bin values',
    args: [
      { name: 'spectrum', unit: 'spectrum', description: 'the model, from strainSpectrum' },
      { name: 'bins', unit: 'binnedSpectrum', description: 'from binsFromText or binsFromTable' },
      { name: 'H0', unit: 'km/s/Mpc', description: 'Hubble constant, needed for Omega_gw bins', optional: true },
    ],
    returns: { unit: 'dimensionless', description: 'sum of squared per-bin tensions (compare with the number of bins)' },
    source: 'common practice, no source',
    example: 'binChiSquare(spectrum, bins)',
    fn: (spec: unknown, bins: unknown, h0?: unknown) => binComparisonArgs('binChiSquare', spec, bins, h0).chiSquare,
  },
  {
    name: 'distQuantile',
    category: 'statistics',
    summary: 'A quantile of a distribution (e.g. its median at p = 0.5)',
    args: [
      { name: 'distribution', unit: 'distribution', description: 'a distribution' },
      { name: 'p', unit: 'fraction in (0,1)', description: 'cumulative probability' },
    ],
    returns: { unit: "the distribution's unit", description: 'x with P(X <= x) = p' },
    source: 'common practice, no source',
    fn: (d: unknown, p: unknown) => {
      const fn = 'distQuantile';
      const dist = objectOf<DistributionObject>(d, 'distribution', fn, 'distribution');
      const pp = scalarSI(p, 'dimensionless', fn, 'p');
      if (!(pp > 0 && pp < 1)) throw new BuiltinError(`${where(fn, 'p')} must lie in (0, 1), got ${pp}`);
      return dist.valueOf(dist.distribution.quantile(pp));
    },
  },
];

