// Turns a PlotModel into a chart.js configuration (animation off, white page, our own colours).
import {
  Chart,
  LineController,
  ScatterController,
  LineElement,
  PointElement,
  LinearScale,
  LogarithmicScale,
  Legend,
  Tooltip,
  Filler,
  Title,
  type ChartConfiguration,
  type ChartDataset,
  type LegendItem,
  type Plugin,
} from 'chart.js';
import { cellEdges, displayRange, heatColor, usableOnAxis, type PlotAxis, type PlotModel } from './plotModel';
import { formatTick, ticksFor } from './axisTicks';
import { richRuns, SCRIPT_SCALE, unicodeText, type TextRun } from './figureText';
import { drawSwatch, swatchShapes, swatchWidth } from './legendSwatch';
import type { PlotSeries } from './plotModel';

Chart.register(LineController, ScatterController, LineElement, PointElement, LinearScale, LogarithmicScale, Legend, Tooltip, Filler, Title);

/** Paints the canvas white before drawing, so PNG exports and prints have a page behind them. */
export const whitePage: Plugin<'line'> = {
  id: 'strainsheetWhitePage',
  beforeDraw(chart) {
    const { ctx, width, height } = chart;
    ctx.save();
    ctx.globalCompositeOperation = 'destination-over';
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, width, height);
    ctx.restore();
  },
};

type Point = { x: number; y: number | null };

const drawnModels = new WeakMap<object, PlotModel>();

/** Tells the chart's layers which PlotModel it currently shows (call before update()). */
export function attachModel(chart: object, model: PlotModel): void {
  drawnModels.set(chart, model);
}

/** Draws the current PlotModel's heatmap under the datasets, using the chart's own scales. */
const heatmapLayer: Plugin<'line'> = {
    id: 'strainsheetHeatmap',
    beforeDatasetsDraw(chart) {
      const model = drawnModels.get(chart);
      const h = model?.heatmap;
      if (!model || !h) return;
      const xf = model.x.displayFactor ?? 1;
      const yf = model.y.displayFactor ?? 1;
      const xe = cellEdges(h.x, model.x.scale);
      const ye = cellEdges(h.y, model.y.scale);
      const zmax = Math.max(...h.z.filter(Number.isFinite), 0) || 1;
      const { ctx, chartArea, scales } = chart;
      ctx.save();
      ctx.beginPath();
      ctx.rect(chartArea.left, chartArea.top, chartArea.right - chartArea.left, chartArea.bottom - chartArea.top);
      ctx.clip();
      for (let j = 0; j < h.y.length; j++) {
        for (let i = 0; i < h.x.length; i++) {
          const z = h.z[i + h.x.length * j];
          if (!Number.isFinite(z) || z <= 0) continue;
          const x0 = scales.x.getPixelForValue(xe[i] * xf);
          const x1 = scales.x.getPixelForValue(xe[i + 1] * xf);
          const y0 = scales.y.getPixelForValue(ye[j + 1] * yf);
          const y1 = scales.y.getPixelForValue(ye[j] * yf);
          ctx.fillStyle = heatColor(z / zmax);
          ctx.fillRect(x0, y0, x1 - x0 + 0.5, y1 - y0 + 0.5);
        }
      }
      ctx.restore();
    },
};

function withAlpha(color: string, alpha: number): string {
  const m = /^#([0-9a-f]{6})$/i.exec(color);
  if (!m) return color;
  const n = parseInt(m[1], 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}

export function datasetsFor(model: PlotModel): ChartDataset<'line', Point[]>[] {
  const xf = model.x.displayFactor ?? 1;
  const yf = model.y.displayFactor ?? 1;
  const okX = (v: number) => usableOnAxis(v, model.x.scale);
  const okY = (v: number | undefined) => v !== undefined && usableOnAxis(v, model.y.scale);
  const sets: ChartDataset<'line', Point[]>[] = [];
  for (const original of model.series) {
    const s = { ...original, label: unicodeText(original.label) };
    const base = { borderColor: s.color, backgroundColor: s.color, borderWidth: s.width ?? 2, borderDash: s.dash ?? [] };
    // The dataset that stands for the series in the legend carries it, for its swatch.
    const legendOf = { series: original } as object;
    if (s.kind === 'line') {
      sets.push({
        ...base,
        ...legendOf,
        label: s.label,
        data: s.x.map((x, i) => ({ x: x * xf, y: okX(x) && okY(s.y[i]) ? s.y[i] * yf : null })),
        pointRadius: 0,
        spanGaps: false,
        tension: 0,
      });
    } else if (s.kind === 'points') {
      sets.push({
        ...base,
        ...legendOf,
        label: s.label,
        data: s.x.flatMap((x, i) => (okX(x) && okY(s.y[i]) ? [{ x: x * xf, y: s.y[i] * yf }] : [])),
        showLine: false,
        pointRadius: 4,
      });
    } else if (s.kind === 'band') {
      const lo = s.yLow ?? [];
      const hi = s.yHigh ?? [];
      const keep = s.x.map((x, i) => okX(x) && okY(lo[i]) && okY(hi[i]));
      sets.push({
        label: `${s.label} (lower)`,
        data: s.x.map((x, i) => ({ x: x * xf, y: keep[i] ? lo[i] * yf : null })),
        borderColor: withAlpha(s.color, 0.6),
        borderWidth: 1,
        pointRadius: 0,
        fill: false,
      });
      sets.push({
        ...legendOf,
        label: s.label,
        data: s.x.map((x, i) => ({ x: x * xf, y: keep[i] ? hi[i] * yf : null })),
        borderColor: withAlpha(s.color, 0.6),
        backgroundColor: withAlpha(s.color, 0.22),
        borderWidth: 1,
        pointRadius: 0,
        fill: '-1',
      });
    } else {
      // Vertical intervals as line segments separated by gaps, plus square markers at the centre.
      const lo = s.yLow ?? [];
      const hi = s.yHigh ?? [];
      const seg: Point[] = [];
      s.x.forEach((x, i) => {
        if (!okX(x) || !okY(lo[i]) || !okY(hi[i])) return;
        seg.push({ x: x * xf, y: lo[i] * yf }, { x: x * xf, y: hi[i] * yf }, { x: x * xf, y: null });
      });
      sets.push({ ...base, label: `${s.label} (interval)`, data: seg, pointRadius: 0, spanGaps: false });
      sets.push({
        ...base,
        ...legendOf,
        label: s.label,
        data: s.x.flatMap((x, i) => (okX(x) && okY(s.y[i]) ? [{ x: x * xf, y: s.y[i] * yf }] : [])),
        showLine: false,
        pointRadius: 5,
        pointStyle: 'rect',
      });
    }
  }
  return sets;
}

/** Font size of the axis titles on screen (px). */
const AXIS_TITLE_PX = 13;

/** Splits a title at spaces into lines no wider than `room` (a word longer than that keeps its own line). */
export function wrapTitle(text: string, room: number, measure: (s: string) => number): string[] {
  const words = text.split(/\s+/).filter(Boolean);
  const lines: string[] = [];
  for (const w of words) {
    const last = lines.at(-1);
    if (last !== undefined && measure(`${last} ${w}`) <= room) lines[lines.length - 1] = `${last} ${w}`;
    else lines.push(w);
  }
  return lines.length ? lines : [text];
}

/**
 * Axis titles never clipped: after a layout, a title longer than its axis (the y title of a short
 * plot, say) is wrapped onto lines that fit, and the chart is laid out once more. The lines are
 * kept on the canvas (data-y-title-lines) for the browser tests.
 */
const wrapAxisTitles: Plugin<'line'> = {
  id: 'strainsheetWrapAxisTitles',
  afterLayout(chart) {
    const { ctx, chartArea } = chart;
    let changed = false;
    for (const id of ['x', 'y'] as const) {
      const title = chart.options.scales?.[id]?.title as { text?: string | string[]; font?: { size?: number } } | undefined;
      if (!title?.text) continue;
      const full = fullTitles.get(chart)?.[id] ?? (Array.isArray(title.text) ? title.text.join(' ') : title.text);
      fullTitles.set(chart, { ...fullTitles.get(chart), [id]: full });
      const room = (id === 'y' ? chartArea.bottom - chartArea.top : chartArea.right - chartArea.left) - 4;
      if (!(room > 0)) continue;
      ctx.save();
      ctx.font = `${title.font?.size ?? AXIS_TITLE_PX}px ${Chart.defaults.font.family}`;
      const lines = ctx.measureText(full).width <= room ? [full] : wrapTitle(full, room, (s) => ctx.measureText(s).width);
      ctx.restore();
      const now = Array.isArray(title.text) ? title.text : [title.text];
      if (now.length !== lines.length || now.some((l, i) => l !== lines[i])) {
        title.text = lines.length === 1 ? lines[0] : lines;
        changed = true;
      }
      if (id === 'y') chart.canvas.dataset.yTitleLines = JSON.stringify(lines);
    }
    // A chart destroyed meanwhile (its panel closed) has no canvas any more: nothing to lay out.
    if (changed) queueMicrotask(() => chart.canvas && chart.update('none'));
  },
};

/** Colour of axis titles, drawn by richAxisTitles (chart.js draws them invisibly, keeping their place). */
const TITLE_INK = '#1f2a36';

/** Draws one line of rich text centred at (0, 0) of the current transform, baseline middle. */
function drawRuns(ctx: CanvasRenderingContext2D, runs: TextRun[], size: number, family: string, weight = 'normal', align: 'center' | 'left' = 'center'): void {
  const fontOf = (r: TextRun) => `${weight} ${r.shift === 'normal' ? size : size * SCRIPT_SCALE}px ${family}`;
  const widths = runs.map((r) => {
    ctx.font = fontOf(r);
    return ctx.measureText(r.text).width;
  });
  let x = align === 'left' ? 0 : -widths.reduce((a, b) => a + b, 0) / 2;
  runs.forEach((r, i) => {
    ctx.font = fontOf(r);
    const dy = r.shift === 'sub' ? size * 0.3 : r.shift === 'super' ? -size * 0.38 : 0;
    ctx.fillText(r.text, x, dy);
    x += widths[i];
  });
}

/**
 * Axis titles in the trade's notation on screen, as in the figures (figureText.ts): h_c with a
 * subscript c, Omega_gw as Ω with subscript gw. Chart.js lays the title out (and draws it in a
 * transparent colour); this draws the rich text in its place, line by line (core.scale drawTitle's
 * geometry: the left title rotated a quarter turn, lines one line height apart).
 */
const richAxisTitles: Plugin<'line'> = {
  id: 'strainsheetRichAxisTitles',
  afterDraw(chart) {
    const { ctx } = chart;
    for (const id of ['x', 'y'] as const) {
      const scale = chart.scales[id];
      const title = (scale?.options as { title?: unknown } | undefined)?.title as { display?: boolean; text?: string | string[]; font?: { size?: number }; padding?: number | { top?: number; bottom?: number } } | undefined;
      if (!scale || !title?.display || !title.text) continue;
      const lines = Array.isArray(title.text) ? title.text : [title.text];
      const size = title.font?.size ?? AXIS_TITLE_PX;
      const lineHeight = size * 1.2;
      const pad = typeof title.padding === 'number' ? { top: title.padding, bottom: title.padding } : { top: title.padding?.top ?? 4, bottom: title.padding?.bottom ?? 4 };
      const runs = lines.map((l) => richRuns(l));
      ctx.save();
      ctx.fillStyle = TITLE_INK;
      ctx.textBaseline = 'middle';
      ctx.textAlign = 'left';
      runs.forEach((line, k) => {
        ctx.save();
        if (id === 'y') {
          ctx.translate(scale.left + lineHeight / 2 + pad.top + k * lineHeight, (scale.top + scale.bottom) / 2);
          ctx.rotate(-Math.PI / 2);
        } else {
          const offset = lineHeight / 2 + pad.bottom + lineHeight * (lines.length - 1);
          ctx.translate((scale.left + scale.right) / 2, scale.bottom - offset + k * lineHeight);
        }
        drawRuns(ctx, line, size, Chart.defaults.font.family ?? 'sans-serif');
        ctx.restore();
      });
      ctx.restore();
      chart.canvas.dataset[`${id}TitleRuns`] = JSON.stringify(runs);
    }
    // Legend entries with scripts (h_c²), drawn where the legend put their (transparent) text:
    // after the sample and half a font size, in the middle of the entry's box.
    const legend = chart.legend as unknown as { legendItems?: LegendItem[]; legendHitBoxes?: { left: number; top: number; height: number }[] } | undefined;
    const items = legend?.legendItems ?? [];
    const richLegend: TextRun[][] = [];
    items.forEach((item, i) => {
      const box = legend?.legendHitBoxes?.[i];
      if (!box || !RICH_LEGEND.has(item)) return;
      const runs = richRuns(item.text);
      ctx.save();
      ctx.fillStyle = TITLE_INK;
      ctx.textBaseline = 'middle';
      ctx.translate(box.left + swatchWidth(LEGEND_FONT_PX) + LEGEND_FONT_PX / 2, box.top + box.height / 2);
      drawRuns(ctx, runs, LEGEND_FONT_PX, Chart.defaults.font.family ?? 'sans-serif', 'normal', 'left');
      ctx.restore();
      richLegend.push(runs);
    });
    chart.canvas.dataset.legendRuns = JSON.stringify(richLegend);
    // The plot's title, in the middle of the box the title plugin laid out.
    const block = (chart as unknown as { titleBlock?: { left: number; right: number; top: number; bottom: number; options: { display?: boolean; text?: string | string[]; font?: { size?: number; weight?: string } } } }).titleBlock;
    const text = block?.options.display ? block.options.text : undefined;
    if (block && typeof text === 'string' && text) {
      const size = block.options.font?.size ?? 14;
      ctx.save();
      ctx.fillStyle = TITLE_INK;
      ctx.textBaseline = 'middle';
      ctx.translate((block.left + block.right) / 2, (block.top + block.bottom) / 2);
      drawRuns(ctx, richRuns(text), size, Chart.defaults.font.family ?? 'sans-serif', String(block.options.font?.weight ?? 'bold'));
      ctx.restore();
      chart.canvas.dataset.titleRuns = JSON.stringify(richRuns(text));
    }
  },
};

/** The whole title of each axis, before wrapping (the options hold the wrapped lines). */
const fullTitles = new WeakMap<object, { x?: string; y?: string }>();

/** Forgets the wrapped titles of a chart (call when it shows a new model). */
export function resetAxisTitles(chart: object): void {
  fullTitles.delete(chart);
}

/** Font size of the legend on screen (px). */
const LEGEND_FONT_PX = 12;

/** A swatch as a small canvas, for chart.js to draw as the entry's point style. */
function swatchImage(series: PlotSeries): HTMLCanvasElement | undefined {
  if (typeof document === 'undefined') return undefined;
  const w = swatchWidth(LEGEND_FONT_PX);
  const h = LEGEND_FONT_PX;
  const canvas = document.createElement('canvas');
  canvas.width = Math.ceil(w);
  canvas.height = h;
  const ctx = canvas.getContext('2d');
  if (!ctx) return undefined;
  ctx.translate(0, h / 2);
  drawSwatch(ctx, swatchShapes(series, LEGEND_FONT_PX, 1));
  return canvas;
}

const swatchCache = new WeakMap<PlotSeries, HTMLCanvasElement | undefined>();
/** Legend entries whose text richAxisTitles draws (in the trade's notation). */
const RICH_LEGEND = new WeakSet<LegendItem>();

/** Legend entries: one per series, with the series' own swatch. */
function legendItems(chart: Chart): LegendItem[] {
  const base = Chart.defaults.plugins.legend.labels.generateLabels(chart);
  return base.map((item) => {
    const series = (chart.data.datasets[item.datasetIndex ?? -1] as { series?: PlotSeries } | undefined)?.series;
    if (!series) return item;
    if (!swatchCache.has(series)) swatchCache.set(series, swatchImage(series));
    const image = swatchCache.get(series);
    const withSwatch = image ? { ...item, pointStyle: image, lineWidth: 0 } : item;
    // Text with sub- or superscripts is drawn by richAxisTitles; chart.js keeps its place.
    if (!richRuns(item.text).some((r) => r.shift !== 'normal')) return withSwatch;
    const rich = { ...withSwatch, fontColor: 'rgba(0, 0, 0, 0)' };
    RICH_LEGEND.add(rich);
    return rich;
  });
}

/** A chart.js scale showing the same range and ticks as the figure writer (axisTicks.ts, displayRange). */
function scaleFor(model: PlotModel, which: 'x' | 'y') {
  const axis: PlotAxis = model[which];
  const f = axis.displayFactor ?? 1;
  const [lo, hi] = displayRange(model, which);
  const ticks = ticksFor(axis.scale, lo * f, hi * f);
  const labels = new Map(ticks.map((t) => [t.value, unicodeText(t.label)]));
  const majors = new Set(ticks.filter((t) => t.major).map((t) => t.value));
  return {
    type: axis.scale === 'log' ? ('logarithmic' as const) : ('linear' as const),
    min: lo * f,
    max: hi * f,
    // Drawn by richAxisTitles in the trade's notation; chart.js only keeps its place.
    title: { display: true, text: unicodeText(axis.label), color: 'rgba(0, 0, 0, 0)', font: { size: AXIS_TITLE_PX } },
    // Grid lines at the major ticks only; tick marks at every tick (minor ones too).
    grid: {
      color: (ctx: { tick?: { value: number } }) => (ctx.tick && majors.has(ctx.tick.value) ? '#e6e3dc' : 'rgba(0, 0, 0, 0)'),
      tickColor: '#3b4652',
    },
    afterBuildTicks: (scale: { ticks: { value: number; major?: boolean }[] }) => {
      scale.ticks = ticks.map((t) => ({ value: t.value, major: t.major }));
    },
    ticks: {
      color: '#3b4652',
      autoSkip: false,
      maxRotation: 0,
      callback: (v: number | string) => labels.get(Number(v)) ?? '',
    },
  };
}

export function chartConfig(model: PlotModel, opts: { devicePixelRatio?: number; responsive?: boolean } = {}): ChartConfiguration<'line', Point[]> {
  return {
    type: 'line',
    data: { datasets: datasetsFor(model) },
    plugins: [whitePage, heatmapLayer, wrapAxisTitles, richAxisTitles],
    options: {
      animation: false,
      responsive: opts.responsive ?? true,
      maintainAspectRatio: false,
      devicePixelRatio: opts.devicePixelRatio,
      parsing: false,
      normalized: true,
      interaction: { mode: 'nearest', intersect: false },
      scales: {
        // A map fills its grid exactly; other plots let linear axes end on round ticks.
        x: scaleFor(model, 'x'),
        y: scaleFor(model, 'y'),
      },
      plugins: {
        // Drawn by richAxisTitles in the trade's notation; chart.js only keeps its place.
        title: { display: true, text: unicodeText(model.title), color: 'rgba(0, 0, 0, 0)', font: { size: 14, weight: 'bold' } },
        legend: {
          position: 'bottom',
          labels: {
            color: '#1f2a36',
            font: { size: LEGEND_FONT_PX },
            // Each entry's sample is drawn as its series is (legendSwatch.ts, the same as in figures).
            usePointStyle: true,
            pointStyleWidth: swatchWidth(LEGEND_FONT_PX),
            generateLabels: legendItems,
            // Hide helper datasets (band lower edges, interval bars) from the legend.
            filter: (item) => !/\((lower|interval)\)$/.test(item.text),
          },
        },
        tooltip: {
          filter: (item) => !/\((lower|interval)\)$/.test(item.dataset.label ?? ''),
          callbacks: {
            label: (item) => `${item.dataset.label}: ${unicodeText(formatTick(item.parsed.y ?? NaN))} at ${unicodeText(formatTick(item.parsed.x ?? NaN))}`,
          },
        },
      },
    },
  };
}
