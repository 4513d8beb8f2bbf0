// The legend's sample of a series, drawn as the series is (colour, dash pattern, width): one
// description used by the figure writer (SVG) and by the chart on screen (a small canvas per
// legend entry), so the two legends and the plotted lines always agree.
import type { PlotSeries } from './plotModel';

export type SwatchShape =
  | { type: 'line'; x1: number; y1: number; x2: number; y2: number; stroke: string; width: number; dash: number[] }
  | { type: 'rect'; x: number; y: number; w: number; h: number; fill: string; fillOpacity: number; stroke?: string; strokeOpacity?: number; strokeWidth?: number }
  | { type: 'circle'; cx: number; cy: number; r: number; fill: string };

/** Width of a swatch for a legend font size (the same proportion on screen and in figures). */
export function swatchWidth(fontSize: number): number {
  return fontSize * 2.4;
}

/**
 * Shapes of a series' swatch, relative to its left end at the text's middle height (y = 0), for a
 * legend font size and the scale the figure applies to line widths and dashes.
 */
export function swatchShapes(s: PlotSeries, fontSize: number, lineScale: number): SwatchShape[] {
  const fs = fontSize;
  const w = swatchWidth(fs);
  const lw = (s.width ?? 2) * lineScale;
  if (s.kind === 'band') return [{ type: 'rect', x: 0, y: -fs * 0.35, w, h: fs * 0.7, fill: s.color, fillOpacity: 0.25, stroke: s.color, strokeOpacity: 0.6, strokeWidth: 0.5 * lineScale }];
  if (s.kind === 'points') return [{ type: 'circle', cx: w / 2, cy: 0, r: fs * 0.25, fill: s.color }];
  if (s.kind === 'interval') {
    const h = fs * 0.45;
    return [
      { type: 'line', x1: w / 2, y1: -h, x2: w / 2, y2: h, stroke: s.color, width: lw, dash: [] },
      { type: 'rect', x: w / 2 - fs * 0.2, y: -fs * 0.2, w: fs * 0.4, h: fs * 0.4, fill: s.color, fillOpacity: 1 },
    ];
  }
  return [{ type: 'line', x1: 0, y1: 0, x2: w, y2: 0, stroke: s.color, width: lw, dash: (s.dash ?? []).map((d) => d * lineScale) }];
}

/** Draws swatch shapes on a 2D canvas context with the origin at the swatch's left middle. */
export function drawSwatch(ctx: CanvasRenderingContext2D, shapes: SwatchShape[]): void {
  for (const sh of shapes) {
    ctx.save();
    if (sh.type === 'line') {
      ctx.strokeStyle = sh.stroke;
      ctx.lineWidth = sh.width;
      ctx.setLineDash(sh.dash);
      ctx.beginPath();
      ctx.moveTo(sh.x1, sh.y1);
      ctx.lineTo(sh.x2, sh.y2);
      ctx.stroke();
    } else if (sh.type === 'rect') {
      ctx.globalAlpha = sh.fillOpacity;
      ctx.fillStyle = sh.fill;
      ctx.fillRect(sh.x, sh.y, sh.w, sh.h);
      if (sh.stroke) {
        ctx.globalAlpha = sh.strokeOpacity ?? 1;
        ctx.strokeStyle = sh.stroke;
        ctx.lineWidth = sh.strokeWidth ?? 1;
        ctx.strokeRect(sh.x, sh.y, sh.w, sh.h);
      }
    } else {
      ctx.fillStyle = sh.fill;
      ctx.beginPath();
      ctx.arc(sh.cx, sh.cy, sh.r, 0, 2 * Math.PI);
      ctx.fill();
    }
    ctx.restore();
  }
}
