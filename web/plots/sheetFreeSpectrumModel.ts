// The measurements of a sheet the free-spectrum and (A, gamma) plots draw: free spectra with their
// samples and (A, gamma) posteriors, read from the cells' values (the engine's own SheetObjects:
// src/builtins/freeSpectrumObjects.ts), so the plots show exactly what the comparison uses.
import { isSheetObject } from '../engine/engine';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import type { AmplitudeGammaPosterior } from '../../src/statistics/amplitudeGammaPosterior';
import type { SheetReader } from './sheetSpectrumModel';
import { spectrumCurves } from './sheetSpectrumModel';
import { freeSpectrumPlotModel, type FreeSpectrumAxis, type StrainBand } from './freeSpectrumPlotModel';
import type { StrainCurve } from './spectrumPlotModel';
import type { PlotModel } from './plotModel';

export interface NamedFreeSpectrum {
  name: string;
  data: FreeSpectrumData;
}
export interface NamedAmplitudeGamma {
  name: string;
  posterior: AmplitudeGammaPosterior;
}

/** Every cell whose value is a measured free spectrum (kind 'freeSpectrum' carrying its data). */
export function freeSpectra(sheet: Pick<SheetReader, 'cells' | 'valueOf'>): NamedFreeSpectrum[] {
  const out: NamedFreeSpectrum[] = [];
  for (const c of sheet.cells) {
    const v = sheet.valueOf(c.name);
    if (!isSheetObject(v) || v.kind !== 'freeSpectrum') continue;
    const data = (v as unknown as { data?: FreeSpectrumData }).data;
    if (data && data.frequencyHz && Array.isArray(data.samples)) out.push({ name: c.name, data });
  }
  return out;
}

/** Every cell whose value is a measured (A, gamma) posterior. */
export function amplitudeGammaPosteriors(sheet: Pick<SheetReader, 'cells' | 'valueOf'>): NamedAmplitudeGamma[] {
  const out: NamedAmplitudeGamma[] = [];
  for (const c of sheet.cells) {
    const v = sheet.valueOf(c.name);
    if (!isSheetObject(v) || v.kind !== 'amplitudeGamma') continue;
    const posterior = (v as unknown as { posterior?: AmplitudeGammaPosterior }).posterior;
    if (posterior && (posterior.kind === 'samples' || posterior.kind === 'gaussian')) out.push({ name: c.name, posterior });
  }
  return out;
}

/** The free-spectrum figure of a sheet (its first free spectrum, or the one named), or null when it has none. */
export function sheetFreeSpectrumModel(
  sheet: SheetReader,
  quantity: FreeSpectrumAxis,
  extra: StrainCurve[] = [],
  bands: StrainBand[] = [],
  spectra = spectrumCurves(sheet),
  which?: string,
): PlotModel | null {
  const all = freeSpectra(sheet);
  const fs = which ? all.find((m) => m.name === which) : all[0];
  if (!fs) return null;
  const notes = all.length > 1 ? [`The sheet has ${all.length} free spectra; this plot shows ${fs.name}.`] : [];
  return freeSpectrumPlotModel({ quantity, label: fs.name, data: fs.data, curves: [...spectra, ...extra], bands, notes });
}
