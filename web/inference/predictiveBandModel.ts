// The posterior-predictive h_c band of an inference run (quantiles of the spectrum cell's h_c over
// posterior draws, src/statistics/sheetInference.ts) as a figure: drawn over the sheet's measured
// free spectrum (its violins) when it has one, else on its own.
import type { PredictiveBand } from '../../src/statistics/sheetInference';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import { bandSeries, freeSpectrumPlotModel, type StrainBand } from '../plots/freeSpectrumPlotModel';
import type { PlotModel } from '../plots/plotModel';
import { REALISATION_COLOR } from '../plots/palette';

/** The 95.45% band (with the median) and the 68.27% band of h_c, from the band's five quantiles. */
export function predictiveStrainBands(b: PredictiveBand): StrainBand[] {
  const q = (i: number) => Array.from(b.quantiles[i]);
  const f = Array.from(b.frequencyHz);
  return [
    { id: 'predictive-95', label: `posterior predictive ${b.cell}: 95.45% of ${b.draws} draws`, frequencyHz: f, lower: q(0), upper: q(4), middle: q(2), middleLabel: 'posterior predictive median', color: REALISATION_COLOR },
    { id: 'predictive-68', label: `posterior predictive ${b.cell}: 68.27%`, frequencyHz: f, lower: q(1), upper: q(3), color: REALISATION_COLOR },
  ];
}

export function predictiveBandModel(b: PredictiveBand, freeSpectrum?: { label: string; data: FreeSpectrumData }): PlotModel {
  const bands = predictiveStrainBands(b);
  const title = `Posterior-predictive h_c of ${b.cell}`;
  if (freeSpectrum) {
    const m = freeSpectrumPlotModel({ quantity: 'hc', label: freeSpectrum.label, data: freeSpectrum.data, curves: [], bands });
    return { ...m, id: 'predictive-band', title: `${title} against ${freeSpectrum.label}`, notes: m.notes.filter((n) => !/^No model spectrum/.test(n)) };
  }
  return {
    id: 'predictive-band',
    title,
    x: { label: 'gravitational-wave frequency f (nHz)', scale: 'log', displayFactor: 1e9 },
    y: { label: 'characteristic strain h_c', scale: 'log' },
    series: bands.flatMap((band) => bandSeries(band, 'hc', 1)),
    notes: [],
  };
}
