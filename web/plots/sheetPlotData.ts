// Finds what the plots draw among the sheet's values: spectrum objects, measurements, per-bin
// values, the Hubble constant, and one-argument function cells of frequency. Reads SheetObjects
// only through toJSON() (plain SI numbers), so the plots follow the engine's own data.
import { matchingCells } from './matchingCells';
import { isSheetObject, type CellSpec } from '../engine/engine';
import { math, quantity } from '../../src/sheet/mathInstance';
import { beginCell, cellBudgetSeconds, checkTimeNow, endCell } from '../../src/sheet/evaluationBudget';
import { BuiltinError } from '../../src/sheet/cellError';
import type { BinnedStrain, MeasuredAmplitude, RealisationBands, StrainCurve, VerticalQuantity } from './spectrumPlotModel';
import { strainFrom } from './spectrumPlotModel';

type Json = Record<string, unknown>;

function asRecord(v: unknown): Json | null {
  return v && typeof v === 'object' && !Array.isArray(v) ? (v as Json) : null;
}

export function numbers(v: unknown): number[] | null {
  if (!Array.isArray(v) && !(v instanceof Float64Array)) return null;
  const out = Array.from(v as ArrayLike<unknown>, (x) => (typeof x === 'number' ? x : NaN));
  return out.length ? out : null;
}

function num(v: unknown): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

function first<T>(obj: Json, keys: string[], read: (v: unknown) => T | null): T | null {
  for (const k of keys) {
    if (k in obj) {
      const r = read(obj[k]);
      if (r !== null) return r;
    }
  }
  return null;
}

/** A spectrum object's curve: {frequencyHz: [...], hc: [...]} (src/builtins/spectrumValue.ts). */
export function curveFromSpectrumJson(id: string, label: string, json: unknown): StrainCurve | null {
  const o = asRecord(json);
  if (!o) return null;
  const f = first(o, ['frequencyHz', 'frequency', 'f'], numbers);
  const hc = first(o, ['hc', 'strain', 'characteristicStrain'], numbers);
  if (!f || !hc || f.length !== hc.length) return null;
  const omegaGw = first(o, ['omegaGw', 'omega'], numbers) ?? undefined;
  const residualPsd = first(o, ['residualPsd', 'residualPower', 'psd'], numbers) ?? undefined;
  return { id, label, frequencyHz: f, hc, omegaGw, residualPsd };
}

/** A realisations object (src/builtins/realisations.ts toJSON): bands, a few single realisations, loudest binaries. */
export function realisationBandsFromJson(label: string, json: unknown): RealisationBands | null {
  const o = asRecord(json);
  if (!o) return null;
  const f = numbers(o.frequencyHz);
  if (!f) return null;
  const keys = ['smoothHc', 'medianHc', 'lower68', 'upper68', 'lower95', 'upper95', 'medianLoudestHc'] as const;
  const got = keys.map((k) => numbers(o[k]));
  if (got.some((g) => !g || g.length !== f.length)) return null;
  const [smoothHc, medianHc, lower68, upper68, lower95, upper95, loudestHc] = got as number[][];
  const singles = Array.isArray(o.singleRealisations) ? (o.singleRealisations as unknown[]).map(numbers).filter((s): s is number[] => s !== null && s.length === f.length) : [];
  return { label, frequencyHz: f, smoothHc, medianHc, lower68, upper68, lower95, upper95, singles, loudestHc };
}

/** A measurement object: median and interval with level, or log10 median with sigmas (in dex). */
export function measuredFromJson(label: string, json: unknown): MeasuredAmplitude | null {
  const o = asRecord(json);
  if (!o) return null;
  const gamma = first(o, ['gamma'], num) ?? 13 / 3;
  const fRefHz = first(o, ['fRefHz', 'referenceFrequencyHz', 'fRef'], num);
  if (fRefHz === null) return null;
  const stated = asRecord(o.stated) ?? asRecord(o.interval);
  const log10Median = first(o, ['log10Median'], num);
  const median = first(o, ['median', 'amplitude'], num) ?? (log10Median !== null ? 10 ** log10Median : null);
  if (median === null) return null;
  if (stated) {
    const lower = num(stated.lower);
    const upper = num(stated.upper);
    const level = num(stated.level);
    if (lower !== null && upper !== null && level !== null) return { label, median, lower, upper, level, gamma, fRefHz };
  }
  const lower = first(o, ['lower'], num);
  const upper = first(o, ['upper'], num);
  const level = first(o, ['level'], num);
  if (lower !== null && upper !== null && level !== null) return { label, median, lower, upper, level, gamma, fRefHz };
  // Only sigmas in dex: show the central 68.27% (one-sigma) interval, and say so in the label.
  const sLo = first(o, ['sigmaLowDex', 'sigmaDex'], num);
  const sHi = first(o, ['sigmaHighDex', 'sigmaDex'], num);
  if (sLo !== null && sHi !== null) {
    return { label, median, lower: median * 10 ** -sLo, upper: median * 10 ** sHi, level: 0.6827, gamma, fRefHz };
  }
  return null;
}

/** Per-bin measured values: frequencies with value, lower, upper in h_c, Omega_gw or residual power. */
export function binsFromJson(label: string, json: unknown, h0PerS: number | null): BinnedStrain | null {
  const o = asRecord(json);
  if (!o) return null;
  const f = first(o, ['frequencyHz', 'frequency'], numbers);
  const value = first(o, ['value', 'median', 'values'], numbers);
  const lower = first(o, ['lower', 'low'], numbers);
  const upper = first(o, ['upper', 'high'], numbers);
  if (!f || !value || !lower || !upper) return null;
  const q = String(o.quantity ?? 'hc').toLowerCase();
  const quantity: VerticalQuantity = q.includes('omega') ? 'omega' : q.includes('res') || q.includes('psd') || q.includes('power') ? 'psd' : 'hc';
  const toHc = (list: number[]) => list.map((v, i) => strainFrom(quantity, v, f[i], h0PerS));
  return { label, frequencyHz: f, hc: toHc(value), hcLower: toHc(lower), hcUpper: toHc(upper) };
}

/** The Hubble constant in s^-1 from a cell holding a quantity like 70 km/s/Mpc, or a cosmology object. */
export function hubbleConstant(cells: CellSpec[], valueOf: (name: string) => unknown, objects: CellSpec[] = cells): number | null {
  const perSecond = math.unit('1 Hz');
  for (const c of matchingCells(cells, 'hubble by name', (x) => /^(H0|H_0|hubble)/i.test(x.name))) {
    const v = valueOf(c.name);
    if (math.isUnit(v) && v.equalBase(perSecond)) {
      const si = (v as unknown as { value: number }).value;
      if (si > 0 && Number.isFinite(si)) return si;
    }
  }
  for (const c of objects) {
    const v = valueOf(c.name);
    if (isSheetObject(v) && v.kind === 'cosmology') {
      const o = asRecord(v.toJSON());
      const h = o && first(o, ['h0PerS', 'H0PerS', 'hubbleSI', 'H0_SI', 'H0'], num);
      if (h && h > 0 && h < 1e-10) return h;
    }
  }
  return null;
}

/** A function cell of one argument (its value is a JS function with params, see src/sheet). */
export function isOneArgumentFunction(v: unknown): v is ((x: unknown) => unknown) & { params?: string[] } {
  return typeof v === 'function' && (v as { length: number }).length === 1;
}

/**
 * Samples a one-argument function cell on the frequencies given. It is called with a frequency
 * quantity; a dimensionless result (number or unitless quantity) is drawn. Returns null with a
 * reason when the function is not a dimensionless function of frequency, or when drawing it runs
 * out of one cell's time budget (the page's, APP_PAGE_CELL_SECONDS: drawing never holds the page longer).
 */
export function sampleFrequencyFunction(fn: (x: unknown) => unknown, frequencyHz: number[]): { y: number[] } | { reason: string } {
  const y: number[] = [];
  const budget = beginCell();
  try {
    for (const f of frequencyHz) {
      checkTimeNow();
      const r = fn(quantity(f, 'Hz'));
      if (typeof r === 'number') y.push(r);
      else if (math.isUnit(r)) {
        const u = r as unknown as { dimensions: number[]; value: number | null };
        if (!u.dimensions.every((d) => d === 0)) return { reason: `it returns ${String(r)}, not a dimensionless value` };
        y.push(u.value ?? NaN);
      } else return { reason: 'it does not return a number' };
    }
  } catch (err) {
    if (err instanceof BuiltinError && err.kind === 'limit') return { reason: `drawing it takes longer than ${Number(cellBudgetSeconds().toPrecision(3))} s (one cell's time budget here)` };
    return { reason: err instanceof Error ? err.message : String(err) };
  } finally {
    endCell(budget);
  }
  return { y };
}

/** A list of frequencies in Hz from a cell holding a list of frequency quantities (e.g. `freqs`). */
export function frequencyList(v: unknown): number[] | null {
  const items = math.isMatrix(v) ? ((v as { toArray(): unknown[] }).toArray() as unknown[]) : Array.isArray(v) ? v : null;
  if (!items) return null;
  const hz = math.unit('1 Hz');
  const out: number[] = [];
  for (const x of items.flat(Infinity as 1)) {
    if (!math.isUnit(x) || !(x as unknown as { equalBase(u: unknown): boolean }).equalBase(hz)) return null;
    const si = (x as unknown as { value: number | null }).value;
    if (si === null || !(si > 0)) return null;
    out.push(si);
  }
  return out.length ? out : null;
}

/** Frequencies to draw function cells on: the first spectrum's, else the `freqs` cell, else 1 to 100 nHz. */
export function drawingGrid(spectrumGrid: number[] | undefined, cells: CellSpec[], valueOf: (name: string) => unknown): number[] {
  if (spectrumGrid?.length) return spectrumGrid;
  const fromCell = frequencyList(valueOf('freqs'));
  if (fromCell) return fromCell;
  return Array.from({ length: 41 }, (_, k) => 1e-9 * Math.pow(100, k / 40));
}
