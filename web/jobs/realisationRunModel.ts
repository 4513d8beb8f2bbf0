// A realisations run of the worker as the realisation bands of the spectrum plot's model
// (web/plots/spectrumPlotModel.ts): the same bands, smooth spectrum, single realisations and
// loudest binaries that a realiseBackground cell draws there.
import type { PlotModel } from '../plots/plotModel';
import { spectrumPlotModel, type RealisationBands } from '../plots/spectrumPlotModel';
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

export function realisationRunModel(r: RealiseJobResult): PlotModel {
  const m = spectrumPlotModel({ quantity: 'hc', curves: [], realisations: [realisationBandsOfRun(r)], measured: [], bins: [], h0PerS: null, notes: [] });
  return {
    ...m,
    id: 'realisation-run',
    title: `Realisations of ${r.cell}: h_c per bin`,
    notes: [`Bands: central 68.27% and 95.45% of ${r.count} realisations per bin (seed ${r.seed}, threshold ${r.threshold}); dots: the loudest binary's own h_c, median over realisations.`],
  };
}
