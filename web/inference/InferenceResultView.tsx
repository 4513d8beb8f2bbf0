// The result of an inference run: the verdict with its reasons, the posteriors, the corner plot, the
// exports the command line writes (chains CSV, summary JSON, corner SVG) and a pin to keep it.
import { For, Show } from 'solid-js';
import type { InferenceResult } from '../../src/statistics/sheetInference';
import type { CornerModel } from '../../src/statistics/cornerPlot';
import type { FreeSpectrumData } from '../../src/statistics/freeSpectrum';
import { PlotView } from '../plots/PlotView';
import { predictiveBandModel } from './predictiveBandModel';
import { chainsCsv, inferenceSummary } from '../../src/statistics/inferenceReport';
import { downloadText } from '../files/download';
import { PosteriorTable } from './PosteriorTable';
import { CornerPlot } from './CornerPlot';
import { pinOf } from './inferencePins';

export function InferenceResultView(props: { result: InferenceResult; corner: CornerModel; freeSpectrum?: { label: string; data: FreeSpectrumData }; workers: number; elapsedMs: number; fileStem: string; onPin: (label: string) => void; onMessage: (t: string) => void }) {
  const r = () => props.result;
  const d = () => props.result.diagnostics;
  const stem = () => `${props.fileStem}-infer-seed${r().seed}`;
  const rows = () => pinOf(r(), '').posteriors;
  return (
    <div class="job-result inference-result" data-job-result="infer" data-verdict={d().verdict}>
      <div class="job-time">
        {r().walkers} walkers x {r().steps} steps, seed {r().seed}, burn-in {r().burnIn}, thinning {r().thin}; {r().evaluations} evaluations on {props.workers} worker
        {props.workers === 1 ? '' : 's'}, finished in {(props.elapsedMs / 1000).toFixed(2)} s
      </div>
      <p class={`verdict verdict-${d().verdict === 'converged' ? 'ok' : 'longer'}`} data-verdict-text>
        <b>{d().verdict === 'converged' ? 'Converged' : 'Run longer'}</b> (acceptance {d().acceptance.toFixed(3)}; converged needs R-hat &lt; 1.01, ESS ≥ 400 and a kept chain of 50 autocorrelation times per free cell)
      </p>
      <Show when={d().reasons.length + d().warnings.length}>
        <ul class="plot-notes">
          <For each={d().reasons}>{(why) => <li>run longer: {why}</li>}</For>
          <For each={d().warnings}>{(w) => <li>note: {w}</li>}</For>
        </ul>
      </Show>
      <Show when={r().failureExample}>
        {(f) => (
          <p class="form-hint">
            {r().failures} likelihood evaluations failed (counted as zero likelihood), e.g. at{' '}
            {Object.entries(f().point)
              .map(([k, v]) => `${k} = ${v.toPrecision(4)}`)
              .join(', ')}
            : {f().message}
          </p>
        )}
      </Show>
      <PosteriorTable rows={rows()} diagnostics={d().parameters} />
      <div class="job-buttons no-print">
        <button type="button" data-action="export-chains-csv" onClick={() => downloadText(chainsCsv(r()), `${stem()}-chains.csv`, 'text/csv')}>
          Chains CSV
        </button>
        <button type="button" data-action="export-summary-json" onClick={() => downloadText(JSON.stringify(inferenceSummary(r()), null, 2) + '\n', `${stem()}-summary.json`, 'application/json')}>
          Summary JSON
        </button>
        <button type="button" data-action="pin-inference" onClick={() => props.onPin(`${r().likelihood}, seed ${r().seed}, ${new Date().toLocaleTimeString()}`)}>
          Pin this result
        </button>
      </div>
      <Show when={r().band}>{(b) => <PlotView model={() => predictiveBandModel(b(), props.freeSpectrum)} height={320} onMessage={props.onMessage} />}</Show>
      <CornerPlot result={r()} corner={props.corner} fileStem={stem()} onMessage={props.onMessage} />
    </div>
  );
}
