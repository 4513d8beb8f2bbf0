// The realisation plot (issue 13): per frequency bin, the central 68% and 95% of h_c over realisations
// of a finite population with their median, the smooth spectrum (the average over infinitely many
// universes, Phinney 2001), a few single realisations drawn thin, the loudest binary's own h_c
// against that background, and the measured free spectrum's violins when there is one.
// Built from a RealisationSummary (src/statistics/realisationSummary.ts) plus the bins, so a sheet
// cell (realiseBackground) and a worker run draw the same figure.
import type { RealisationSummary } from '../../src/statistics/realisationSummary';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import type { PlotModel, PlotSeries } from './plotModel';
import { binFrequencyAxis, strainOnAxis, violinSeries, FREE_SPECTRUM_AXIS_LABELS, type FreeSpectrumAxis } from './freeSpectrumPlotModel';
import { REALISATION_COLOR } from './palette';

/** Single realisations drawn (thin lines). */
export const SINGLES_DRAWN = 3;
/** Bins where the loudest binary outshines the rest in at least this share of realisations are named. */
export const OUTSHINE_NOTE_LEVEL = 0.05;

export interface RealisationView {
  /** What the realisations are of, e.g. the cell name, with the run's count and seed. */
  label: string;
  frequencyHz: ArrayLike<number>;
  /** Span T of the bins (width 1/T), s: sets rho_k on that axis. */
  spanS?: number;
  /** Smooth h_c per bin (f T sum N h^2 over the population's cells). */
  smoothHc: ArrayLike<number>;
  summary: RealisationSummary;
  /** h_c of a few single realisations, one array per realisation. */
  singles: ArrayLike<number>[];
  /** The loudest binary's own h_c per bin, h sqrt(f T), median over realisations (from summary.medianLoudestStrain). */
  loudestHc: ArrayLike<number>;
}

export interface RealisationPlotInput {
  quantity: FreeSpectrumAxis;
  view: RealisationView;
  /** The measured free spectrum drawn as violins over the bands. */
  freeSpectrum?: { label: string; data: FreeSpectrumData };
}

/** The loudest binary's own h_c from its strain: h_c^2 = f T h^2 for one binary in a bin of width 1/T (Sesana, Vecchio & Colacino 2008, MNRAS 390, 192). */
export function loudestOwnHc(summary: RealisationSummary, frequencyHz: ArrayLike<number>, spanS: number): number[] {
  return Array.from(frequencyHz, (f, k) => summary.medianLoudestStrain[k] * Math.sqrt(f * spanS));
}

function percent(p: number): string {
  return `${Math.round(p * 1000) / 10}%`;
}

export function realisationPlotModel(input: RealisationPlotInput): PlotModel {
  const { view, quantity: q } = input;
  const spanS = input.freeSpectrum?.data.spanS ?? view.spanS;
  const notes: string[] = [];
  // rho_k needs the span; without one the plot stays on h_c.
  const axis: FreeSpectrumAxis = q === 'rho' && !spanS ? 'hc' : q;
  if (axis !== q) notes.push('rho_k needs the span T of the bins: shown as h_c.');
  const f = Array.from(view.frequencyHz);
  const on = (hs: ArrayLike<number>) => Array.from(hs, (h, k) => strainOnAxis(axis, h, f[k], spanS ?? NaN));
  const s = view.summary;
  const series: PlotSeries[] = [
    { id: `${view.label}:95`, label: `${view.label}: 95% of realisations`, kind: 'band', x: f, y: on(s.medianHc), yLow: on(s.lower95), yHigh: on(s.upper95), color: REALISATION_COLOR },
    { id: `${view.label}:68`, label: `${view.label}: 68% of realisations`, kind: 'band', x: f, y: on(s.medianHc), yLow: on(s.lower68), yHigh: on(s.upper68), color: REALISATION_COLOR },
    { id: `${view.label}:median`, label: `${view.label}: median`, kind: 'line', x: f, y: on(s.medianHc), color: REALISATION_COLOR, width: 2 },
    { id: `${view.label}:smooth`, label: 'smooth spectrum (average over universes)', kind: 'line', x: f, y: on(view.smoothHc), color: REALISATION_COLOR, dash: [6, 4], width: 1.5 },
  ];
  // The single realisations as one series (one legend entry), separated by gaps.
  const singles = view.singles.slice(0, SINGLES_DRAWN);
  if (singles.length) {
    const sx: number[] = [];
    const sy: number[] = [];
    singles.forEach((one, i) => {
      if (i) (sx.push(NaN), sy.push(NaN));
      sx.push(...f);
      sy.push(...on(one));
    });
    series.push({ id: `${view.label}:singles`, label: `${singles.length} single realisation${singles.length > 1 ? 's' : ''}`, kind: 'line', x: sx, y: sy, color: REALISATION_COLOR, width: 0.6 });
  }
  series.push({ id: `${view.label}:loudest`, label: 'loudest binary per bin: its own h_c (median)', kind: 'points', x: f, y: on(view.loudestHc), color: '#b0435d' });
  if (input.freeSpectrum) series.push(...violinSeries(input.freeSpectrum.label, input.freeSpectrum.data, axis));
  notes.unshift(
    `Bands: central 68.27% and 95.45% of h_c over ${s.realisations} realisations per bin; thin lines: the first ${Math.min(SINGLES_DRAWN, view.singles.length)}; dots: the loudest binary alone in its bin.`,
  );
  const outshine = f.map((x, k) => ({ x, p: s.outshineProbability[k] })).filter((b) => b.p >= OUTSHINE_NOTE_LEVEL);
  const nHz = (x: number) => `${Number((x * 1e9).toPrecision(3))} nHz`;
  if (outshine.length) {
    const top = outshine.reduce((a, b) => (b.p > a.p ? b : a));
    const where = outshine.length === 1 ? `at ${nHz(top.x)}` : `in ${outshine.length} bins from ${nHz(outshine[0].x)} to ${nHz(outshine.at(-1)!.x)}`;
    notes.push(
      `Continuous-source outlook: the loudest binary outshines the rest of its bin (its h^2 above the sum of the others') in at least ${percent(OUTSHINE_NOTE_LEVEL)} of realisations ${where}; most often at ${nHz(top.x)} (${percent(top.p)}).`,
    );
  } else notes.push(`In no bin does the loudest binary outshine the rest of its bin in ${percent(OUTSHINE_NOTE_LEVEL)} or more of realisations.`);
  return {
    id: 'realisations',
    title: input.freeSpectrum ? 'Realisations per bin and the free spectrum' : 'Realisations per bin',
    x: binFrequencyAxis(Math.min(f[0], input.freeSpectrum?.data.frequencyHz[0] ?? Infinity)),
    y: { label: FREE_SPECTRUM_AXIS_LABELS[axis], scale: 'log' },
    series,
    notes,
  };
}

/** What a worker run of realisations hands over (web/jobs/realiseRun.ts RealiseJobResult has these fields). */
export interface RealisationRunLike {
  cell: string;
  count: number;
  seed: number;
  frequencyHz: ArrayLike<number>;
  smoothHc: ArrayLike<number>;
  summary: RealisationSummary;
  singles: ArrayLike<number>[];
  medianLoudestHc: ArrayLike<number>;
  spanS?: number;
}

/** A worker run as the realisation plot's view: the same figure as for a sheet cell. */
export function realisationViewOfRun(r: RealisationRunLike): RealisationView {
  return {
    label: `${r.cell} (${r.count} realisations, seed ${r.seed})`,
    frequencyHz: r.frequencyHz,
    spanS: r.spanS,
    smoothHc: r.smoothHc,
    summary: r.summary,
    singles: r.singles,
    loudestHc: r.medianLoudestHc,
  };
}
