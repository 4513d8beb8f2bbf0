// The per-bin summary of a realisations run: the smooth h_c, the median and bands over the
// realisations, how often the loudest binary outshines the rest of its bin, and the expected count.
import { For } from 'solid-js';
import { formatNumber } from '../../src/sheet/formatValue';
import type { RealiseJobResult } from './realiseRun';

export function RealisationTable(props: { result: RealiseJobResult }) {
  const bins = () => Array.from(props.result.frequencyHz, (_, k) => k);
  const r = () => props.result;
  const s = () => props.result.summary;
  return (
    <div class="table-scroll">
      <table class="summary-table realisation-table" data-realisation-table>
        <caption>
          per frequency bin, over {r().count} realisations (seed {r().seed}); h_c is dimensionless
        </caption>
        <thead>
          <tr>
            <th scope="col">f (nHz)</th>
            <th scope="col">smooth h_c</th>
            <th scope="col">median h_c</th>
            <th scope="col">68.27% of realisations</th>
            <th scope="col">95.45% of realisations</th>
            <th scope="col">loudest outshines the rest</th>
            <th scope="col">expected binaries</th>
          </tr>
        </thead>
        <tbody>
          <For each={bins()}>
            {(k) => (
              <tr data-bin={k + 1}>
                <td>{formatNumber(r().frequencyHz[k] * 1e9)}</td>
                <td>{formatNumber(r().smoothHc[k])}</td>
                <td data-median-hc={r().summary.medianHc[k]}>{formatNumber(s().medianHc[k])}</td>
                <td>
                  {formatNumber(s().lower68[k])} to {formatNumber(s().upper68[k])}
                </td>
                <td>
                  {formatNumber(s().lower95[k])} to {formatNumber(s().upper95[k])}
                </td>
                <td>
                  {(100 * s().outshineProbability[k]).toFixed(1)}% ± {(100 * s().outshineError[k]).toFixed(1)}%
                </td>
                <td>{formatNumber(r().expectedCount[k])}</td>
              </tr>
            )}
          </For>
        </tbody>
      </table>
    </div>
  );
}
