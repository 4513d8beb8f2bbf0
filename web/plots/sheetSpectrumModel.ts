// The spectrum plot of a sheet as a PlotModel, from the cells and their values alone (DOM-free):
// the Plots panel and `strainsheet plot` draw the same figure from it.
import { isOffPageValue, isSheetObject, type CellSpec, type CellState } from '../engine/engine';
import { spectrumPlotModel, type BinnedStrain, type MeasuredAmplitude, type RealisationBands, type StrainCurve, type VerticalQuantity } from './spectrumPlotModel';
import { binsFromJson, realisationBandsFromJson, curveFromSpectrumJson, drawingGrid, hubbleConstant, isOneArgumentFunction, measuredFromJson, sampleFrequencyFunction } from './sheetPlotData';
import type { PlotModel } from './plotModel';
import { matchingCells } from './matchingCells';
import { freeSpectrumBins } from './freeSpectrumPlotModel';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';

export interface SheetReader {
  cells: CellSpec[];
  /**
   * The cells whose value is a sheet object or a function, in sheet order, when the reader keeps
   * that list (the app does: a long sheet is then not scanned cell by cell); else every cell.
   */
  objects?: CellSpec[];
  valueOf(name: string): unknown;
  stateOf(name: string): CellState;
}

/** The cells that may hold a sheet object or a function (see SheetReader.objects). */
export function objectCandidates(sheet: Pick<SheetReader, 'cells' | 'objects'>): CellSpec[] {
  return sheet.objects ?? sheet.cells;
}

/** Every spectrum cell's current curve, the sheet's main `spectrum` first (it keeps the first colour). */
export function spectrumCurves(sheet: SheetReader): StrainCurve[] {
  const out: StrainCurve[] = [];
  for (const c of objectCandidates(sheet)) {
    const v = sheet.valueOf(c.name);
    // A spectrum computed off the page is drawn from its JSON, as one computed here is.
    if (isSheetObject(v) && (v.kind === 'spectrum' || (isOffPageValue(v) && v.heldKind === 'spectrum'))) {
      const curve = curveFromSpectrumJson(`cell:${c.name}`, c.name, v.toJSON());
      if (curve) out.push(curve);
    }
  }
  return out.sort((a, b) => Number(b.label === 'spectrum') - Number(a.label === 'spectrum'));
}

/** The spectrum figure: the sheet's spectra, function cells of frequency, extra curves (pins), measurements and bins. */
export function sheetSpectrumModel(sheet: SheetReader, quantity: VerticalQuantity, extra: StrainCurve[] = [], spectra = spectrumCurves(sheet)): PlotModel {
  const { cells, valueOf } = sheet;
  const notes: string[] = [];
  const objects = objectCandidates(sheet);
  const h0 = hubbleConstant(cells, valueOf, objects);
  const curves: StrainCurve[] = [...spectra];
  const grid = drawingGrid(curves[0]?.frequencyHz, cells, valueOf);
  for (const c of objects) {
    const v = valueOf(c.name);
    if (!isOneArgumentFunction(v)) continue;
    const r = sampleFrequencyFunction(v, grid);
    if ('y' in r) curves.push({ id: `fn:${c.name}`, label: `${c.name}(f)`, frequencyHz: grid, hc: r.y, dashed: true });
    else notes.push(`${c.name}(f) is not drawn: ${r.reason}.`);
  }
  curves.push(...extra);
  const measured: MeasuredAmplitude[] = [];
  const bins: BinnedStrain[] = [];
  const realisations: RealisationBands[] = [];
  for (const c of objects) {
    const v = valueOf(c.name);
    if (!isSheetObject(v)) continue;
    if (v.kind === 'measurement') {
      const m = measuredFromJson(c.name, v.toJSON());
      if (m) measured.push(m);
      else notes.push(`${c.name}: this measurement has no amplitude interval to draw.`);
    } else if (v.kind === 'realisations' || (isOffPageValue(v) && v.heldKind === 'realisations')) {
      const r = realisationBandsFromJson(c.name, v.toJSON());
      if (r) realisations.push(r);
    } else if (v.kind === 'freeSpectrum' && (v as unknown as { data?: FreeSpectrumData }).data) {
      // A measured free spectrum: each bin's median and central 90% (the violins are on the free-spectrum plot).
      bins.push(freeSpectrumBins(c.name, (v as unknown as { data: FreeSpectrumData }).data));
    } else if (/bin|freeSpectrum/i.test(v.kind)) {
      const b = binsFromJson(c.name, v.toJSON(), h0);
      if (b) bins.push(b);
    }
  }
  if (!spectra.length) {
    // A spectrum cell in error shows nothing: say which one and why, instead of "no spectrum".
    for (const c of matchingCells(cells, 'spectrum by name or formula', (x) => /spectrum/i.test(x.name) || /Spectrum\s*\(/.test(x.formula))) {
      const st = sheet.stateOf(c.name);
      if (st.status === 'error') notes.push(`${c.name} has no value: ${st.error.message}`);
    }
  }
  return spectrumPlotModel({ quantity, curves, realisations, measured, bins, h0PerS: h0, notes });
}
