// Plot models for job results: the one-input scan with the measured band, the two-input map with
// its credible contours (d3-contour marching squares), and the Monte Carlo distribution.
import { contours } from 'd3-contour';
import type { PlotModel, PlotSeries } from '../plots/plotModel';
import { curveColor, MEASURED_COLOR, INK } from '../plots/palette';
import type { BandData, Scan1Result, Scan2Result, SampleResult, ScanAxisSpec } from './jobProtocol';

function axisLabel(a: ScanAxisSpec): string {
  return a.unit ? `${a.cell} (${a.unit})` : a.cell;
}

function measuredBand(m: BandData & { label: string }, xs: number[]): PlotSeries[] {
  const lo = Math.min(...xs);
  const hi = Math.max(...xs);
  const pct = `${Math.round(m.level * 1000) / 10}%`;
  return [
    { id: 'measured-band', label: `${m.label}: ${pct} interval`, kind: 'band', x: [lo, hi], y: [m.median, m.median], yLow: [m.lower, m.lower], yHigh: [m.upper, m.upper], color: MEASURED_COLOR },
    { id: 'measured-median', label: `${m.label}: median`, kind: 'line', x: [lo, hi], y: [m.median, m.median], color: MEASURED_COLOR, dash: [5, 4], width: 1.5 },
  ];
}

function quantityLabel(name: string, unit: string): string {
  return unit ? `${name} (${unit})` : name;
}

export function scan1Model(r: Scan1Result, measurementLabel: string | null): PlotModel {
  const positive = r.y.every((v) => !Number.isFinite(v) || v > 0);
  const series: PlotSeries[] = [{ id: 'scan', label: `${r.output} against ${r.input.cell}`, kind: 'line', x: r.x, y: r.y, color: curveColor(0), width: 2.2 }];
  if (r.band) series.unshift(...measuredBand({ ...r.band, label: measurementLabel ?? 'measured' }, r.x));
  return {
    id: 'scan1',
    title: `${r.output} as ${r.input.cell} varies`,
    x: { label: axisLabel(r.input), scale: r.input.log ? 'log' : 'linear' },
    y: { label: quantityLabel(r.output, r.outputUnit), scale: positive ? 'log' : 'linear' },
    series,
    notes: [
      ...(r.scaled ? [`${r.output} was obtained from the square-root law in ${r.input.cell} (checked with probes; Phinney 2001), not by evaluating every point.`] : []),
      ...r.failures.map((f) => f.message),
    ],
  };
}

/** Grid position g (0..n, cell centres at i + 0.5) to a value on an axis. */
function gridToValue(g: number, values: number[], log: boolean): number {
  const n = values.length;
  const t = Math.max(0, Math.min(n - 1, g - 0.5));
  const i = Math.min(n - 2, Math.floor(t));
  const f = t - i;
  if (n === 1) return values[0];
  return log ? Math.exp(Math.log(values[i]) * (1 - f) + Math.log(values[i + 1]) * f) : values[i] * (1 - f) + values[i + 1] * f;
}

export function scan2Model(r: Scan2Result): PlotModel {
  const nx = r.xValues.length;
  const ny = r.yValues.length;
  const series: PlotSeries[] = [];
  const sorted = [...r.levels].sort((a, b) => b.level - a.level);
  sorted.forEach((lv, k) => {
    const [shape] = contours().size([nx, ny]).thresholds([lv.threshold])(r.mass);
    const x: number[] = [];
    const y: number[] = [];
    for (const polygon of shape?.coordinates ?? []) {
      for (const ring of polygon) {
        for (const [gx, gy] of ring) {
          x.push(gridToValue(gx, r.xValues, r.x.log));
          y.push(gridToValue(gy, r.yValues, r.y.log));
        }
        x.push(NaN);
        y.push(NaN);
      }
    }
    series.push({
      id: `contour-${lv.level}`,
      label: `${Math.round(lv.level * 1000) / 10}% credible region`,
      kind: 'line',
      x,
      y,
      color: INK,
      dash: k === 0 ? [6, 4] : undefined,
      width: k === 0 ? 1.6 : 2.4,
    });
  });
  return {
    id: 'scan2',
    title: `Posterior of ${r.x.cell} and ${r.y.cell} given ${r.output}`,
    x: { label: axisLabel(r.x), scale: r.x.log ? 'log' : 'linear' },
    y: { label: axisLabel(r.y), scale: r.y.log ? 'log' : 'linear' },
    series,
    heatmap: { x: r.xValues, y: r.yValues, z: r.mass, label: 'posterior mass per grid cell' },
    notes: [`Prior: ${r.prior}. Contours enclose the highest-posterior-density cells.`, ...r.failures.map((f) => f.message)],
  };
}

export function sampleModel(r: SampleResult, measurementLabel: string | null): PlotModel {
  const n = r.sorted.length;
  const positive = r.sorted.every((v) => v > 0);
  const series: PlotSeries[] = [];
  const measured = r.band;
  if (measured) {
    series.push({
      id: 'measured',
      label: `${measurementLabel ?? 'measured'}: ${Math.round(measured.level * 1000) / 10}% interval`,
      kind: 'band',
      x: [measured.lower, measured.upper],
      y: [0.5, 0.5],
      yLow: [0, 0],
      yHigh: [1, 1],
      color: MEASURED_COLOR,
    });
  }
  series.push({ id: 'ecdf', label: `${r.output}: fraction of samples below`, kind: 'line', x: r.sorted, y: r.sorted.map((_, i) => (i + 0.5) / n), color: curveColor(0) });
  return {
    id: 'sample',
    title: `Distribution of ${r.output} (${r.samples} samples, seed ${r.seed})`,
    x: { label: quantityLabel(r.output, r.outputUnit), scale: positive ? 'log' : 'linear' },
    y: { label: 'cumulative fraction of samples', scale: 'linear', min: 0, max: 1 },
    series,
    notes: [],
  };
}
