// A corner plot as SVG text: 1-D histograms on the diagonal with the median marked, 2-D 68.27% and
// 95.45% highest-density contours below it (d3-contour's marching squares) with the medians.
import { contours } from 'd3-contour';
import type { CornerModel } from '../statistics/cornerPlot';

const CELL = 150;
const PAD = 50;

function label(a: CornerModel['axes'][number]): string {
  const u = a.unit ? ` [${a.unit}]` : '';
  return a.log ? `log10 ${a.name}${u}` : `${a.name}${u}`;
}
const esc = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;');
const fmt = (x: number) => Number(x.toPrecision(3)).toString();

export function cornerSvg(m: CornerModel, title: string): string {
  const n = m.axes.length;
  const size = PAD * 2 + n * CELL;
  const out: string[] = [`<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size + 20}" font-family="sans-serif" font-size="10">`];
  out.push(`<text x="${PAD}" y="16" font-size="12">${esc(title)}</text>`);
  const x0 = (i: number) => PAD + i * CELL;
  const y0 = (j: number) => 20 + PAD + j * CELL;
  m.axes.forEach((a, i) => {
    const max = Math.max(...a.counts, 1);
    const w = CELL / m.bins;
    const bars = Array.from(a.counts, (c, b) => `${x0(i) + b * w},${y0(i) + CELL - (c / max) * (CELL - 10)}`);
    out.push(`<rect x="${x0(i)}" y="${y0(i)}" width="${CELL}" height="${CELL}" fill="none" stroke="#999"/>`);
    out.push(`<polyline fill="none" stroke="#234" points="${x0(i)},${y0(i) + CELL} ${bars.map((p, b) => `${p} ${x0(i) + (b + 1) * w},${p.split(',')[1]}`).join(' ')} ${x0(i) + CELL},${y0(i) + CELL}"/>`);
    const lo = a.edges[0];
    const hi = a.edges[m.bins];
    const xm = x0(i) + ((a.median - lo) / (hi - lo)) * CELL;
    out.push(`<line x1="${xm}" y1="${y0(i)}" x2="${xm}" y2="${y0(i) + CELL}" stroke="#c33" stroke-dasharray="3,2"/>`);
    out.push(`<text x="${x0(i) + 2}" y="${y0(i) - 3}">${esc(label(a))}: median ${fmt(a.log ? 10 ** a.median : a.median)}</text>`);
    out.push(`<text x="${x0(i)}" y="${y0(n - 1) + CELL + 12}">${fmt(lo)}</text><text x="${x0(i) + CELL - 30}" y="${y0(n - 1) + CELL + 12}">${fmt(hi)}</text>`);
  });
  for (const p of m.pairs) {
    const ax = m.axes[p.i];
    const ay = m.axes[p.j];
    const gx = x0(p.i);
    const gy = y0(p.j);
    out.push(`<rect x="${gx}" y="${gy}" width="${CELL}" height="${CELL}" fill="none" stroke="#999"/>`);
    const s = CELL / m.bins;
    const levels = [p.thresholds[1], p.thresholds[0]].filter((t) => Number.isFinite(t) && t > 0);
    const cs = contours().size([m.bins, m.bins]).thresholds(levels)(Array.from(p.counts));
    cs.forEach((c, k) => {
      const d = c.coordinates
        .map((poly) => poly.map((ring) => 'M' + ring.map(([cx, cy]) => `${(gx + cx * s).toFixed(1)},${(gy + CELL - cy * s).toFixed(1)}`).join('L') + 'Z').join(''))
        .join('');
      out.push(`<path d="${d}" fill="${k === 0 ? '#9bc' : '#468'}" fill-opacity="0.5" stroke="#234" stroke-width="0.7"/>`);
    });
    const mx = gx + ((ax.median - ax.edges[0]) / (ax.edges[m.bins] - ax.edges[0])) * CELL;
    const my = gy + CELL - ((ay.median - ay.edges[0]) / (ay.edges[m.bins] - ay.edges[0])) * CELL;
    out.push(`<circle cx="${mx.toFixed(1)}" cy="${my.toFixed(1)}" r="2.5" fill="#c33"/>`);
  }
  out.push(`<text x="${PAD}" y="${size + 12}">contours: ${fmt(100 * m.levels[0])}% and ${fmt(100 * m.levels[1])}% highest-density regions; dashed lines and dots: medians</text>`);
  out.push('</svg>');
  return out.join('\n') + '\n';
}
