// Reads a figure SVG written by web/plots/svgWriter.ts with an XML parser (linkedom): the page
// size, ticks with their labels, legend boxes and the boxes of the axis titles.
import { DOMParser } from 'linkedom';

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}
export interface SvgFigure {
  widthIn: number;
  viewBox: [number, number, number, number];
  ticks: { axis: 'x' | 'y'; value: number; major: boolean; label: string; scripts: string[] }[];
  legend: { label: string; text: string; box: Box; stroke: Stroke | null }[];
  /** The stroke each series is drawn with (its first line or path), by label. */
  series: { label: string; stroke: Stroke | null }[];
  plot: Box;
  xTitle: Box;
  yTitle: Box;
  text: string;
}

/** Colour, width and dash pattern of a stroked element ('' when solid). */
export interface Stroke {
  color: string;
  width: number;
  dash: string;
}

const strokeOf = (el: Element | null | undefined): Stroke | null =>
  el ? { color: el.getAttribute('stroke') ?? '', width: Number(el.getAttribute('stroke-width')), dash: el.getAttribute('stroke-dasharray') ?? '' } : null;

const box = (attr: string | null): Box => {
  const [x, y, w, h] = (attr ?? '').trim().split(/\s+/).map(Number);
  return { x, y, w, h };
};

export function readSvgFigure(svgText: string): SvgFigure {
  const doc = new DOMParser().parseFromString(svgText, 'image/svg+xml');
  const root = doc.documentElement;
  if (root.nodeName !== 'svg') throw new Error(`root is ${root.nodeName}`);
  const viewBox = (root.getAttribute('viewBox') ?? '').split(/\s+/).map(Number) as [number, number, number, number];
  const widthAttr = root.getAttribute('width') ?? '';
  if (!widthAttr.endsWith('in')) throw new Error(`width ${widthAttr} is not in inches`);
  const all = (sel: string) => [...doc.querySelectorAll(sel)];
  const ticks = all('[data-tick]').map((g) => {
    const label = g.querySelector('text');
    return {
      axis: g.getAttribute('data-tick') as 'x' | 'y',
      value: Number(g.getAttribute('data-value')),
      major: g.getAttribute('data-major') === '1',
      label: label?.textContent ?? '',
      scripts: label ? [...label.querySelectorAll('[data-shift="super"]')].map((t) => t.textContent ?? '') : [],
    };
  });
  const legend = all('[data-legend-entry]').map((g) => ({ label: g.getAttribute('data-label') ?? '', text: g.textContent ?? '', box: box(g.getAttribute('data-box')), stroke: strokeOf(g.querySelector('line')) }));
  const series = all('[data-series]').map((g) => ({ label: g.getAttribute('data-series') ?? '', stroke: strokeOf(g.querySelector('path, line')) }));
  const plotRect = doc.querySelector('[data-role="plot-area"]')!;
  const plot = { x: Number(plotRect.getAttribute('x')), y: Number(plotRect.getAttribute('y')), w: Number(plotRect.getAttribute('width')), h: Number(plotRect.getAttribute('height')) };
  return {
    widthIn: parseFloat(widthAttr),
    viewBox,
    ticks,
    legend,
    series,
    plot,
    xTitle: box(doc.querySelector('[data-role="x-title"]')?.getAttribute('data-box') ?? null),
    yTitle: box(doc.querySelector('[data-role="y-title"]')?.getAttribute('data-box') ?? null),
    text: root.textContent ?? '',
  };
}

export function inside(b: Box, outer: Box): boolean {
  return b.x >= outer.x - 1e-6 && b.y >= outer.y - 1e-6 && b.x + b.w <= outer.x + outer.w + 1e-6 && b.y + b.h <= outer.y + outer.h + 1e-6;
}

export function overlap(a: Box, b: Box): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}
