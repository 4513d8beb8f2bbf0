// Where the signal comes from: plots of the contribution to h_c^2 per unit redshift and per dex of
// chirp mass, for every cell whose value carries such a profile ({grid, density, ...} in its JSON,
// as in src/physics/signalOrigin.ts), with the central 50% and 90% ranges shaded.
import { isSheetObject, type CellSpec } from '../engine/engine';
import type { PlotModel, PlotSeries } from './plotModel';
import { numbers } from './sheetPlotData';
import { curveColor } from './palette';

function pair(v: unknown): [number, number] | null {
  return Array.isArray(v) && v.length === 2 && v.every((x) => typeof x === 'number' && Number.isFinite(x)) ? [v[0], v[1]] : null;
}

/** Finds the profile inside an object's JSON: at the top level or one level down (e.g. {redshift: {...}}). */
function profilesIn(json: unknown): { key: string; p: Record<string, unknown> }[] {
  if (!json || typeof json !== 'object') return [];
  const o = json as Record<string, unknown>;
  if (numbers(o.grid) && numbers(o.density)) return [{ key: '', p: o }];
  return Object.entries(o)
    .filter(([, v]) => v && typeof v === 'object' && numbers((v as Record<string, unknown>).grid) && numbers((v as Record<string, unknown>).density))
    .map(([key, v]) => ({ key, p: v as Record<string, unknown> }));
}

function variableOf(text: string): { label: string; kind: 'redshift' | 'mass' | 'other' } {
  if (/mass|chirp|mc/i.test(text)) return { label: 'log10 chirp mass log10(M_c / Msun)', kind: 'mass' };
  if (/redshift|(^|[^a-z])z([^a-z]|$)/i.test(text)) return { label: 'redshift z', kind: 'redshift' };
  return { label: 'grid variable', kind: 'other' };
}

/** Integral of y over x by the trapezoid rule, or null when it is not positive. */
function trapezoid(x: number[], y: number[]): number | null {
  let sum = 0;
  for (let i = 1; i < x.length; i++) sum += 0.5 * (y[i] + y[i - 1]) * (x[i] - x[i - 1]);
  return Number.isFinite(sum) && sum > 0 ? sum : null;
}

/** The breakdowns held by `cells` (every cell, or only those holding sheet objects). */
export function breakdownModels(cells: CellSpec[], valueOf: (name: string) => unknown): PlotModel[] {
  const models: PlotModel[] = [];
  for (const c of cells) {
    const v = valueOf(c.name);
    if (!isSheetObject(v)) continue;
    let json: unknown;
    try {
      json = v.toJSON();
    } catch {
      continue;
    }
    for (const { key, p } of profilesIn(json)) {
      const grid = numbers(p.grid)!;
      const density = numbers(p.density)!;
      if (grid.length !== density.length || grid.length < 2) continue;
      const hint = `${String(p.variable ?? '')} ${key} ${v.kind} ${c.name}`;
      const variable = variableOf(hint);
      const total = typeof p.total === 'number' && p.total > 0 ? p.total : trapezoid(grid, density);
      const y = density.map((d) => (total ? d / total : d));
      const top = Math.max(...y.filter(Number.isFinite));
      const series: PlotSeries[] = [];
      const r90 = pair(p.range90);
      const r50 = pair(p.range50);
      if (r90) series.push({ id: 'r90', label: 'central 90% of h_c²', kind: 'band', x: r90, y: [0, 0], yLow: [0, 0], yHigh: [top, top], color: '#9fb7d4' });
      if (r50) series.push({ id: 'r50', label: 'central 50% of h_c²', kind: 'band', x: r50, y: [0, 0], yLow: [0, 0], yHigh: [top, top], color: '#1d4e89' });
      series.push({ id: 'density', label: `${c.name}${key ? ` ${key}` : ''}`, kind: 'line', x: grid, y, color: variable.kind === 'mass' ? curveColor(2) : curveColor(0), width: 2.2 });
      const perWhat = variable.kind === 'mass' ? 'per dex of chirp mass' : variable.kind === 'redshift' ? 'per unit redshift' : 'per unit of the grid variable';
      models.push({
        id: `origin:${c.name}:${key}`,
        title: `Contribution to h_c² ${variable.kind === 'mass' ? 'by chirp mass' : variable.kind === 'redshift' ? 'by redshift' : ''} (${c.name}${key ? `, ${key}` : ''})`,
        x: { label: variable.label, scale: 'linear' },
        y: { label: total ? `fraction of h_c² ${perWhat}` : `d h_c² ${perWhat}`, scale: 'linear', min: 0 },
        series,
        notes: [],
      });
    }
  }
  return models;
}
