// The free-spectrum plot as a PlotModel: each bin's posterior as a violin (its KDE density outline)
// at f_k, with model spectra (live and pinned) and bands (a Monte Carlo run's, realisations') over it.
// The vertical axis shows h_c, rho_k or the timing-residual power P(f), with the conventions of
// docs/freeSpectrum.md: rho_k^2 = h_c^2 / (12 pi^2 f_k^3 T) (Thrane & Romano 2013, PRD 88, 124032,
// times the bin width 1/T as in Lamb, Taylor & van Haasteren 2023, PRD 108, 103019) and
// P(f) = h_c^2 / (12 pi^2 f^3) = rho_k^2 T.
import { log10RhoOffset, rhoFromStrain, type FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import { residualPowerFromStrain } from '../../src/statistics/powerLaw';
import type { PlotModel, PlotSeries } from './plotModel';
import type { StrainCurve } from './spectrumPlotModel';
import { BINS_COLOR, curveColor } from './palette';
import { violinDensity, violinOutline, violinRoom, type ViolinDensity } from './violins';

export type FreeSpectrumAxis = 'hc' | 'rho' | 'psd';

export const FREE_SPECTRUM_AXIS_LABELS: Record<FreeSpectrumAxis, string> = {
  hc: 'characteristic strain h_c(f_k)',
  rho: 'residual amplitude rho_k (s)',
  psd: 'timing-residual power P(f) (s^3)',
};

/** A band of h_c over frequency (a Monte Carlo run's or realisations' central interval). */
export interface StrainBand {
  id: string;
  label: string;
  frequencyHz: number[];
  lower: number[];
  upper: number[];
  /** Mid-line drawn with the band (median), may be empty, and its legend label. */
  middle?: number[];
  middleLabel?: string;
  color: string;
}

export interface FreeSpectrumPlotInput {
  quantity: FreeSpectrumAxis;
  /** Name of the measurement (its cell). */
  label: string;
  data: FreeSpectrumData;
  curves: StrainCurve[];
  bands?: StrainBand[];
  notes?: string[];
}

/** log10 y = scale * sample + shift for bin k: how a bin's samples map onto the chosen axis. */
export function axisMap(data: FreeSpectrumData, k: number, q: FreeSpectrumAxis): { scale: number; shift: number } {
  const f = data.frequencyHz[k];
  const off = log10RhoOffset(f, data.spanS); // log10 rho - log10 h_c
  const logT = Math.log10(data.spanS);
  // log10 P = 2 log10 rho + log10 T = 2 log10 h_c - log10(12 pi^2 f^3).
  if (data.quantity === 'log10Rho') {
    if (q === 'rho') return { scale: 1, shift: 0 };
    if (q === 'hc') return { scale: 1, shift: -off };
    return { scale: 2, shift: logT };
  }
  if (q === 'hc') return { scale: 1, shift: 0 };
  if (q === 'rho') return { scale: 1, shift: off };
  return { scale: 2, shift: 2 * off + logT };
}

/** A model's h_c at f on the chosen axis. */
export function strainOnAxis(q: FreeSpectrumAxis, hc: number, fHz: number, spanS: number): number {
  if (q === 'hc') return hc;
  if (q === 'rho') return rhoFromStrain(hc, fHz, spanS);
  return residualPowerFromStrain(hc, fHz);
}

export interface BinViolin {
  frequencyHz: number;
  density: ViolinDensity;
  /** Half-width in dex of frequency per unit density (per dex of the plotted quantity). */
  dexPerDensity: number;
  /** Posterior median of the plotted quantity (from the samples). */
  median: number;
}

/**
 * The violins of every bin on the chosen axis. Each is scaled to its own peak, whose half-width
 * is 45% of the gap (in log f) to the nearer neighbouring bin, so violins never overlap.
 */
export function freeSpectrumViolins(data: FreeSpectrumData, q: FreeSpectrumAxis): BinViolin[] {
  let byAxis = violinCache.get(data);
  if (!byAxis) violinCache.set(data, (byAxis = new Map()));
  let v = byAxis.get(q);
  if (!v) byAxis.set(q, (v = computeViolins(data, q)));
  return v;
}

/** Violins are computed once per data object and axis (the data of a cell's value never change). */
const violinCache = new WeakMap<FreeSpectrumData, Map<FreeSpectrumAxis, BinViolin[]>>();

function computeViolins(data: FreeSpectrumData, q: FreeSpectrumAxis): BinViolin[] {
  const prior = data.prior;
  return data.samples.map((s, k) => {
    const { scale, shift } = axisMap(data, k, q);
    const density = violinDensity(s, scale, shift, prior.kind === 'uniform' ? { lowerEdge: prior.lower, upperEdge: prior.upper } : {});
    let peak = 0;
    for (const d of density.density) peak = Math.max(peak, d);
    const sorted = Float64Array.from(s).sort();
    const n = sorted.length;
    const mid = n % 2 ? sorted[(n - 1) / 2] : 0.5 * (sorted[n / 2 - 1] + sorted[n / 2]);
    return { frequencyHz: data.frequencyHz[k], density, dexPerDensity: violinRoom(data.frequencyHz, k) / peak, median: 10 ** (scale * mid + shift) };
  });
}

/** The violins of a free spectrum as series (outline and medians), for this plot and the realisation plot. */
export function violinSeries(label: string, data: FreeSpectrumData, q: FreeSpectrumAxis): PlotSeries[] {
  const violins = freeSpectrumViolins(data, q);
  const x: number[] = [];
  const y: number[] = [];
  for (const v of violins) {
    const o = violinOutline(v.density, v.frequencyHz, v.dexPerDensity);
    if (x.length) {
      x.push(NaN);
      y.push(NaN);
    }
    x.push(...o.x);
    y.push(...o.y);
  }
  return [
    { id: `${label}:violins`, label: `${label}: posterior per bin (density)`, kind: 'line', x, y, color: BINS_COLOR, width: 1.1 },
    { id: `${label}:medians`, label: `${label}: posterior median per bin`, kind: 'points', x: violins.map((v) => v.frequencyHz), y: violins.map((v) => v.median), color: BINS_COLOR },
  ];
}

export function bandSeries(b: StrainBand, q: FreeSpectrumAxis, spanS: number): PlotSeries[] {
  const on = (hs: number[]) => hs.map((h, i) => strainOnAxis(q, h, b.frequencyHz[i], spanS));
  const out: PlotSeries[] = [{ id: b.id, label: b.label, kind: 'band', x: b.frequencyHz, y: on(b.middle ?? []), yLow: on(b.lower), yHigh: on(b.upper), color: b.color }];
  if (b.middle?.length) out.push({ id: `${b.id}:middle`, label: b.middleLabel ?? `${b.label}: median`, kind: 'line', x: b.frequencyHz, y: on(b.middle), color: b.color, width: 1.4 });
  return out;
}

/**
 * The frequency axis of the bin plots: it starts at the power of ten below the lowest bin, so that at
 * least two decades are labelled 10^n even when the bins span little more than one.
 */
export function binFrequencyAxis(lowestHz: number): PlotModel['x'] {
  const min = Number.isFinite(lowestHz) && lowestHz > 0 ? 10 ** Math.floor(Math.log10(lowestHz / 1.3)) : undefined;
  return { label: 'gravitational-wave frequency f (nHz)', scale: 'log', displayFactor: 1e9, min };
}

export function freeSpectrumPlotModel(input: FreeSpectrumPlotInput): PlotModel {
  const { quantity: q, data } = input;
  const series: PlotSeries[] = [];
  for (const b of input.bands ?? []) series.push(...bandSeries(b, q, data.spanS));
  series.push(...violinSeries(input.label, data, q));
  // Model curves over the bins' frequency range (and a little beyond), so the eye compares them there.
  const fLo = data.frequencyHz[0] / 1.5;
  const fHi = data.frequencyHz[data.frequencyHz.length - 1] * 1.5;
  input.curves.forEach((c, i) => {
    const x: number[] = [];
    const y: number[] = [];
    c.frequencyHz.forEach((f, j) => {
      if (f < fLo || f > fHi) return;
      x.push(f);
      y.push(strainOnAxis(q, c.hc[j], f, data.spanS));
    });
    series.push({ id: c.id, label: c.label, kind: 'line', x, y, color: curveColor(i), dash: c.dashed ? [6, 4] : undefined, width: c.dashed ? 1.5 : 2.2 });
  });
  const p = data.prior;
  const sampled = data.quantity === 'log10Rho' ? 'log10 rho_k' : 'log10 h_c';
  const notes = [
    `Violins: Gaussian KDE of each bin's samples of ${sampled} (Scott's rule${p.kind === 'uniform' ? `, reflected at the prior's edges ${p.lower} and ${p.upper}` : ''}), the posterior as sampled, prior not divided out; each scaled to its own peak.`,
    ...(input.notes ?? []),
  ];
  if (!input.curves.length) notes.push('No model spectrum to compare: a cell whose value is a spectrum is drawn here.');
  return {
    id: 'free-spectrum',
    title: `Free spectrum ${input.label}: posterior per frequency bin`,
    x: binFrequencyAxis(data.frequencyHz[0]),
    y: { label: FREE_SPECTRUM_AXIS_LABELS[q], scale: 'log' },
    series,
    notes,
  };
}

/** Central credibility of the per-bin intervals a free spectrum shows on the spectrum plot. */
export const BIN_INTERVAL_LEVEL = 0.9;

/**
 * A free spectrum as per-bin intervals of h_c for the spectrum plot: the median and the central 90%
 * of each bin's samples (Hyndman & Fan 1996 definition 7 quantiles), mapped to h_c(f_k) by the
 * convention above.
 */
export function freeSpectrumBins(label: string, data: FreeSpectrumData): { label: string; legend: string; frequencyHz: number[]; hc: number[]; hcLower: number[]; hcUpper: number[] } {
  const cached = binsCache.get(data);
  if (cached && cached.label === label) return cached;
  const made = computeBins(label, data);
  binsCache.set(data, made);
  return made;
}

/** Per-bin intervals are sorted out once per data object (the spectrum plot is redrawn on every edit). */
const binsCache = new WeakMap<FreeSpectrumData, ReturnType<typeof computeBins>>();

function computeBins(label: string, data: FreeSpectrumData) {
  const q = (sorted: Float64Array, p: number) => {
    const h = (sorted.length - 1) * p;
    const i = Math.floor(h);
    return sorted[i] + (h - i) * ((sorted[Math.min(i + 1, sorted.length - 1)] ?? sorted[i]) - sorted[i]);
  };
  const out = { label, legend: `${label}: median and ${Math.round(BIN_INTERVAL_LEVEL * 100)}% per bin`, frequencyHz: Array.from(data.frequencyHz), hc: [] as number[], hcLower: [] as number[], hcUpper: [] as number[] };
  data.samples.forEach((s, k) => {
    const { scale, shift } = axisMap(data, k, 'hc');
    const sorted = Float64Array.from(s).sort();
    const at = (p: number) => 10 ** (scale * q(sorted, p) + shift);
    out.hc.push(at(0.5));
    out.hcLower.push(at((1 - BIN_INTERVAL_LEVEL) / 2));
    out.hcUpper.push(at((1 + BIN_INTERVAL_LEVEL) / 2));
  });
  return out;
}
