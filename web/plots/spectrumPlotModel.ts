// The spectrum plot as a PlotModel: predicted spectra, pinned curves, function cells of frequency,
// the measured amplitude at its reference frequency with its interval, the measured power-law band and
// per-bin measured values, all shown as h_c, Omega_gw or timing-residual power.
import { omegaGwFromStrain, residualPowerFromStrain, strainFromOmegaGw, strainFromResidualPower } from '../../src/statistics/powerLaw';
import type { PlotModel, PlotSeries } from './plotModel';
import { curveColor, MEASURED_COLOR, BINS_COLOR, REALISATION_COLOR } from './palette';

export type VerticalQuantity = 'hc' | 'omega' | 'psd';

export const VERTICAL_LABELS: Record<VerticalQuantity, string> = {
  hc: 'characteristic strain h_c',
  omega: 'energy density Ω_gw(f)',
  psd: 'timing-residual power P(f) (s^3)',
};

/** A strain spectrum to draw, numbers in SI (Hz). */
export interface StrainCurve {
  id: string;
  label: string;
  frequencyHz: number[];
  hc: number[];
  /** The spectrum's own Omega_gw and residual-power series, when it carries them (used as given). */
  omegaGw?: number[];
  residualPsd?: number[];
  dashed?: boolean;
}

/** A measured power-law amplitude: median and an interval with its stated credibility. */
export interface MeasuredAmplitude {
  label: string;
  median: number;
  lower: number;
  upper: number;
  /** Credibility of [lower, upper] as a fraction, e.g. 0.9. */
  level: number;
  gamma: number;
  fRefHz: number;
}

/** Measured values in frequency bins (free spectrum), converted to h_c by the extractor. */
export interface BinnedStrain {
  label: string;
  /** The legend's text, when more should be said than "per-bin values". */
  legend?: string;
  frequencyHz: number[];
  hc: number[];
  hcLower: number[];
  hcUpper: number[];
}

/** Realisations of a finite population per bin (src/builtins/realisations.ts), h_c. */
export interface RealisationBands {
  label: string;
  frequencyHz: number[];
  smoothHc: number[];
  medianHc: number[];
  lower68: number[];
  upper68: number[];
  lower95: number[];
  upper95: number[];
  /** A few single realisations, drawn thin. */
  singles: number[][];
  /** The loudest binary's own h_c, h sqrt(f T), median over realisations. */
  loudestHc: number[];
}

export interface SpectrumPlotInput {
  quantity: VerticalQuantity;
  curves: StrainCurve[];
  realisations?: RealisationBands[];
  measured: MeasuredAmplitude[];
  bins: BinnedStrain[];
  /** Hubble constant in s^-1, needed for Omega_gw. */
  h0PerS: number | null;
  notes: string[];
}

export function convertStrain(quantity: VerticalQuantity, hc: number, fHz: number, h0PerS: number | null): number {
  if (quantity === 'hc') return hc;
  if (quantity === 'psd') return residualPowerFromStrain(hc, fHz);
  return h0PerS === null ? NaN : omegaGwFromStrain(hc, fHz, h0PerS);
}

/** Inverse of convertStrain, for per-bin values given as Omega_gw or residual power. */
export function strainFrom(quantity: VerticalQuantity, value: number, fHz: number, h0PerS: number | null): number {
  if (quantity === 'hc') return value;
  if (quantity === 'psd') return strainFromResidualPower(value, fHz);
  return h0PerS === null ? NaN : strainFromOmegaGw(value, fHz, h0PerS);
}

/** A curve's values on the chosen axis: its own series when it has one, else converted from h_c. */
function curveValues(q: VerticalQuantity, c: StrainCurve, h0PerS: number | null): number[] {
  const own = q === 'omega' ? c.omegaGw : q === 'psd' ? c.residualPsd : undefined;
  if (own && own.length === c.hc.length) return own;
  return c.hc.map((h, k) => convertStrain(q, h, c.frequencyHz[k], h0PerS));
}

/** h_c of a power law with amplitude A at fRef and residual-power index gamma (alpha = (3 - gamma)/2). */
function powerLaw(a: number, gamma: number, fRef: number, f: number): number {
  return a * Math.pow(f / fRef, (3 - gamma) / 2);
}

export function spectrumPlotModel(input: SpectrumPlotInput): PlotModel {
  const q = input.quantity;
  const conv = (hc: number, f: number) => convertStrain(q, hc, f, input.h0PerS);
  const series: PlotSeries[] = [];
  const notes = [...input.notes];
  if (q === 'omega' && input.h0PerS === null && input.curves.some((c) => !c.omegaGw)) notes.push('Ω_gw needs H0: no Hubble-constant cell (a quantity like 70 km/s/Mpc) was found.');

  input.curves.forEach((c, i) => {
    series.push({
      id: c.id,
      label: c.label,
      kind: 'line',
      x: c.frequencyHz,
      y: curveValues(q, c, input.h0PerS),
      color: curveColor(i),
      dash: c.dashed ? [6, 4] : undefined,
      width: c.dashed ? 1.5 : 2.2,
    });
  });

  // Frequency range for the measured band: the drawn curves' range, else a decade around f_ref.
  let fLo = Infinity;
  let fHi = -Infinity;
  for (const c of input.curves) for (const f of c.frequencyHz) if (f > 0 && Number.isFinite(f)) (fLo = Math.min(fLo, f)), (fHi = Math.max(fHi, f));
  for (const m of input.measured) {
    if (!(fLo < fHi)) {
      fLo = m.fRefHz / 10;
      fHi = m.fRefHz * 3;
    }
    const n = 48;
    const xs = Array.from({ length: n }, (_, k) => fLo * Math.pow(fHi / fLo, k / (n - 1)));
    const pct = `${Math.round(m.level * 1000) / 10}%`;
    series.push({
      id: `${m.label}:band`,
      label: `${m.label}: power law γ=${Number(m.gamma.toFixed(3))}, ${pct} band`,
      kind: 'band',
      x: xs,
      y: xs.map((f) => conv(powerLaw(m.median, m.gamma, m.fRefHz, f), f)),
      yLow: xs.map((f) => conv(powerLaw(m.lower, m.gamma, m.fRefHz, f), f)),
      yHigh: xs.map((f) => conv(powerLaw(m.upper, m.gamma, m.fRefHz, f), f)),
      color: MEASURED_COLOR,
    });
    series.push({
      id: `${m.label}:amplitude`,
      label: `${m.label}: amplitude at ${formatNhz(m.fRefHz)} with ${pct} interval`,
      kind: 'interval',
      x: [m.fRefHz],
      y: [conv(m.median, m.fRefHz)],
      yLow: [conv(m.lower, m.fRefHz)],
      yHigh: [conv(m.upper, m.fRefHz)],
      color: MEASURED_COLOR,
      width: 2.5,
    });
  }
  for (const r of input.realisations ?? []) {
    const c = (ys: number[]) => ys.map((h, k) => conv(h, r.frequencyHz[k]));
    const x = r.frequencyHz;
    series.push({ id: `${r.label}:95`, label: `${r.label}: 95% of realisations`, kind: 'band', x, y: c(r.medianHc), yLow: c(r.lower95), yHigh: c(r.upper95), color: REALISATION_COLOR });
    series.push({ id: `${r.label}:68`, label: `${r.label}: 68% of realisations`, kind: 'band', x, y: c(r.medianHc), yLow: c(r.lower68), yHigh: c(r.upper68), color: REALISATION_COLOR });
    series.push({ id: `${r.label}:median`, label: `${r.label}: median`, kind: 'line', x, y: c(r.medianHc), color: REALISATION_COLOR, width: 2 });
    series.push({ id: `${r.label}:smooth`, label: `${r.label}: smooth (all universes)`, kind: 'line', x, y: c(r.smoothHc), color: REALISATION_COLOR, dash: [6, 4], width: 1.5 });
    r.singles.slice(0, 3).forEach((one, i) => series.push({ id: `${r.label}:single${i + 1}`, label: `${r.label}: realisation ${i + 1}`, kind: 'line', x, y: c(one), color: REALISATION_COLOR, width: 0.7 }));
    series.push({ id: `${r.label}:loudest`, label: `${r.label}: loudest binary per bin (its own h_c, median)`, kind: 'points', x, y: c(r.loudestHc), color: REALISATION_COLOR });
  }
  for (const b of input.bins) {
    series.push({
      id: `${b.label}:bins`,
      label: b.legend ?? `${b.label}: per-bin values`,
      kind: 'interval',
      x: b.frequencyHz,
      y: b.hc.map((h, k) => conv(h, b.frequencyHz[k])),
      yLow: b.hcLower.map((h, k) => conv(h, b.frequencyHz[k])),
      yHigh: b.hcUpper.map((h, k) => conv(h, b.frequencyHz[k])),
      color: BINS_COLOR,
      width: 1.5,
    });
  }
  if (!input.curves.length && !notes.some((n) => / has no value: /.test(n))) notes.push('No spectrum cell yet: a cell whose value is a spectrum is drawn here.');
  return {
    id: 'spectrum',
    title: q === 'hc' ? 'Characteristic-strain spectrum' : q === 'omega' ? 'Energy-density spectrum' : 'Timing-residual power spectrum',
    x: { label: 'gravitational-wave frequency f (nHz)', scale: 'log', displayFactor: 1e9 },
    y: { label: VERTICAL_LABELS[q], scale: 'log' },
    series,
    notes,
  };
}

function formatNhz(f: number): string {
  return `${Number((f * 1e9).toPrecision(3))} nHz`;
}
