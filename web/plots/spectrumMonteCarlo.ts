// A Monte Carlo of a spectrum cell for the measurement plots (src/statistics/spectrumMonteCarloJob.ts):
// its options from the sheet (the free spectrum's bins, the fit the comparison uses), and its result
// as the free-spectrum plot's band and the (A, gamma) plane's cloud of fitted points.
import { F_YR_HZ } from '../../src/physics/constants';
import type { SpectrumSampleOptions, SpectrumSampleResult } from '../../src/statistics/spectrumMonteCarloJob';
import type { SheetReader } from './sheetSpectrumModel';
import { amplitudeGammaPosteriors, freeSpectra } from './sheetFreeSpectrumModel';
import { fitSetup } from './sheetAmplitudeGammaModel';
import type { StrainBand } from './freeSpectrumPlotModel';
import type { FittedCloud } from './amplitudeGammaPlotModel';
import { REALISATION_COLOR } from './palette';

/** The job's options for a spectrum cell of the sheet, or the reason there are none. */
export function spectrumSampleOptions(sheet: Pick<SheetReader, 'cells' | 'valueOf'>, spectrum: string, samples: number, seed: number): SpectrumSampleOptions | { reason: string } {
  const fs = freeSpectra(sheet)[0];
  const setup = fitSetup(sheet);
  if (!fs || !setup) return { reason: 'the sheet has no measured free spectrum: its bins set where the spectrum is read' };
  const ag = amplitudeGammaPosteriors(sheet)[0];
  return {
    spectrum,
    samples,
    seed,
    frequencyHz: Array.from(fs.data.frequencyHz),
    fitBins: setup.bins,
    fRefHz: ag?.posterior.fRefHz ?? F_YR_HZ,
    noiseHc: setup.noiseHc ? Array.from(setup.noiseHc) : undefined,
  };
}

function what(r: SpectrumSampleResult): string {
  return `Monte Carlo of ${r.spectrum} (${r.samples - r.failures} draws, seed ${r.seed})`;
}

/** The run's 95% and 68% bands of h_c per bin (with the median). */
export function monteCarloBands(r: SpectrumSampleResult): StrainBand[] {
  return [
    { id: `mc:${r.spectrum}:95`, label: `${what(r)}: 95%`, frequencyHz: r.frequencyHz, lower: r.lower95, upper: r.upper95, color: REALISATION_COLOR },
    { id: `mc:${r.spectrum}:68`, label: `${what(r)}: 68%`, frequencyHz: r.frequencyHz, lower: r.lower68, upper: r.upper68, middle: r.median, middleLabel: `${what(r)}: median`, color: REALISATION_COLOR },
  ];
}

/** The run's fitted (A, gamma) points. */
export function monteCarloCloud(r: SpectrumSampleResult): FittedCloud {
  return { id: `mc:${r.spectrum}:cloud`, label: `${what(r)}: fitted (A, γ)`, log10A: r.log10A, gamma: r.gamma };
}
