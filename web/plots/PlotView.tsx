// A chart on screen for a PlotModel, with its export buttons: the figure at a chosen size (SVG,
// PDF, PNG at 300 dpi; figureExport.ts) and the plotted data (CSV).
import { createEffect, createSignal, For, onCleanup, onMount, Show, type Accessor } from 'solid-js';
import { Chart } from 'chart.js';
import { attachModel, chartConfig, resetAxisTitles } from './chartConfig';
import type { PlotModel } from './plotModel';
import { figurePdf, figurePng, figureSvg } from './figureExport';
import { FIGURE_SIZE_IDS, FIGURE_SIZES, type FigureSizeId } from './figureSizes';
import { plotToCsv } from '../files/csvText';
import { downloadBlob, downloadText, fileStem } from '../files/download';

export function PlotView(props: { model: Accessor<PlotModel>; onMessage?: (text: string) => void; height?: number; stale?: string | null }) {
  let canvas!: HTMLCanvasElement;
  let chart: Chart | undefined;
  let figureEl!: HTMLElement;
  const [size, setSize] = createSignal<FigureSizeId>('column');
  const [exporting, setExporting] = createSignal(false);

  onMount(() => {
    chart = new Chart(canvas, chartConfig(props.model()) as never);
    attachModel(chart, props.model());
    createEffect(() => {
      const model = props.model();
      if (!chart) return;
      const next = chartConfig(model);
      chart.data = next.data as never;
      chart.options = next.options as never;
      attachModel(chart, model);
      resetAxisTitles(chart);
      chart.update('none');
      // The labelled ticks the chart shows, for comparison with the exported figure (browser tests).
      for (const axis of ['x', 'y'] as const) {
        const ticks = chart.scales[axis]?.ticks ?? [];
        figureEl.dataset[`${axis}Ticks`] = JSON.stringify(ticks.filter((t) => t.label !== '' && t.label !== undefined).map((t) => t.value));
      }
      figureEl.dataset.legend = JSON.stringify((chart.legend?.legendItems ?? []).map((i) => i.text));
      // Where each legend entry is on the canvas (CSS px: left, top, width, height), to compare its swatch with the figure's.
      figureEl.dataset.legendBoxes = JSON.stringify(((chart.legend as unknown as { legendHitBoxes?: { left: number; top: number; width: number; height: number }[] } | undefined)?.legendHitBoxes ?? []).map((b) => [b.left, b.top, b.width, b.height]));
      // Read by the UI benchmark: the plot shows the latest edit.
      performance.mark(`strainsheet:plot-drawn:${model.id}`);
      if (performance.getEntriesByName('strainsheet:edit', 'mark').length) {
        performance.measure(`strainsheet:edit-to-plot:${model.id}`, 'strainsheet:edit', `strainsheet:plot-drawn:${model.id}`);
      }
    });
  });
  onCleanup(() => chart?.destroy());

  const stem = () => fileStem(props.model().title, 'plot');
  const exportFile = async (kind: 'PNG' | 'PDF') => {
    setExporting(true);
    try {
      const blob = kind === 'PNG' ? await figurePng(props.model(), size()) : await figurePdf(props.model(), size());
      downloadBlob(blob, `${stem()}-${size()}.${kind.toLowerCase()}`);
    } catch (err) {
      props.onMessage?.(`${kind} export failed: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      setExporting(false);
    }
  };

  return (
    <figure class="plot" classList={{ stale: !!props.stale }} data-plot={props.model().id} data-stale={props.stale ? 'true' : undefined} ref={figureEl}>
      <Show when={props.stale}>
        {(why) => (
          <div class="stale-note" role="status">
            last computed curves, not current: {why()}
          </div>
        )}
      </Show>
      <div class="plot-canvas" style={{ height: `${props.height ?? 380}px` }}>
        <canvas ref={canvas} aria-label={props.model().title} role="img" />
      </div>
      <Show when={props.model().notes.length}>
        <ul class="plot-notes">
          <For each={props.model().notes}>{(n) => <li>{n}</li>}</For>
        </ul>
      </Show>
      <figcaption class="plot-exports no-print">
        <span class="export-label">Export figure</span>
        <select aria-label="Figure size" data-figure-size value={size()} onChange={(e) => setSize(e.currentTarget.value as FigureSizeId)}>
          <For each={FIGURE_SIZE_IDS}>{(id) => <option value={id} selected={id === size()}>{FIGURE_SIZES[id].label}</option>}</For>
        </select>
        <button type="button" data-action="export-svg" onClick={() => downloadText(figureSvg(props.model(), size()), `${stem()}-${size()}.svg`, 'image/svg+xml')}>SVG</button>
        <button type="button" data-action="export-pdf" disabled={exporting()} onClick={() => void exportFile('PDF')}>PDF</button>
        <button type="button" data-action="export-png" disabled={exporting()} onClick={() => void exportFile('PNG')}>PNG 300 dpi</button>
        <button type="button" data-action="export-csv" onClick={() => downloadText(plotToCsv(props.model()), `${stem()}.csv`, 'text/csv')}>CSV data</button>
      </figcaption>
    </figure>
  );
}
