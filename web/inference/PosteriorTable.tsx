// Posterior medians and 68.27% / 95.45% central intervals per cell, with the run's diagnostics per
// free cell when given (autocorrelation time, effective sample size, split-R-hat).
import { For, Show } from 'solid-js';
import { formatValue } from '../engine/engine';

const formatNumber = (x: number) => formatValue(x);
import type { ParameterDiagnostics } from '../../src/statistics/chainDiagnostics';
import type { PinnedPosterior } from './inferencePins';

export function PosteriorTable(props: { rows: PinnedPosterior[]; diagnostics?: ParameterDiagnostics[] }) {
  const range = (r: [number, number]) => `${formatNumber(r[0])} to ${formatNumber(r[1])}`;
  return (
    <div class="table-scroll">
      <table class="summary-table posterior-table" data-posterior-table>
        <thead>
          <tr>
            <th scope="col">cell</th>
            <th scope="col">median</th>
            <th scope="col">68.27%</th>
            <th scope="col">95.45%</th>
            <Show when={props.diagnostics}>
              <th scope="col">tau (steps)</th>
              <th scope="col">ESS</th>
              <th scope="col">R-hat</th>
            </Show>
          </tr>
        </thead>
        <tbody>
          <For each={props.rows}>
            {(p, i) => (
              <tr data-posterior={p.cell}>
                <th scope="row">
                  {p.cell}
                  {p.unit ? ` (${p.unit})` : ''}
                </th>
                <td data-median={p.median}>{formatNumber(p.median)}</td>
                <td>{range(p.i68)}</td>
                <td>{range(p.i95)}</td>
                <Show when={props.diagnostics?.[i()]}>
                  {(d) => (
                    <>
                      <td>{formatNumber(d().tau)}</td>
                      <td>{Math.round(d().ess)}</td>
                      <td>{d().rhat.toFixed(4)}</td>
                    </>
                  )}
                </Show>
              </tr>
            )}
          </For>
        </tbody>
      </table>
    </div>
  );
}
