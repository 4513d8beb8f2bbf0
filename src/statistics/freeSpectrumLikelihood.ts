// Factorised likelihood of a model spectrum given a free spectrum (Moore & Vecchio 2021, Nature
// Astronomy 5, 1268; Lamb, Taylor & van Haasteren 2023, PRD 108, 103019):
//   ln L(theta) = sum_k [ ln p_k(x_k(theta)) - ln pi_k(x_k(theta)) ],
// p_k the KDE of bin k's posterior samples, pi_k the analysis's prior on that quantity, and
// x_k = log10 rho_k or log10 h_c of the model at f_k. Each bin's KDE is tabulated once (set-up);
// a call costs one log10 and one table lookup per bin.
//
// Stated choices (docs/freeSpectrum.md):
// - Floor: a bin contributes at least its peak value minus LOG_LIKELIHOOD_FLOOR_BELOW_PEAK (20 in
//   natural log, as a Gaussian 6.3 sigma off), also outside the table: never -Infinity.
// - A model outside a uniform prior's range is evaluated at the nearest edge: the analysis sampled
//   nothing beyond it, and below the lower edge the data cannot tell the powers apart.
import { type FreeSpectrumData, quantityOffset, validateFreeSpectrum } from './freeSpectrum';
import { type BandwidthRule, type KdeTable, tableCdf, tabulateKde } from './gaussianKde1d';
import { NO_TIME_CHECK, type TimeCheck } from '../physics/timeCheck';

export const LOG_LIKELIHOOD_FLOOR_BELOW_PEAK = 20;

export interface FreeSpectrumLikelihoodOptions {
  /** Use only the lowest `bins` bins (default: all). */
  bins?: number;
  rule?: BandwidthRule;
  /** Called once per bin while the KDE tables are built (TimeCheck); default: nothing. */
  checkTime?: TimeCheck;
}

export interface FreeSpectrumLikelihood {
  readonly bins: number;
  readonly frequencyHz: Float64Array;
  /** The per-bin KDE tables (of the posterior, prior not divided). */
  readonly tables: KdeTable[];
  /** Per-bin floor of the log-likelihood contribution. */
  readonly floor: Float64Array;
  /** Per-bin largest contribution (the model at the posterior's peak). */
  readonly peak: Float64Array;
  /** Sum of the log-likelihood contributions for h_c at the bin frequencies (length >= bins). */
  logLikelihood(hcAtBins: ArrayLike<number>): number;
  /** Each bin's contribution, written into `out` when given. */
  binLogLikelihoods(hcAtBins: ArrayLike<number>, out?: Float64Array): Float64Array;
  /** Each bin's percentile of the model within the bin's posterior (KDE cdf, 0..1). */
  percentiles(hcAtBins: ArrayLike<number>, out?: Float64Array): Float64Array;
  /** The model's value of the data's quantity at each bin (log10 rho or log10 h_c). */
  modelQuantity(hcAtBins: ArrayLike<number>, out?: Float64Array): Float64Array;
}

export function buildFreeSpectrumLikelihood(data: FreeSpectrumData, opts: FreeSpectrumLikelihoodOptions = {}): FreeSpectrumLikelihood {
  validateFreeSpectrum(data);
  const nAll = data.frequencyHz.length;
  const nb = opts.bins ?? nAll;
  if (!(Number.isInteger(nb) && nb >= 1 && nb <= nAll)) throw new RangeError(`bins must be a whole number from 1 to ${nAll}, got ${nb}`);
  const prior = data.prior;
  const lower = prior.kind === 'uniform' ? prior.lower : -Infinity;
  const upper = prior.kind === 'uniform' ? prior.upper : Infinity;
  // Uniform prior density 1/(upper - lower): dividing it out adds ln(upper - lower) inside the range.
  const lnPriorInv = prior.kind === 'uniform' ? Math.log(upper - lower) : 0;
  const tables: KdeTable[] = [];
  const offset = new Float64Array(nb);
  const floor = new Float64Array(nb);
  const peak = new Float64Array(nb);
  const x0 = new Float64Array(nb);
  const invDx = new Float64Array(nb);
  const last = new Float64Array(nb);
  const start = new Int32Array(nb);
  let total = 0;
  const checkTime = opts.checkTime ?? NO_TIME_CHECK;
  for (let k = 0; k < nb; k++) {
    checkTime();
    const t = tabulateKde(data.samples[k], { rule: opts.rule, lowerEdge: prior.kind === 'uniform' ? lower : undefined, upperEdge: prior.kind === 'uniform' ? upper : undefined });
    tables.push(t);
    offset[k] = quantityOffset(data, k);
    peak[k] = t.logPeak + lnPriorInv;
    floor[k] = peak[k] - LOG_LIKELIHOOD_FLOOR_BELOW_PEAK;
    x0[k] = t.x0;
    invDx[k] = 1 / t.dx;
    last[k] = t.size - 1;
    start[k] = total;
    total += t.size;
  }
  // One flat array of floored ln L values for all bins: the hot loop touches a single buffer.
  const flat = new Float64Array(total);
  for (let k = 0; k < nb; k++) {
    const t = tables[k];
    for (let i = 0; i < t.size; i++) flat[start[k] + i] = Math.max(t.logDensity[i] + lnPriorInv, floor[k]);
  }

  function binValue(k: number, hc: number): number {
    let x = Math.log10(hc) + offset[k];
    if (x !== x) throw new RangeError(`the model's h_c at bin ${k + 1} is not a number (${hc})`);
    if (x < lower) x = lower;
    else if (x > upper) x = upper;
    const u = (x - x0[k]) * invDx[k];
    if (!(u >= 0 && u <= last[k])) return floor[k];
    let j = u | 0;
    if (j >= last[k]) j = last[k] - 1;
    const w = u - j;
    const i = start[k] + j;
    return flat[i] + w * (flat[i + 1] - flat[i]);
  }

  function need(hc: ArrayLike<number>): void {
    if (hc.length < nb) throw new RangeError(`the model gives ${hc.length} values; the likelihood needs h_c at ${nb} bins`);
  }

  return {
    bins: nb,
    frequencyHz: data.frequencyHz.slice(0, nb),
    tables,
    floor,
    peak,
    logLikelihood(hc) {
      need(hc);
      let s = 0;
      for (let k = 0; k < nb; k++) s += binValue(k, hc[k]);
      return s;
    },
    binLogLikelihoods(hc, out = new Float64Array(nb)) {
      need(hc);
      for (let k = 0; k < nb; k++) out[k] = binValue(k, hc[k]);
      return out;
    },
    percentiles(hc, out = new Float64Array(nb)) {
      need(hc);
      for (let k = 0; k < nb; k++) out[k] = Math.min(1, tableCdf(tables[k], Math.log10(hc[k]) + offset[k]));
      return out;
    },
    modelQuantity(hc, out = new Float64Array(nb)) {
      need(hc);
      for (let k = 0; k < nb; k++) out[k] = Math.log10(hc[k]) + offset[k];
      return out;
    },
  };
}
