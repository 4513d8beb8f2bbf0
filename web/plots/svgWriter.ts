// Writes a PlotModel as a standalone SVG 1.1 figure (W3C SVG 1.1 Second Edition, 2011) at a
// chosen size (figureSizes.ts): our own serialiser of the plotted data, independent of the chart
// library and of the DOM (the command line uses it too). Ticks, the axis range and the legend's
// entries are the screen's (axisTicks.ts, displayRange, the model's series); text is set in the
// trade's notation with real sub- and superscripts (figureText.ts) and measured with the widths
// of the embedded font (textWidths.ts), so legends are laid out to fit: entries flow in rows,
// long ones wrap, and the figure grows to hold them. All text is escaped.
import { cellEdges, displayRange, heatColor, usableOnAxis, type PlotAxis, type PlotModel, type PlotSeries } from './plotModel';
import { ticksFor, type Tick } from './axisTicks';
import { richRuns, runsWidth, SCRIPT_SCALE, textWidth, type TextRun } from './figureText';
import { FIGURE_SIZES, type FigureSize, type FigureSizeId } from './figureSizes';
import { FONT_NAME } from './textWidths';
import { swatchShapes, swatchWidth } from './legendSwatch';

export interface SvgOptions {
  size?: FigureSizeId | FigureSize;
}

/** Escapes text for XML character data and attribute values (XML 1.0, section 2.4). */
export function escapeXml(text: string): string {
  return text.replace(/[<>&"']/g, (c) => (c === '<' ? '&lt;' : c === '>' ? '&gt;' : c === '&' ? '&amp;' : c === '"' ? '&quot;' : '&apos;'));
}

/** Where things went, for tests and for the PDF/PNG writers (points, SVG user units). */
export interface FigureLayout {
  width: number;
  height: number;
  plot: Box;
  legend: Box[];
  xTitle: Box;
  yTitle: Box;
}
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

const INK = '#1f2a36';

export function plotToSvg(model: PlotModel, opts: SvgOptions = {}): string {
  return plotFigure(model, opts).svg;
}

export function plotFigure(model: PlotModel, opts: SvgOptions = {}): { svg: string; layout: FigureLayout } {
  const size = typeof opts.size === 'object' ? opts.size : FIGURE_SIZES[opts.size ?? 'screen'];
  const W = round(size.widthIn * 72);
  const pad = size.labelPt * 0.6;
  const tickLen = size.tickPt * 0.5;
  const minorLen = tickLen * 0.55;
  const xf = model.x.displayFactor ?? 1;
  const yf = model.y.displayFactor ?? 1;
  const xr = displayRange(model, 'x');
  const yr = displayRange(model, 'y');
  const xTicks = ticksFor(model.x.scale, xr[0] * xf, xr[1] * xf);
  const yTicks = ticksFor(model.y.scale, yr[0] * yf, yr[1] * yf);
  const tickRuns = (t: Tick) => richRuns(t.label);
  const yLabelW = Math.max(0, ...yTicks.filter((t) => t.label).map((t) => runsWidth(tickRuns(t), size.tickPt)));
  const xLast = xTicks.filter((t) => t.label).at(-1);
  const xLastW = xLast ? runsWidth(tickRuns(xLast), size.tickPt) : 0;

  const titleH = size.title ? size.titlePt * 1.8 : 0;
  const yTitleRuns = richRuns(model.y.label);
  const lineH = size.labelPt * 1.2;
  const right = Math.max(pad, xLastW / 2 + pad * 0.5);
  const top = titleH + Math.max(pad, size.tickPt * 0.7);
  // The y title wraps onto more lines when it is longer than the plot is high (never clipped).
  let yLines: TextRun[][] = [yTitleRuns];
  let left = 0;
  let plotW = 0;
  let plotH = 0;
  for (let pass = 0; pass < 3; pass++) {
    left = pad + size.labelPt * 0.25 + yLines.length * lineH + pad * 0.6 + yLabelW + tickLen + size.tickPt * 0.35;
    plotW = W - left - right;
    plotH = plotW * size.plotAspect;
    const next = wrapRuns(yTitleRuns, size.labelPt, plotH);
    if (next.length === yLines.length) break;
    yLines = next;
  }
  const plot: Box = { x: left, y: top, w: plotW, h: plotH };
  const xTickBaseline = top + plotH + tickLen + size.tickPt * 1.15;
  const xTitleRuns = richRuns(model.x.label);
  const xLines = wrapRuns(xTitleRuns, size.labelPt, W - 2 * pad);
  const xTitleBaseline = xTickBaseline + size.labelPt * 1.55;
  const xTitleW = Math.max(...xLines.map((l) => runsWidth(l, size.labelPt)));
  const xTitle: Box = { x: left + plotW / 2 - xTitleW / 2, y: xTitleBaseline - size.labelPt * 0.8, w: xTitleW, h: size.labelPt * 0.25 + xLines.length * lineH };
  const yTitleW = Math.max(...yLines.map((l) => runsWidth(l, size.labelPt)));
  const yTitleBaseline = pad + size.labelPt * 0.85;
  const yTitle: Box = { x: yTitleBaseline - size.labelPt * 0.8, y: top + plotH / 2 - yTitleW / 2, w: size.labelPt * 0.25 + yLines.length * lineH, h: yTitleW };

  const legendTop = xTitleBaseline + (xLines.length - 1) * lineH + size.labelPt * 0.9;
  const legend = layoutLegend(model.series, size, left - size.labelPt, W - pad - (left - size.labelPt), legendTop);
  const legendBottom = legend.length ? Math.max(...legend.map((e) => e.box.y + e.box.h)) : legendTop;
  const H = round(legendBottom + pad);

  const sx = scaler(model.x, [xr[0] * xf, xr[1] * xf], left, left + plotW);
  const sy = scaler(model.y, [yr[0] * yf, yr[1] * yf], top + plotH, top);
  const px = (v: number) => sx(v * xf);
  const py = (v: number) => sy(v * yf);

  const out: string[] = [];
  out.push(`<?xml version="1.0" encoding="UTF-8"?>`);
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="${num(W / 72)}in" height="${num(H / 72)}in" viewBox="0 0 ${num(W)} ${num(H)}" font-family="${FONT_NAME}, sans-serif" font-size="${size.labelPt}" data-size="${size.id}">`,
  );
  out.push(`<title>${escapeXml(model.title)}</title>`);
  out.push(`<rect x="0" y="0" width="${num(W)}" height="${num(H)}" fill="#ffffff"/>`);
  if (size.title) out.push(textSvg(richRuns(model.title), W / 2, size.titlePt * 1.25, size.titlePt, 'middle', ' data-role="title"'));
  // Grid lines under the data, then the data (clipped to the plot area), then frame and ticks.
  for (const t of xTicks) if (t.major) out.push(`<line x1="${num(sx(t.value))}" y1="${num(top)}" x2="${num(sx(t.value))}" y2="${num(top + plotH)}" stroke="#e6e3dc" stroke-width="${num(0.6 * size.lineScale)}"/>`);
  for (const t of yTicks) if (t.major) out.push(`<line x1="${num(left)}" y1="${num(sy(t.value))}" x2="${num(left + plotW)}" y2="${num(sy(t.value))}" stroke="#e6e3dc" stroke-width="${num(0.6 * size.lineScale)}"/>`);
  out.push(`<clipPath id="plot-area"><rect x="${num(left)}" y="${num(top)}" width="${num(plotW)}" height="${num(plotH)}"/></clipPath>`);
  out.push(`<g clip-path="url(#plot-area)">`);
  if (model.heatmap) out.push(...heatmapSvg(model, px, py));
  // Bands first, so they never tint the curves drawn over them.
  const drawOrder = [...model.series.filter((x) => x.kind === 'band'), ...model.series.filter((x) => x.kind !== 'band')];
  for (const s of drawOrder) out.push(`<g data-series="${escapeXml(s.label)}">`, ...seriesSvg(s, model, px, py, size.lineScale), `</g>`);
  out.push(`</g>`);
  out.push(`<rect x="${num(left)}" y="${num(top)}" width="${num(plotW)}" height="${num(plotH)}" fill="none" stroke="${INK}" stroke-width="${num(0.8 * size.lineScale + 0.2)}" data-role="plot-area"/>`);
  for (const t of xTicks) {
    const x = sx(t.value);
    const len = t.major ? tickLen : minorLen;
    out.push(`<g data-tick="x" data-value="${t.value}" data-major="${t.major ? 1 : 0}">`);
    out.push(`<line x1="${num(x)}" y1="${num(top + plotH)}" x2="${num(x)}" y2="${num(top + plotH - len)}" stroke="${INK}" stroke-width="${num(0.6 * size.lineScale + 0.2)}"/>`);
    out.push(`<line x1="${num(x)}" y1="${num(top)}" x2="${num(x)}" y2="${num(top + len)}" stroke="${INK}" stroke-width="${num(0.6 * size.lineScale + 0.2)}"/>`);
    if (t.label) out.push(textSvg(tickRuns(t), x, xTickBaseline, size.tickPt, 'middle', ' data-role="tick-label"'));
    out.push(`</g>`);
  }
  for (const t of yTicks) {
    const y = sy(t.value);
    const len = t.major ? tickLen : minorLen;
    out.push(`<g data-tick="y" data-value="${t.value}" data-major="${t.major ? 1 : 0}">`);
    out.push(`<line x1="${num(left)}" y1="${num(y)}" x2="${num(left + len)}" y2="${num(y)}" stroke="${INK}" stroke-width="${num(0.6 * size.lineScale + 0.2)}"/>`);
    out.push(`<line x1="${num(left + plotW)}" y1="${num(y)}" x2="${num(left + plotW - len)}" y2="${num(y)}" stroke="${INK}" stroke-width="${num(0.6 * size.lineScale + 0.2)}"/>`);
    if (t.label) out.push(textSvg(tickRuns(t), left - size.tickPt * 0.35, y + size.tickPt * 0.35, size.tickPt, 'end', ' data-role="tick-label"'));
    out.push(`</g>`);
  }
  out.push(`<g data-role="x-title" data-box="${boxAttr(xTitle)}">`);
  xLines.forEach((l, k) => out.push(textSvg(l, left + plotW / 2, xTitleBaseline + k * lineH, size.labelPt, 'middle', '')));
  out.push(`</g>`);
  out.push(`<g transform="translate(${num(yTitleBaseline)} ${num(top + plotH / 2)}) rotate(-90)" data-role="y-title" data-box="${boxAttr(yTitle)}">`);
  yLines.forEach((l, k) => out.push(textSvg(l, 0, k * lineH, size.labelPt, 'middle', '')));
  out.push(`</g>`);
  legend.forEach((e, i) => {
    out.push(`<g data-legend-entry="${i}" data-label="${escapeXml(e.series.label)}" data-box="${boxAttr(e.box)}">`);
    out.push(...swatchSvg(e.series, e.box.x, e.box.y + size.legendPt * 0.62, size));
    e.lines.forEach((line, k) => out.push(textSvg(line, e.textX, e.box.y + size.legendPt * (0.95 + 1.25 * k), size.legendPt, 'start', '')));
    out.push(`</g>`);
  });
  out.push(`</svg>`);
  return { svg: out.join('\n') + '\n', layout: { width: W, height: H, plot, legend: legend.map((e) => e.box), xTitle, yTitle } };
}

interface LegendEntry {
  series: PlotSeries;
  box: Box;
  textX: number;
  lines: TextRun[][];
}

/** Legend entries in rows under the plot; an entry too long for a row is wrapped at spaces. */
function layoutLegend(series: PlotSeries[], size: FigureSize, x0: number, width: number, top: number): LegendEntry[] {
  const fs = size.legendPt;
  const swatch = swatchWidth(fs);
  const gap = fs * 0.5;
  const colGap = fs * 1.4;
  const lineH = fs * 1.25;
  const out: LegendEntry[] = [];
  let x = x0;
  let y = top;
  let rowH = 0;
  for (const s of series) {
    const maxText = width - swatch - gap;
    const lines = wrapRuns(richRuns(s.label), fs, maxText);
    const textW = Math.max(...lines.map((l) => runsWidth(l, fs)));
    const w = swatch + gap + textW;
    const h = lines.length * lineH;
    if (x > x0 && x + w > x0 + width) {
      x = x0;
      y += rowH + fs * 0.35;
      rowH = 0;
    }
    out.push({ series: s, box: { x, y, w, h }, textX: x + swatch + gap, lines });
    x += w + colGap;
    rowH = Math.max(rowH, h);
  }
  return out;
}

/** Breaks rich text into lines no wider than maxWidth, at spaces (a single long word stays whole). */
function wrapRuns(runs: TextRun[], fs: number, maxWidth: number): TextRun[][] {
  if (runsWidth(runs, fs) <= maxWidth) return [runs];
  // Words keep their runs: split normal runs at spaces.
  const words: TextRun[][] = [[]];
  for (const r of runs) {
    if (r.shift !== 'normal') {
      words.at(-1)!.push(r);
      continue;
    }
    r.text.split(/(?<= )/).forEach((piece, i) => {
      if (i > 0) words.push([]);
      if (piece) words.at(-1)!.push({ text: piece, shift: 'normal' });
    });
  }
  const lines: TextRun[][] = [[]];
  for (const w of words) {
    const cur = lines.at(-1)!;
    if (cur.length && runsWidth([...cur, ...w], fs) > maxWidth) lines.push([...w]);
    else cur.push(...w);
  }
  return lines.map((l) => trimEnd(l));
}

function trimEnd(line: TextRun[]): TextRun[] {
  const out = line.map((r) => ({ ...r }));
  const last = out.at(-1);
  if (last && last.shift === 'normal') last.text = last.text.replace(/\s+$/, '');
  return out.filter((r) => r.text);
}

/**
 * Rich text as one <text> whose runs are <tspan>s with absolute x and y (no text-anchor and no
 * relative shifts, so every SVG and PDF reader puts each run where our widths say).
 */
function textSvg(runs: TextRun[], x: number, y: number, fs: number, anchor: 'start' | 'middle' | 'end', attrs: string): string {
  const w = runsWidth(runs, fs);
  let cx = anchor === 'start' ? x : anchor === 'middle' ? x - w / 2 : x - w;
  const parts: string[] = [];
  for (const r of runs) {
    const size = r.shift === 'normal' ? fs : fs * SCRIPT_SCALE;
    const dy = r.shift === 'sub' ? fs * 0.28 : r.shift === 'super' ? -fs * 0.38 : 0;
    parts.push(`<tspan x="${num(cx)}" y="${num(y + dy)}" font-size="${num(size)}"${r.shift !== 'normal' ? ` data-shift="${r.shift}"` : ''}>${escapeXml(r.text)}</tspan>`);
    cx += textWidth(r.text, size);
  }
  return `<text x="${num(anchor === 'start' ? x : anchor === 'middle' ? x - w / 2 : x - w)}" y="${num(y)}" font-size="${num(fs)}" fill="${INK}" xml:space="preserve"${attrs}>${parts.join('')}</text>`;
}

/** The legend's sample of a series, drawn as the series is (legendSwatch.ts, shared with the screen). */
function swatchSvg(s: PlotSeries, x: number, yMid: number, size: FigureSize): string[] {
  return swatchShapes(s, size.legendPt, size.lineScale).map((sh) => {
    if (sh.type === 'line') {
      const dash = sh.dash.length ? ` stroke-dasharray="${sh.dash.map(num).join(' ')}"` : '';
      return `<line x1="${num(x + sh.x1)}" y1="${num(yMid + sh.y1)}" x2="${num(x + sh.x2)}" y2="${num(yMid + sh.y2)}" stroke="${escapeXml(sh.stroke)}" stroke-width="${num(sh.width)}"${dash}/>`;
    }
    if (sh.type === 'circle') return `<circle cx="${num(x + sh.cx)}" cy="${num(yMid + sh.cy)}" r="${num(sh.r)}" fill="${escapeXml(sh.fill)}"/>`;
    const opacity = sh.fillOpacity === 1 ? '' : ` fill-opacity="${num(sh.fillOpacity)}"`;
    const stroke = sh.stroke ? ` stroke="${escapeXml(sh.stroke)}" stroke-opacity="${num(sh.strokeOpacity ?? 1)}" stroke-width="${num(sh.strokeWidth ?? 1)}"` : '';
    return `<rect x="${num(x + sh.x)}" y="${num(yMid + sh.y)}" width="${num(sh.w)}" height="${num(sh.h)}" fill="${escapeXml(sh.fill)}"${opacity}${stroke}/>`;
  });
}

function seriesSvg(s: PlotSeries, model: PlotModel, sx: (v: number) => number, sy: (v: number) => number, lineScale: number): string[] {
  const okX = (v: number) => usableOnAxis(v, model.x.scale);
  const okY = (v: number) => usableOnAxis(v, model.y.scale);
  const color = escapeXml(s.color);
  const dash = s.dash?.length ? ` stroke-dasharray="${s.dash.map((d) => num(d * lineScale)).join(' ')}"` : '';
  const widthAttr = num((s.width ?? 2) * lineScale);
  const parts: string[] = [];
  if (s.kind === 'line') {
    for (const run of runs(s.x, s.y, okX, okY)) {
      const d = run.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${num(sx(x))} ${num(sy(y))}`).join(' ');
      parts.push(`<path d="${d}" fill="none" stroke="${color}" stroke-width="${widthAttr}" stroke-linejoin="round"${dash}/>`);
    }
  } else if (s.kind === 'points') {
    s.x.forEach((x, i) => {
      if (okX(x) && okY(s.y[i])) parts.push(`<circle cx="${num(sx(x))}" cy="${num(sy(s.y[i]))}" r="${num(3.5 * lineScale)}" fill="${color}"/>`);
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
    const cap = 4 * lineScale;
    s.x.forEach((x, i) => {
      if (!okX(x) || !okY(lo[i]) || !okY(hi[i])) return;
      const px = num(sx(x));
      parts.push(`<line x1="${px}" y1="${num(sy(lo[i]))}" x2="${px}" y2="${num(sy(hi[i]))}" stroke="${color}" stroke-width="${widthAttr}"/>`);
      for (const end of [lo[i], hi[i]]) {
        parts.push(`<line x1="${num(sx(x) - cap)}" y1="${num(sy(end))}" x2="${num(sx(x) + cap)}" y2="${num(sy(end))}" stroke="${color}" stroke-width="${widthAttr}"/>`);
      }
      if (okY(s.y[i])) parts.push(`<rect x="${num(sx(x) - cap)}" y="${num(sy(s.y[i]) - cap)}" width="${num(2 * cap)}" height="${num(2 * cap)}" fill="${color}"/>`);
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

function scaler(axis: PlotAxis, [lo, hi]: [number, number], p0: number, p1: number): (v: number) => number {
  if (axis.scale === 'log') {
    const l0 = Math.log10(lo);
    const span = Math.log10(hi) - l0;
    return (v) => p0 + ((Math.log10(v) - l0) / span) * (p1 - p0);
  }
  return (v) => p0 + ((v - lo) / (hi - lo)) * (p1 - p0);
}

function boxAttr(b: Box): string {
  return `${num(b.x)} ${num(b.y)} ${num(b.w)} ${num(b.h)}`;
}

function round(v: number): number {
  return Math.round(v * 100) / 100;
}

function num(v: number): string {
  return Number.isFinite(v) ? String(Math.round(v * 100) / 100) : '0';
}
