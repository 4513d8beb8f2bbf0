// A corner plot (src/statistics/cornerPlot.ts) as the app's plot models, one per panel: on the
// diagonal the 1-D histogram of the draws with the median; below it each pair's 2-D histogram as a
// map with its 68.27% and 95.45% highest-density contours (d3-contour marching squares, as the
// two-input map of the scan panel) and the medians. Parameters sampled in ln x are drawn in log10 x.
import { contours } from 'd3-contour';
import type { CornerAxis, CornerModel, CornerPair } from '../../src/statistics/cornerPlot';
import type { PlotModel, PlotSeries } from '../plots/plotModel';
import { curveColor, INK, MEASURED_COLOR } from '../plots/palette';

export function cornerAxisLabel(a: CornerAxis): string {
  const u = a.unit ? ` (${a.unit})` : '';
  return a.log ? `log10 ${a.name}${u}` : `${a.name}${u}`;
}

const centres = (edges: Float64Array) => Array.from({ length: edges.length - 1 }, (_, b) => (edges[b] + edges[b + 1]) / 2);
const pct = (level: number) => `${(100 * level).toFixed(2)}%`;

/** The diagonal panel of parameter i: the histogram as steps, and the median. */
export function cornerHistogramModel(m: CornerModel, i: number): PlotModel {
  const a = m.axes[i];
  const x: number[] = [];
  const y: number[] = [];
  for (let b = 0; b < m.bins; b++) {
    x.push(a.edges[b], a.edges[b + 1]);
    y.push(a.counts[b], a.counts[b]);
  }
  const top = Math.max(1, ...a.counts);
  return {
    id: `corner-${i}-${i}`,
    title: a.name,
    x: { label: cornerAxisLabel(a), scale: 'linear', min: a.edges[0], max: a.edges[m.bins] },
    y: { label: 'draws per bin', scale: 'linear', min: 0 },
    series: [
      { id: 'histogram', label: 'draws', kind: 'line', x, y, color: curveColor(0), width: 1.6 },
      { id: 'median', label: 'median', kind: 'line', x: [a.median, a.median], y: [0, top], color: MEASURED_COLOR, dash: [4, 3], width: 1.4 },
    ],
    notes: [],
  };
}

/** Grid position g (0..bins, cell centres at k + 0.5) to the plotted coordinate of an axis. */
function gridToValue(g: number, a: CornerAxis, bins: number): number {
  const lo = a.edges[0];
  const hi = a.edges[bins];
  return lo + ((hi - lo) * Math.max(0, Math.min(bins, g))) / bins;
}

/** The panel of a pair (x = parameter p.i, y = parameter p.j): the map of draws, contours and medians. */
export function cornerPairModel(m: CornerModel, p: CornerPair): PlotModel {
  const ax = m.axes[p.i];
  const ay = m.axes[p.j];
  const series: PlotSeries[] = [];
  // The wider region first (dashed), then the 68.27% one.
  [1, 0].forEach((k) => {
    const threshold = p.thresholds[k];
    if (!(threshold > 0)) return;
    const [shape] = contours().size([m.bins, m.bins]).thresholds([threshold])(Array.from(p.counts));
    const x: number[] = [];
    const y: number[] = [];
    for (const polygon of shape?.coordinates ?? []) {
      for (const ring of polygon) {
        for (const [gx, gy] of ring) {
          x.push(gridToValue(gx, ax, m.bins));
          y.push(gridToValue(gy, ay, m.bins));
        }
        x.push(NaN);
        y.push(NaN);
      }
    }
    series.push({ id: `contour-${k}`, label: pct(m.levels[k]), kind: 'line', x, y, color: INK, dash: k === 1 ? [5, 3] : undefined, width: k === 1 ? 1.2 : 2 });
  });
  series.push({ id: 'median', label: 'medians', kind: 'points', x: [ax.median], y: [ay.median], color: MEASURED_COLOR });
  return {
    id: `corner-${p.j}-${p.i}`,
    title: `${ay.name} against ${ax.name}`,
    x: { label: cornerAxisLabel(ax), scale: 'linear', min: ax.edges[0], max: ax.edges[m.bins] },
    y: { label: cornerAxisLabel(ay), scale: 'linear', min: ay.edges[0], max: ay.edges[m.bins] },
    series,
    heatmap: { x: centres(ax.edges), y: centres(ay.edges), z: Array.from(p.counts), label: 'draws per cell' },
    notes: [],
  };
}
