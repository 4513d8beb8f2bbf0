// A chart on screen for a PlotModel, with its export buttons (PNG at a chosen size, SVG, CSV).
import { createEffect, createSignal, For, onCleanup, onMount, Show, type Accessor } from 'solid-js';
import { Chart } from 'chart.js';
import { attachModel, chartConfig } from './chartConfig';
import type { PlotModel } from './plotModel';
import { plotToSvg } from './svgWriter';
import { plotToPng, PNG_SIZES } from './pngExport';
import { plotToCsv } from '../files/csvText';
import { downloadBlob, downloadText, fileStem } from '../files/download';

export function PlotView(props: { model: Accessor<PlotModel>; onMessage?: (text: string) => void; height?: number }) {
  let canvas!: HTMLCanvasElement;
  let chart: Chart | undefined;
  const [sizeIndex, setSizeIndex] = createSignal(1);

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
      chart.update('none');
      // Read by the UI benchmark: the plot shows the latest edit.
      performance.mark(`strainsheet:plot-drawn:${model.id}`);
      if (performance.getEntriesByName('strainsheet:edit', 'mark').length) {
        performance.measure(`strainsheet:edit-to-plot:${model.id}`, 'strainsheet:edit', `strainsheet:plot-drawn:${model.id}`);
      }
    });
  });
  onCleanup(() => chart?.destroy());

  const stem = () => fileStem(props.model().title, 'plot');
  const exportPng = async () => {
    try {
      const blob = await plotToPng(props.model(), PNG_SIZES[sizeIndex()].size);
      downloadBlob(blob, `${stem()}.png`);
    } catch (err) {
      props.onMessage?.(`PNG export failed: ${err instanceof Error ? err.message : String(err)}`);
    }
  };

  return (
    <figure class="plot" data-plot={props.model().id}>
      <div class="plot-canvas" style={{ height: `${props.height ?? 380}px` }}>
        <canvas ref={canvas} aria-label={props.model().title} role="img" />
      </div>
      <Show when={props.model().notes.length}>
        <ul class="plot-notes">
          <For each={props.model().notes}>{(n) => <li>{n}</li>}</For>
        </ul>
      </Show>
      <figcaption class="plot-exports no-print">
        <span class="export-label">Export</span>
        <select aria-label="PNG size" value={sizeIndex()} onChange={(e) => setSizeIndex(Number(e.currentTarget.value))}>
          <For each={PNG_SIZES}>{(s, i) => <option value={i()}>{s.label}</option>}</For>
        </select>
        <button type="button" data-action="export-png" onClick={exportPng}>PNG</button>
        <button type="button" data-action="export-svg" onClick={() => downloadText(plotToSvg(props.model()), `${stem()}.svg`, 'image/svg+xml')}>SVG</button>
        <button type="button" data-action="export-csv" onClick={() => downloadText(plotToCsv(props.model()), `${stem()}.csv`, 'text/csv')}>CSV data</button>
      </figcaption>
    </figure>
  );
}
