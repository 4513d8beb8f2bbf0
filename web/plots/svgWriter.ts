// Writes a PlotModel as a standalone SVG 1.1 document (W3C SVG 1.1 Second Edition, 2011):
// our own serialiser of the plotted data, independent of the chart library. All text is escaped.
import { cellEdges, dataRange, heatColor, usableOnAxis, type PlotAxis, type PlotModel, type PlotSeries } from './plotModel';
import { axisTicks, formatTick } from './axisTicks';

export interface SvgOptions {
  width?: number;
  height?: number;
}

/** Escapes text for XML character data and attribute values (XML 1.0, section 2.4). */
export function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, (c) =>
    c === '<' ? '&lt;' : c === '>' ? '&gt;' : c === '&' ? '&amp;' : c === '"' ? '&quot;' : '&apos;',
  );
}

const MARGIN = { left: 78, right: 18, top: 34, bottom: 52 };

export function plotToSvg(model: PlotModel, opts: SvgOptions = {}): string {
  const width = opts.width ?? 800;
  const height = opts.height ?? 500;
  const plotW = width - MARGIN.left - MARGIN.right;
  const legendRows = Math.ceil(model.series.length / 3);
  const plotH = height - MARGIN.top - MARGIN.bottom - legendRows * 16;
  const xr = axisRange(model, 'x');
  const yr = axisRange(model, 'y');
  const sx = scaler(model.x, xr, MARGIN.left, MARGIN.left + plotW);
  const sy = scaler(model.y, yr, MARGIN.top + plotH, MARGIN.top);
  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="UTF-8"?>`);
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="sans-serif" font-size="12">`,
  );
  out.push(`<title>${escapeXml(model.title)}</title>`);
  out.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`);
  out.push(`<text x="${width / 2}" y="20" text-anchor="middle" font-size="14" font-weight="bold">${escapeXml(model.title)}</text>`);
  // Grid and ticks.
  for (const t of axisTicks(model.x.scale, xr[0], xr[1])) {
    const px = num(sx(t));
    out.push(`<line x1="${px}" y1="${MARGIN.top}" x2="${px}" y2="${num(MARGIN.top + plotH)}" stroke="#e2e2e2"/>`);
    out.push(`<text x="${px}" y="${num(MARGIN.top + plotH + 16)}" text-anchor="middle">${escapeXml(formatTick(t * (model.x.displayFactor ?? 1)))}</text>`);
  }
  for (const t of axisTicks(model.y.scale, yr[0], yr[1])) {
    const py = num(sy(t));
    out.push(`<line x1="${MARGIN.left}" y1="${py}" x2="${num(MARGIN.left + plotW)}" y2="${py}" stroke="#e2e2e2"/>`);
    out.push(`<text x="${MARGIN.left - 6}" y="${py}" text-anchor="end" dominant-baseline="middle">${escapeXml(formatTick(t * (model.y.displayFactor ?? 1)))}</text>`);
  }
  out.push(`<rect x="${MARGIN.left}" y="${MARGIN.top}" width="${plotW}" height="${num(plotH)}" fill="none" stroke="#333333"/>`);
  out.push(`<text x="${num(MARGIN.left + plotW / 2)}" y="${num(MARGIN.top + plotH + 36)}" text-anchor="middle">${escapeXml(model.x.label)}</text>`);
  out.push(
    `<text transform="translate(16 ${num(MARGIN.top + plotH / 2)}) rotate(-90)" text-anchor="middle">${escapeXml(model.y.label)}</text>`,
  );
  // Data, clipped to the plot area.
  out.push(`<clipPath id="plot-area"><rect x="${MARGIN.left}" y="${MARGIN.top}" width="${plotW}" height="${num(plotH)}"/></clipPath>`);
  out.push(`<g clip-path="url(#plot-area)">`);
  if (model.heatmap) out.push(...heatmapSvg(model, sx, sy));
  for (const s of model.series) out.push(...seriesSvg(s, model, sx, sy));
  out.push(`</g>`);
  // Legend under the plot, three entries per row.
  model.series.forEach((s, i) => {
    const col = i % 3;
    const row = Math.floor(i / 3);
    const lx = MARGIN.left + col * (plotW / 3);
    const ly = MARGIN.top + plotH + 48 + row * 16;
    out.push(`<rect x="${num(lx)}" y="${num(ly - 8)}" width="14" height="8" fill="${escapeXml(s.color)}" fill-opacity="${s.kind === 'band' ? 0.3 : 1}"/>`);
    out.push(`<text x="${num(lx + 20)}" y="${num(ly)}">${escapeXml(s.label)}</text>`);
  });
  out.push(`</svg>`);
  return out.join('\n') + '\n';
}

function seriesSvg(s: PlotSeries, model: PlotModel, sx: (v: number) => number, sy: (v: number) => number): string[] {
  const okX = (v: number) => usableOnAxis(v, model.x.scale);
  const okY = (v: number) => usableOnAxis(v, model.y.scale);
  const color = escapeXml(s.color);
  const dash = s.dash?.length ? ` stroke-dasharray="${s.dash.join(' ')}"` : '';
  const widthAttr = s.width ?? 2;
  const parts: string[] = [];
  if (s.kind === 'line') {
    for (const run of runs(s.x, s.y, okX, okY)) {
      const d = run.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${num(sx(x))} ${num(sy(y))}`).join(' ');
      parts.push(`<path d="${d}" fill="none" stroke="${color}" stroke-width="${widthAttr}"${dash}/>`);
    }
  } else if (s.kind === 'points') {
    s.x.forEach((x, i) => {
      if (okX(x) && okY(s.y[i])) parts.push(`<circle cx="${num(sx(x))}" cy="${num(sy(s.y[i]))}" r="3.5" fill="${color}"/>`);
    });
  } else if (s.kind === 'band') {
    const lo = s.yLow ?? [];
    const hi = s.yHigh ?? [];
    const idx = s.x.map((_, i) => i).filter((i) => okX(s.x[i]) && okY(lo[i]) && okY(hi[i]));
    if (idx.length >= 2) {
      const upper = idx.map((i) => `${num(sx(s.x[i]))} ${num(sy(hi[i]))}`);
      const lower = idx.reverse().map((i) => `${num(sx(s.x[i]))} ${num(sy(lo[i]))}`);
      parts.push(`<path d="M${upper.join(' L')} L${lower.join(' L')} Z" fill="${color}" fill-opacity="0.25" stroke="none"/>`);
    }
  } else {
    const lo = s.yLow ?? [];
    const hi = s.yHigh ?? [];
    s.x.forEach((x, i) => {
      if (!okX(x) || !okY(lo[i]) || !okY(hi[i])) return;
      const px = num(sx(x));
      parts.push(`<line x1="${px}" y1="${num(sy(lo[i]))}" x2="${px}" y2="${num(sy(hi[i]))}" stroke="${color}" stroke-width="${widthAttr}"/>`);
      for (const end of [lo[i], hi[i]]) {
        parts.push(`<line x1="${num(sx(x) - 4)}" y1="${num(sy(end))}" x2="${num(sx(x) + 4)}" y2="${num(sy(end))}" stroke="${color}" stroke-width="${widthAttr}"/>`);
      }
      if (okY(s.y[i])) parts.push(`<rect x="${num(sx(x) - 4)}" y="${num(sy(s.y[i]) - 4)}" width="8" height="8" fill="${color}"/>`);
    });
  }
  return parts;
}

function heatmapSvg(model: PlotModel, sx: (v: number) => number, sy: (v: number) => number): string[] {
  const h = model.heatmap!;
  const xe = cellEdges(h.x, model.x.scale);
  const ye = cellEdges(h.y, model.y.scale);
  const zmax = Math.max(...h.z.filter(Number.isFinite), 0) || 1;
  const parts: string[] = [];
  for (let j = 0; j < h.y.length; j++) {
    for (let i = 0; i < h.x.length; i++) {
      const z = h.z[i + h.x.length * j];
      if (!Number.isFinite(z) || z <= 0) continue;
      const x0 = sx(xe[i]);
      const x1 = sx(xe[i + 1]);
      const y0 = sy(ye[j + 1]);
      const y1 = sy(ye[j]);
      parts.push(`<rect x="${num(x0)}" y="${num(y0)}" width="${num(x1 - x0 + 0.3)}" height="${num(y1 - y0 + 0.3)}" fill="${heatColor(z / zmax)}"/>`);
    }
  }
  return parts;
}

/** Consecutive runs of usable points (a gap splits a curve). */
function runs(x: number[], y: number[], okX: (v: number) => boolean, okY: (v: number) => boolean): [number, number][][] {
  const out: [number, number][][] = [];
  let cur: [number, number][] = [];
  for (let i = 0; i < x.length; i++) {
    if (okX(x[i]) && okY(y[i])) cur.push([x[i], y[i]]);
    else if (cur.length) {
      out.push(cur);
      cur = [];
    }
  }
  if (cur.length) out.push(cur);
  return out;
}

function axisRange(model: PlotModel, axis: 'x' | 'y'): [number, number] {
  const a = model[axis];
  const r = dataRange(model, axis) ?? (a.scale === 'log' ? [1, 10] : [0, 1]);
  let lo = a.min ?? r[0];
  let hi = a.max ?? r[1];
  if (a.scale === 'log') {
    // Pad a little in log space so curves do not touch the frame.
    const pad = (Math.log10(hi) - Math.log10(lo)) * 0.04 || 0.1;
    if (a.min === undefined) lo = 10 ** (Math.log10(lo) - pad);
    if (a.max === undefined) hi = 10 ** (Math.log10(hi) + pad);
  } else {
    const pad = (hi - lo) * 0.04 || 1;
    if (a.min === undefined) lo -= pad;
    if (a.max === undefined) hi += pad;
  }
  return [lo, hi];
}

function scaler(axis: PlotAxis, [lo, hi]: [number, number], p0: number, p1: number): (v: number) => number {
  if (axis.scale === 'log') {
    const l0 = Math.log10(lo);
    const span = Math.log10(hi) - l0;
    return (v) => p0 + ((Math.log10(v) - l0) / span) * (p1 - p0);
  }
  return (v) => p0 + ((v - lo) / (hi - lo)) * (p1 - p0);
}

function num(v: number): string {
  return Number.isFinite(v) ? String(Math.round(v * 100) / 100) : '0';
}
