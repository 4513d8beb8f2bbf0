// A realisations run of the worker as a figure: the realisation plot of web/plots (bands, smooth
// spectrum, single realisations, loudest binaries, the free spectrum's violins) that a
// realiseBackground cell draws in the Plots panel, and the bands for the spectrum plot.
import type { PlotModel } from '../plots/plotModel';
import type { RealisationBands } from '../plots/spectrumPlotModel';
import { realisationPlotModel, realisationViewOfRun } from '../plots/realisationPlotModel';
import type { FreeSpectrumAxis } from '../plots/freeSpectrumPlotModel';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import type { RealiseJobResult } from './realiseRun';

export function realisationBandsOfRun(r: RealiseJobResult): RealisationBands {
  const s = r.summary;
  return {
    label: `${r.cell} (${r.count} realisations, seed ${r.seed})`,
    frequencyHz: Array.from(r.frequencyHz),
    smoothHc: Array.from(r.smoothHc),
    medianHc: Array.from(s.medianHc),
    lower68: Array.from(s.lower68),
    upper68: Array.from(s.upper68),
    lower95: Array.from(s.lower95),
    upper95: Array.from(s.upper95),
    singles: r.singles,
    loudestHc: r.medianLoudestHc,
  };
}

/**
 * The figure of a run: the realisation plot (web/plots/realisationPlotModel.ts), the same one a
 * realiseBackground cell gets in the Plots panel, with the sheet's free spectrum as violins when given.
 */
export function realisationRunModel(r: RealiseJobResult, freeSpectrum?: { label: string; data: FreeSpectrumData }, quantity: FreeSpectrumAxis = 'hc'): PlotModel {
  const m = realisationPlotModel({ quantity, view: realisationViewOfRun(r), freeSpectrum });
  return { ...m, id: 'realisation-run', title: `Realisations of ${r.cell}: h_c per bin (seed ${r.seed})` };
}
