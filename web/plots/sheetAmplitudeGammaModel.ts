// The (A, gamma) plane of a sheet: its measured (A, gamma) posterior, and each model spectrum's
// effective power law fitted the way the sheet's comparison fits it (fitEffectivePowerLaw over the
// lowest bins of the free spectrum, weighted by the array's noise when the sheet has an array).
import { isSheetObject } from '../engine/engine';
import { DEFAULT_FIT_BINS, fitEffectivePowerLaw } from '../../src/statistics/effectivePowerLaw';
import { strainAtFrequency } from '../../src/statistics/binnedComparison';
import { arraySensitivity } from '../../src/physics/arraySensitivity';
import type { PulsarArray } from '../../src/physics/pulsarArray';
import type { SheetReader } from './sheetSpectrumModel';
import { objectCandidates, spectrumCurves } from './sheetSpectrumModel';
import { amplitudeGammaPosteriors, freeSpectra } from './sheetFreeSpectrumModel';
import { amplitudeGammaPlotModel, type FittedCloud, type FittedPoint } from './amplitudeGammaPlotModel';
import type { StrainCurve } from './spectrumPlotModel';
import type { PlotModel } from './plotModel';

/** How the sheet fits: the bin frequencies, how many of the lowest, and the array's noise there (if any). */
export interface FitSetup {
  frequencyHz: Float64Array;
  bins: number;
  noiseHc?: Float64Array;
  /** Said under the plot. */
  description: string;
}

/** A curve's value at f, log-log between its grid points; frequencies just outside the grid snap to its ends. */
function curveAt(fc: Float64Array, hc: Float64Array, f: number): number {
  const lo = fc[0];
  const hi = fc[fc.length - 1];
  const x = f < lo && f > lo * (1 - 1e-5) ? lo : f > hi && f < hi * (1 + 1e-5) ? hi : f;
  return strainAtFrequency(fc, hc, x);
}

export function fitSetup(sheet: Pick<SheetReader, 'cells' | 'objects' | 'valueOf'>): FitSetup | null {
  const fs = freeSpectra(sheet)[0];
  if (!fs) return null;
  let bins = DEFAULT_FIT_BINS;
  let array: PulsarArray | null = null;
  for (const c of objectCandidates(sheet)) {
    const v = sheet.valueOf(c.name);
    if (!isSheetObject(v)) continue;
    if (v.kind === 'effectivePowerLaw') {
      const b = (v.toJSON() as { bins?: unknown }).bins;
      if (typeof b === 'number' && Number.isInteger(b) && b >= 2) bins = b;
    } else if (v.kind === 'pulsarArray' && !array) array = (v as unknown as { array?: PulsarArray }).array ?? null;
  }
  bins = Math.min(bins, fs.data.frequencyHz.length);
  const f = fs.data.frequencyHz.slice(0, bins);
  let noiseHc: Float64Array | undefined;
  if (array) {
    try {
      const s = arraySensitivity(array);
      noiseHc = Float64Array.from(f, (x) => curveAt(s.frequencyHz, s.hc, x));
    } catch {
      noiseHc = undefined;
    }
  }
  const weights = noiseHc ? "weighted by the array's noise per bin" : 'equal weights in log';
  return { frequencyHz: f, bins, noiseHc, description: `Model points: power law fitted to each spectrum over the lowest ${bins} bins of ${fs.name} (${weights}).` };
}

/** One curve's effective (log10 A, gamma), or the reason it has none. */
export function fitCurve(c: Pick<StrainCurve, 'frequencyHz' | 'hc'>, setup: FitSetup, fRefHz: number): { log10A: number; gamma: number } | { reason: string } {
  try {
    const fc = Float64Array.from(c.frequencyHz);
    const hcs = Float64Array.from(c.hc);
    const hc = Float64Array.from(setup.frequencyHz, (f) => curveAt(fc, hcs, f));
    const fit = fitEffectivePowerLaw(setup.frequencyHz, hc, fRefHz, setup.bins, setup.noiseHc);
    return { log10A: fit.log10A, gamma: fit.gamma };
  } catch (err) {
    return { reason: err instanceof Error ? err.message : String(err) };
  }
}

/** The (A, gamma) figure of a sheet, or null when it has no (A, gamma) posterior. */
export function sheetAmplitudeGammaModel(sheet: SheetReader, extra: StrainCurve[] = [], clouds: FittedCloud[] = [], spectra = spectrumCurves(sheet)): PlotModel | null {
  const post = amplitudeGammaPosteriors(sheet)[0];
  if (!post) return null;
  const notes: string[] = [];
  const points: FittedPoint[] = [];
  const setup = fitSetup(sheet);
  if (!setup) notes.push('No free spectrum in the sheet: its bins set where model spectra are fitted, so no model points are drawn.');
  else {
    notes.push(setup.description);
    [...spectra, ...extra].forEach((c, i) => {
      const r = fitCurve(c, setup, post.posterior.fRefHz);
      if ('reason' in r) notes.push(`${c.label}: no fit (${r.reason}).`);
      else points.push({ id: c.id, label: c.label, log10A: r.log10A, gamma: r.gamma, colorIndex: i });
    });
  }
  return amplitudeGammaPlotModel({ label: post.name, posterior: post.posterior, points, clouds, notes });
}
