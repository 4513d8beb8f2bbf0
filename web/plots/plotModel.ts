// What a plot shows, as plain data: the chart, the SVG writer and the CSV writer all read this,
// so the three exports always agree with the screen.

export type AxisScale = 'log' | 'linear';

export interface PlotAxis {
  /** Quantity and unit, e.g. "frequency f (nHz)". */
  label: string;
  scale: AxisScale;
  /** Values on this axis are multiplied by this factor for display (e.g. 1e9 for Hz -> nHz). */
  displayFactor?: number;
  min?: number;
  max?: number;
}

/** One thing drawn: a curve, markers, a filled band between two curves, or vertical intervals. */
export interface PlotSeries {
  id: string;
  label: string;
  kind: 'line' | 'points' | 'band' | 'interval';
  /** Abscissae in the axis's own unit (before displayFactor). */
  x: number[];
  /** Central values (line, points, interval markers). For 'band' the mid-line, may be empty. */
  y: number[];
  /** Lower and upper ends for 'band' and 'interval'. */
  yLow?: number[];
  yHigh?: number[];
  color: string;
  dash?: number[];
  width?: number;
}

export interface PlotModel {
  id: string;
  title: string;
  x: PlotAxis;
  y: PlotAxis;
  series: PlotSeries[];
  /** Short remarks shown under the plot (e.g. why a series is missing). */
  notes: string[];
  /** A gridded map drawn under the series (two-input scans): z[i + x.length * j] at (x[i], y[j]). */
  heatmap?: Heatmap;
}

export interface Heatmap {
  x: number[];
  y: number[];
  z: number[];
  /** What z is, for the CSV header and the colour key, e.g. "posterior mass per grid cell". */
  label: string;
}

/** Light-to-dark single-hue ramp (ochre), readable in greyscale: t in [0, 1]. */
export function heatColor(t: number): string {
  const c = Math.max(0, Math.min(1, t));
  const from = [251, 248, 240];
  const to = [150, 84, 10];
  const mix = from.map((f, k) => Math.round(f + (to[k] - f) * Math.sqrt(c)));
  return `rgb(${mix[0]}, ${mix[1]}, ${mix[2]})`;
}

/** Cell edges around grid centres (midpoints; geometric midpoints on a log axis). */
export function cellEdges(centres: number[], scale: AxisScale): number[] {
  const n = centres.length;
  if (n === 0) return [];
  if (n === 1) return scale === 'log' ? [centres[0] / 1.5, centres[0] * 1.5] : [centres[0] - 0.5, centres[0] + 0.5];
  const mid = (a: number, b: number) => (scale === 'log' ? Math.sqrt(a * b) : (a + b) / 2);
  const edges = [0];
  for (let i = 1; i < n; i++) edges.push(mid(centres[i - 1], centres[i]));
  const first = scale === 'log' ? (centres[0] * centres[0]) / edges[1] : 2 * centres[0] - edges[1];
  const last = scale === 'log' ? (centres[n - 1] * centres[n - 1]) / edges[n - 1] : 2 * centres[n - 1] - edges[n - 1];
  edges[0] = first;
  edges.push(last);
  return edges;
}

/** Finite positive values only survive on a log axis. */
export function usableOnAxis(v: number, scale: AxisScale): boolean {
  return Number.isFinite(v) && (scale === 'linear' || v > 0);
}

/** Smallest and largest usable values of every series, for axis ranges. */
export function dataRange(model: PlotModel, axis: 'x' | 'y'): [number, number] | null {
  const scale = model[axis].scale;
  let lo = Infinity;
  let hi = -Infinity;
  if (model.heatmap) {
    const edges = cellEdges(axis === 'x' ? model.heatmap.x : model.heatmap.y, scale);
    for (const v of edges) {
      if (!usableOnAxis(v, scale)) continue;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  }
  for (const s of model.series) {
    const lists = axis === 'x' ? [s.x] : [s.y, s.yLow ?? [], s.yHigh ?? []];
    for (const list of lists) {
      for (const v of list) {
        if (!usableOnAxis(v, scale)) continue;
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
  }
  if (!(lo <= hi)) return null;
  if (lo === hi) return scale === 'log' ? [lo / 2, hi * 2] : [lo - 1, hi + 1];
  return [lo, hi];
}

/**
 * The range an axis shows, in the axis's own unit (before displayFactor): the data's range with a
 * 4% margin (in log10 on log axes), ends extended to round 1-2-5 steps on linear axes; fixed ends
 * and maps (which fill their grid) are kept as they are. The chart on screen and the figure
 * writer both use it, so both show the same ticks.
 */
export function displayRange(model: PlotModel, axis: 'x' | 'y'): [number, number] {
  const a = model[axis];
  const r = dataRange(model, axis) ?? (a.scale === 'log' ? [1, 10] : [0, 1]);
  let lo = a.min ?? r[0];
  let hi = a.max ?? r[1];
  if (a.scale === 'log') {
    const pad = (Math.log10(hi) - Math.log10(lo)) * 0.04 || 0.1;
    if (a.min === undefined) lo = 10 ** (Math.log10(lo) - pad);
    if (a.max === undefined) hi = 10 ** (Math.log10(hi) + pad);
    return [lo, hi];
  }
  if (model.heatmap) return [lo, hi];
  if (!(hi > lo)) [lo, hi] = [lo - 1, hi + 1];
  const raw = (hi - lo) / 6;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = ([1, 2, 5, 10].find((m) => m * mag >= raw) ?? 10) * mag;
  if (a.min === undefined) lo = Math.floor(lo / step + 1e-9) * step;
  if (a.max === undefined) hi = Math.ceil(hi / step - 1e-9) * step;
  return [lo, hi];
}
