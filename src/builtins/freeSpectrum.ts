// Sheet built-ins for measured free spectra and (A, gamma) posteriors: reading the stored samples,
// the free-spectrum likelihood of a model spectrum, its effective (A, gamma) and the comparison
// across the band (docs/freeSpectrum.md). Plain numeric work lives in src/statistics.
import type { Builtin } from '../sheet/builtin';
import { BuiltinError } from '../sheet/cellError';
import { isSheetObject } from '../sheet/sheetObject';
import { F_YR_HZ } from '../physics/constants';
import { arraySensitivity } from '../physics/arraySensitivity';
import type { PulsarArray } from '../physics/pulsarArray';
import { kindOf, objectOf, scalarSI, where } from './args';
import { FreeSpectrumError, validateFreeSpectrum, type FreeSpectrumPrior } from '../statistics/freeSpectrum';
import { decodeAmplitudeGamma, decodeFreeSpectrum, SampleEncodingError } from '../statistics/sampleEncoding';
import { gaussianAmplitudeGamma, sampledAmplitudeGamma } from '../statistics/amplitudeGammaPosterior';
import { DEFAULT_FIT_BINS, fitEffectivePowerLaw } from '../statistics/effectivePowerLaw';
import { compareAcrossBand } from '../statistics/bandComparison';
import { strainAtFrequency } from '../statistics/binnedComparison';
import { AmplitudeGammaObject, BandComparisonObject, EffectivePowerLawObject, FreeSpectrumObject } from './freeSpectrumObjects';

function guarded<T>(fn: string, body: () => T): T {
  try {
    return body();
  } catch (e) {
    if (e instanceof FreeSpectrumError || e instanceof SampleEncodingError || e instanceof RangeError) throw new BuiltinError(`${fn}: ${e.message}`);
    throw e;
  }
}

function textArg(v: unknown, fn: string, arg: string): string {
  if (typeof v !== 'string') throw new BuiltinError(`${where(fn, arg)} must be the encoded samples as text (made by \`strainsheet import\` or the app's Open data), got ${kindOf(v)}`);
  return v;
}

/** Frequencies and h_c of any spectrum-like sheet value (strainSpectrum, eccentricSpectrum, ...). */
function spectrumArg(v: unknown, fn: string, arg = 'spectrum'): { frequencyHz: Float64Array; hc: Float64Array } {
  const o = v as { frequencyHz?: unknown; hc?: unknown };
  if (!isSheetObject(v) || !(o.frequencyHz instanceof Float64Array) || !(o.hc instanceof Float64Array)) {
    throw new BuiltinError(`${where(fn, arg)} must be a spectrum (e.g. strainSpectrum(pop, freqs)), got ${kindOf(v)}`);
  }
  return { frequencyHz: o.frequencyHz, hc: o.hc };
}

function wholeNumber(v: unknown, fallback: number, lo: number, hi: number, fn: string, arg: string): number {
  if (v === undefined) return fallback;
  const x = scalarSI(v, 'dimensionless', fn, arg);
  if (!(Number.isInteger(x) && x >= lo && x <= hi)) throw new BuiltinError(`${where(fn, arg)} must be a whole number from ${lo} to ${hi}, got ${x}`);
  return x;
}

/** Relative difference below which a bin frequency counts as the model grid's end (published bin frequencies carry ~6 digits). */
const FREQUENCY_MATCH = 1e-5;

function modelAtBins(spec: { frequencyHz: Float64Array; hc: Float64Array }, f: Float64Array, fn: string): Float64Array {
  const lo = spec.frequencyHz[0];
  const hi = spec.frequencyHz[spec.frequencyHz.length - 1];
  const snap = (x: number) => (x < lo && x > lo * (1 - FREQUENCY_MATCH) ? lo : x > hi && x < hi * (1 + FREQUENCY_MATCH) ? hi : x);
  return guarded(fn, () => Float64Array.from(f, (x) => strainAtFrequency(spec.frequencyHz, spec.hc, snap(x))));
}

function noiseAtBins(v: unknown, f: Float64Array, fn: string): Float64Array | undefined {
  if (v === undefined) return undefined;
  const array = objectOf<{ kind: string; array: PulsarArray } & import('../sheet/sheetObject').SheetObject>(v, 'pulsarArray', fn, 'array').array;
  const s = arraySensitivity(array);
  return modelAtBins(s, f, fn);
}

function fsArg(v: unknown, fn: string): FreeSpectrumObject {
  return objectOf<FreeSpectrumObject>(v, 'freeSpectrum', fn, 'measured');
}
function agArg(v: unknown, fn: string): AmplitudeGammaObject | null {
  if (v === undefined) return null;
  return objectOf<AmplitudeGammaObject>(v, 'amplitudeGamma', fn, 'amplitudeGamma');
}

const FS_SOURCE = 'Moore & Vecchio 2021, Nat. Astron. 5, 1268; Lamb, Taylor & van Haasteren 2023, PRD 108, 103019';

export const freeSpectrumBuiltins: Builtin[] = [
  {
    name: 'measuredFreeSpectrum',
    category: 'statistics',
    summary: 'A measured free spectrum: per-bin posterior samples of log10 rho_k (s) or log10 h_c, with the prior to divide out',
    args: [
      { name: 'samples', unit: 'text', description: 'the encoded samples (fs1;...), written by `strainsheet import` or the app\'s Open data' },
      { name: 'priorLower', unit: 'dimensionless', description: 'lower end of the analysis prior, uniform in the sampled quantity (e.g. -10 for log10 rho)', optional: true },
      { name: 'priorUpper', unit: 'dimensionless', description: 'upper end of that prior (e.g. -4); without both, no prior is divided out', optional: true },
    ],
    returns: { unit: 'freeSpectrum', description: 'bins, samples and prior; a KDE per bin is built on first use' },
    source: `rho_k^2 = h_c^2/(12 pi^2 f^3 T); ${FS_SOURCE}`,
    example: 'measuredFreeSpectrum("fs1;quantity=log10rho;...", -10, -4)',
    fn: (samples: unknown, lo?: unknown, hi?: unknown) => {
      const fn = 'measuredFreeSpectrum';
      const text = textArg(samples, fn, 'samples');
      if ((lo === undefined) !== (hi === undefined)) throw new BuiltinError(`${fn}: give both priorLower and priorUpper, or neither`);
      const prior: FreeSpectrumPrior =
        lo === undefined ? { kind: 'none' } : { kind: 'uniform', lower: scalarSI(lo, 'dimensionless', fn, 'priorLower'), upper: scalarSI(hi, 'dimensionless', fn, 'priorUpper') };
      return guarded(fn, () => {
        const d = decodeFreeSpectrum(text);
        const data = validateFreeSpectrum({ quantity: d.quantity, frequencyHz: d.frequencyHz, spanS: d.spanS, samples: d.samples, prior });
        return new FreeSpectrumObject(data, d.thin);
      });
    },
  },
  {
    name: 'measuredAmplitudeGamma',
    category: 'statistics',
    summary: 'A measured (A, gamma) posterior from samples of (log10 A, gamma)',
    args: [{ name: 'samples', unit: 'text', description: 'the encoded samples (ag1;...), written by `strainsheet import` or the app\'s Open data' }],
    returns: { unit: 'amplitudeGamma', description: 'the samples and their reference frequency; a 2-D KDE is built on first use' },
    source: 'h_c = A (f/f_ref)^((3 - gamma)/2); HPD levels as Hyndman 1996, Am. Stat. 50, 120',
    fn: (samples: unknown) => {
      const fn = 'measuredAmplitudeGamma';
      return guarded(fn, () => {
        const d = decodeAmplitudeGamma(textArg(samples, fn, 'samples'));
        return new AmplitudeGammaObject(sampledAmplitudeGamma(d.log10A, d.gamma, d.fRefHz), d.thin);
      });
    },
  },
  {
    name: 'amplitudeGammaGaussian',
    category: 'statistics',
    summary: 'A measured (A, gamma) posterior as a 2-D Gaussian in (log10 A, gamma), for quick use',
    args: [
      { name: 'log10A', unit: 'dimensionless', description: 'mean of log10 A' },
      { name: 'gamma', unit: 'dimensionless', description: 'mean of gamma' },
      { name: 'sigmaLog10A', unit: 'dimensionless', description: 'standard deviation of log10 A (dex)' },
      { name: 'sigmaGamma', unit: 'dimensionless', description: 'standard deviation of gamma' },
      { name: 'correlation', unit: 'dimensionless', description: 'correlation coefficient, in (-1, 1)' },
      { name: 'fRef', unit: 'nHz', description: 'reference frequency of A (default 1/yr)', optional: true },
    ],
    returns: { unit: 'amplitudeGamma', description: 'the Gaussian posterior' },
    source: 'credible level 1 - exp(-d^2/2), chi-square with 2 degrees of freedom',
    example: 'amplitudeGammaGaussian(-14.55, 3.6, 0.12, 0.5, -0.8)',
    fn: (a: unknown, gm: unknown, sa: unknown, sg: unknown, r: unknown, fRef?: unknown) => {
      const fn = 'amplitudeGammaGaussian';
      const num = (v: unknown, n: string) => scalarSI(v, 'dimensionless', fn, n);
      const f = fRef === undefined ? F_YR_HZ : scalarSI(fRef, 'frequency', fn, 'fRef');
      return guarded(fn, () => new AmplitudeGammaObject(gaussianAmplitudeGamma(num(a, 'log10A'), num(gm, 'gamma'), num(sa, 'sigmaLog10A'), num(sg, 'sigmaGamma'), num(r, 'correlation'), f)));
    },
  },
  {
    name: 'freeSpectrumLogLikelihood',
    category: 'statistics',
    summary: 'ln L of a model spectrum given a measured free spectrum: sum over bins of ln KDE - ln prior at the model, floored at 20 below each bin\'s peak',
    args: [
      { name: 'spectrum', unit: 'spectrum', description: 'the model h_c(f); bins between its grid points are interpolated log-log' },
      { name: 'measured', unit: 'freeSpectrum', description: 'the measured free spectrum' },
      { name: 'bins', unit: 'dimensionless', description: 'use the lowest this many bins (default all)', optional: true },
    ],
    returns: { unit: 'dimensionless', description: 'the log-likelihood (natural log)' },
    source: FS_SOURCE,
    example: 'freeSpectrumLogLikelihood(spectrum, measured_free_spectrum)',
    fn: (spectrum: unknown, measured: unknown, bins?: unknown) => {
      const fn = 'freeSpectrumLogLikelihood';
      const fs = fsArg(measured, fn);
      const n = wholeNumber(bins, fs.data.frequencyHz.length, 1, fs.data.frequencyHz.length, fn, 'bins');
      const like = guarded(fn, () => fs.likelihood(n));
      return like.logLikelihood(modelAtBins(spectrumArg(spectrum, fn), like.frequencyHz, fn));
    },
  },
  {
    name: 'effectiveAmplitudeGamma',
    category: 'statistics',
    summary: "A model spectrum's effective (A, gamma): a power-law fit over the lowest bins, and where it falls in a measured (A, gamma)",
    args: [
      { name: 'spectrum', unit: 'spectrum', description: 'the model h_c(f)' },
      { name: 'measured', unit: 'freeSpectrum', description: 'the bins to fit at (their frequencies)' },
      { name: 'amplitudeGamma', unit: 'amplitudeGamma', description: 'the measured (A, gamma): its reference frequency and the credible level of the point', optional: true },
      { name: 'bins', unit: 'dimensionless', description: `how many of the lowest bins (default ${DEFAULT_FIT_BINS})`, optional: true },
      { name: 'array', unit: 'pulsarArray', description: "weights by the array's noise per bin (equal weights in log without it)", optional: true },
    ],
    returns: { unit: 'effectivePowerLaw', description: 'A, gamma, their covariance from the fit, and the credible level' },
    source: 'weighted least squares in log10 h_c vs log10 f (Press et al. 2007, Numerical Recipes, sec. 15.2)',
    example: 'effectiveAmplitudeGamma(spectrum, measured_free_spectrum, measured_A_gamma)',
    fn: (spectrum: unknown, measured: unknown, ag?: unknown, bins?: unknown, array?: unknown) => {
      const fn = 'effectiveAmplitudeGamma';
      const fs = fsArg(measured, fn);
      const post = agArg(ag, fn);
      const nb = fs.data.frequencyHz.length;
      const n = wholeNumber(bins, Math.min(DEFAULT_FIT_BINS, nb), 2, nb, fn, 'bins');
      const f = fs.data.frequencyHz.slice(0, n);
      const hc = modelAtBins(spectrumArg(spectrum, fn), f, fn);
      const fit = guarded(fn, () => fitEffectivePowerLaw(f, hc, post?.posterior.fRefHz ?? F_YR_HZ, n, noiseAtBins(array, f, fn)));
      return new EffectivePowerLawObject(fit, post ? guarded(fn, () => post.region.credibleLevel(fit.log10A, fit.gamma)) : null);
    },
  },
  {
    name: 'compareAcrossBand',
    category: 'statistics',
    summary: 'The model spectrum against a measured free spectrum (and (A, gamma)) over the whole band: verdict, disagreeing bins, ln L per bin, percentiles, effective (A, gamma)',
    args: [
      { name: 'spectrum', unit: 'spectrum', description: 'the model h_c(f)' },
      { name: 'measured', unit: 'freeSpectrum', description: 'the measured free spectrum' },
      { name: 'amplitudeGamma', unit: 'amplitudeGamma', description: 'the measured (A, gamma) posterior', optional: true },
      { name: 'array', unit: 'pulsarArray', description: "weights the (A, gamma) fit by the array's noise", optional: true },
      { name: 'fitBins', unit: 'dimensionless', description: `the lowest bins for the fit and the exclusion rule (default ${DEFAULT_FIT_BINS})`, optional: true },
    ],
    returns: { unit: 'bandComparison', description: 'consistent / in tension / inconsistent, with the bins or (A, gamma) region that disagree' },
    source: `${FS_SOURCE}; verdict thresholds in docs/freeSpectrum.md (ours)`,
    example: 'compareAcrossBand(spectrum, measured_free_spectrum, measured_A_gamma, pulsar_array)',
    fn: (spectrum: unknown, measured: unknown, ag?: unknown, array?: unknown, fitBins?: unknown) => {
      const fn = 'compareAcrossBand';
      const fs = fsArg(measured, fn);
      const post = agArg(ag, fn);
      const nb = fs.data.frequencyHz.length;
      const n = wholeNumber(fitBins, Math.min(DEFAULT_FIT_BINS, nb), 2, nb, fn, 'fitBins');
      const like = guarded(fn, () => fs.likelihood());
      const hc = modelAtBins(spectrumArg(spectrum, fn), like.frequencyHz, fn);
      const noise = noiseAtBins(array, like.frequencyHz.slice(0, n), fn);
      return new BandComparisonObject(guarded(fn, () => compareAcrossBand(hc, like, post ? post.region : null, n, noise)));
    },
  },
];
