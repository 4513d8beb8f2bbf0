// The corner plot of an inference run on screen: an n x n grid of the app's plots (histograms on
// the diagonal, pairs below it), and one export of the whole figure as SVG, the figure that
// `strainsheet infer --corner` writes.
import { For, Show } from 'solid-js';
import type { CornerModel } from '../../src/statistics/cornerPlot';
import { cornerSvg } from '../../src/cli/cornerSvg';
import type { InferenceResult } from '../../src/statistics/sheetInference';
import { PlotView } from '../plots/PlotView';
import { cornerHistogramModel, cornerPairModel } from './cornerPlotModels';
import { downloadText } from '../files/download';

export function CornerPlot(props: { result: InferenceResult; corner: CornerModel; fileStem: string; onMessage: (text: string) => void }) {
  const model = () => props.corner;
  const n = () => model().axes.length;
  const cells = () => Array.from({ length: n() * n() }, (_, k) => ({ row: Math.floor(k / n()), col: k % n() }));
  const exportSvg = () => {
    const r = props.result;
    downloadText(cornerSvg(model(), `${r.walkers} walkers x ${r.steps} steps, seed ${r.seed}, burn-in ${r.burnIn}`), `${props.fileStem}-corner.svg`, 'image/svg+xml');
  };
  return (
    <div class="corner-plot" data-corner-plot={n()}>
      <div class="corner-grid" style={{ 'grid-template-columns': `repeat(${n()}, minmax(0, 1fr))` }}>
        <For each={cells()}>
          {(c) => (
            <Show when={c.col <= c.row} fallback={<div class="corner-empty" />}>
              <PlotView
                model={() => (c.col === c.row ? cornerHistogramModel(model(), c.row) : cornerPairModel(model(), model().pairs.find((p) => p.i === c.col && p.j === c.row)!))}
                height={n() === 1 ? 260 : 220}
                onMessage={props.onMessage}
              />
            </Show>
          )}
        </For>
      </div>
      <p class="form-hint">
        Contours: {(100 * model().levels[0]).toFixed(2)}% and {(100 * model().levels[1]).toFixed(2)}% highest-density regions of the kept draws; dashed line and dots: medians.{' '}
        <button type="button" data-action="export-corner-svg" onClick={exportSvg}>
          Corner SVG
        </button>
      </p>
    </div>
  );
}
