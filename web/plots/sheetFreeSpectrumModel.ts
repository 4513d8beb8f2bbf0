// The measurements of a sheet the free-spectrum, (A, gamma) and realisation plots draw: free spectra
// with their samples, (A, gamma) posteriors and realisations, read from the cells' values (the engine's own SheetObjects:
// src/builtins/freeSpectrumObjects.ts), so the plots show exactly what the comparison uses.
import { isSheetObject } from '../engine/engine';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import type { AmplitudeGammaPosterior } from '../../src/statistics/amplitudeGammaPosterior';
import type { SheetReader } from './sheetSpectrumModel';
import { objectCandidates, spectrumCurves } from './sheetSpectrumModel';
import { freeSpectrumPlotModel, type FreeSpectrumAxis, type StrainBand } from './freeSpectrumPlotModel';
import type { StrainCurve } from './spectrumPlotModel';
import type { PlotModel } from './plotModel';
import type { RealisationSummary } from '../../src/statistics/realisationSummary';
import { loudestOwnHc, realisationPlotModel, SINGLES_DRAWN, type RealisationView } from './realisationPlotModel';

export interface NamedFreeSpectrum {
  name: string;
  data: FreeSpectrumData;
}
export interface NamedAmplitudeGamma {
  name: string;
  posterior: AmplitudeGammaPosterior;
}

/** Every cell whose value is a measured free spectrum (kind 'freeSpectrum' carrying its data). */
export function freeSpectra(sheet: Pick<SheetReader, 'cells' | 'objects' | 'valueOf'>): NamedFreeSpectrum[] {
  const out: NamedFreeSpectrum[] = [];
  for (const c of objectCandidates(sheet)) {
    const v = sheet.valueOf(c.name);
    if (!isSheetObject(v) || v.kind !== 'freeSpectrum') continue;
    const data = (v as unknown as { data?: FreeSpectrumData }).data;
    if (data && data.frequencyHz && Array.isArray(data.samples)) out.push({ name: c.name, data });
  }
  return out;
}

/** Every cell whose value is a measured (A, gamma) posterior. */
export function amplitudeGammaPosteriors(sheet: Pick<SheetReader, 'cells' | 'objects' | 'valueOf'>): NamedAmplitudeGamma[] {
  const out: NamedAmplitudeGamma[] = [];
  for (const c of objectCandidates(sheet)) {
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

/** What the realisation plot reads of a realiseBackground value (src/builtins/realisations.ts RealisationsValue). */
interface RealisationsLike {
  kind: 'realisations';
  seed: number;
  summary: RealisationSummary;
  setup: { spanS: number };
  cells: { bins: { frequencyHz: number }[] };
  draws: { hc: Float64Array; count: number };
  smoothHc(): Float64Array;
}

/** A realisations cell's value as the realisation plot's view (the same shape a worker run gives, web/jobs). */
export function realisationViewOfValue(name: string, v: RealisationsLike): RealisationView {
  const f = v.cells.bins.map((b) => b.frequencyHz);
  const nb = f.length;
  const shown = Math.min(SINGLES_DRAWN, v.draws.count);
  return {
    label: `${name} (${v.summary.realisations} realisations, seed ${v.seed})`,
    frequencyHz: f,
    spanS: v.setup.spanS,
    smoothHc: v.smoothHc(),
    summary: v.summary,
    singles: Array.from({ length: shown }, (_, r) => v.draws.hc.subarray(r * nb, (r + 1) * nb)),
    loudestHc: loudestOwnHc(v.summary, f, v.setup.spanS),
  };
}

/** Every cell holding realisations (realiseBackground). */
export function realisationCells(sheet: Pick<SheetReader, 'cells' | 'objects' | 'valueOf'>): { name: string; view: RealisationView }[] {
  const out: { name: string; view: RealisationView }[] = [];
  for (const c of objectCandidates(sheet)) {
    const v = sheet.valueOf(c.name);
    if (!isSheetObject(v) || v.kind !== 'realisations') continue;
    const r = v as unknown as RealisationsLike;
    if (r.summary && r.setup && r.cells && r.draws && typeof r.smoothHc === 'function') out.push({ name: c.name, view: realisationViewOfValue(c.name, r) });
  }
  return out;
}

/** The realisation figure of a sheet (its first realisations cell, or the one named) with its first free spectrum, or null. */
export function sheetRealisationModel(sheet: SheetReader, quantity: FreeSpectrumAxis, which?: string): PlotModel | null {
  const all = realisationCells(sheet);
  const r = which ? all.find((x) => x.name === which) : all[0];
  if (!r) return null;
  const fs = freeSpectra(sheet)[0];
  const model = realisationPlotModel({ quantity, view: r.view, freeSpectrum: fs ? { label: fs.name, data: fs.data } : undefined });
  if (all.length > 1) model.notes.push(`The sheet has ${all.length} realisations cells; this plot shows ${r.name}.`);
  return model;
}
