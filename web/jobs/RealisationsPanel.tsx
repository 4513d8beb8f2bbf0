// Realisations of the sheet's finite population (its realiseBackground cell) run in the job worker:
// R realisations with a seed, on Web Workers, with progress and cancel. The numbers are those of
// `strainsheet realise` for the same seed (the same chunked job), and the CSV export is its CSV.
import { createMemo, createSignal, onCleanup, Show } from 'solid-js';
import { useServices } from '../app/services';
import { isOffPageValue, isSheetObject } from '../engine/engine';
import { JobClient } from './jobClient';
import { CellSelect } from './CellSelect';
import { JobStatusView, wholeIn, WORKERS_HINT } from './JobStatusView';
import { RealisationTable } from './RealisationTable';
import { realisationRunModel } from './realisationRunModel';
import { freeSpectra } from '../plots/sheetFreeSpectrumModel';
import type { RealiseJobResult } from './realiseRun';
import { realisationStarter } from './starterCells';
import { StarterButton } from './StarterButton';
import { PlotView } from '../plots/PlotView';
import { realisationBinsCsv } from '../../src/statistics/realisationReport';
import { downloadText, fileStem } from '../files/download';

const MAX_COUNT = 1_000_000;

export function RealisationsPanel() {
  const services = useServices();
  const { session } = services;
  const client = new JobClient();
  onCleanup(() => client.dispose());
  const cells = createMemo(
    () => {
      // Read through session.reader(): once per completed recalculation, not one signal per cell.
      const r = session.reader();
      return r.objects
        .filter((c) => {
          const v = r.valueOf(c.name);
          // A cell evaluated off the page (one of its inputs is held there) is run from the file text all the same.
          return isSheetObject(v) && (v.kind === 'realisations' || (isOffPageValue(v) && v.heldKind === 'realisations'));
        })
        .map((c) => c.name);
    },
    undefined,
    { equals: (a, b) => a.length === b.length && a.every((x, i) => x === b[i]) },
  );
  // The user's pick; until then the first cell holding realisations (also in a sheet opened later).
  const [cellPick, setCell] = createSignal('');
  const cell = () => cellPick() || cells()[0] || '';
  const [count, setCount] = createSignal('1000');
  const [seed, setSeed] = createSignal('1');
  const [workers, setWorkers] = createSignal('1');
  const [formError, setFormError] = createSignal<string | null>(null);
  const status = client.status;
  const busy = () => status().state === 'running' || status().state === 'cancelling';

  const run = () => {
    setFormError(null);
    const name = cell() || cells()[0];
    if (!name) return setFormError('No cell holds realisations: add one such as realiseBackground(pop, freqs, array_span, 100, 1), then choose it here.');
    if (!cells().includes(name)) return setFormError(`${name} holds no realisations right now (see its row); fix it or choose another cell.`);
    const R = wholeIn(count(), 1, MAX_COUNT);
    if (R === null) return setFormError(`Realisations must be a whole number from 1 to ${MAX_COUNT}, got "${count()}".`);
    const S = wholeIn(seed(), 0, Number.MAX_SAFE_INTEGER);
    if (S === null) return setFormError(`The seed must be a whole number of at least 0, got "${seed()}".`);
    const W = wholeIn(workers(), 1, 16);
    if (W === null) return setFormError(`Workers must be a whole number from 1 to 16, got "${workers()}".`);
    client.start(session.toFileText(), { kind: 'realise', cell: name, count: R, seed: S }, W);
  };

  const result = createMemo<RealiseJobResult | null>(() => {
    const s = status();
    return s.state === 'done' && s.result.kind === 'realise' ? s.result : null;
  });
  const exportCsv = (r: RealiseJobResult) => {
    const title = session.current.title || 'sheet';
    downloadText(realisationBinsCsv(r), `${fileStem(title, 'sheet')}-${fileStem(r.cell, 'realisations')}-seed${r.seed}.csv`, 'text/csv');
  };

  return (
    <div class="realisations-panel" data-realisations-panel>
      <p class="panel-intro">
        Draws the finite population of a realiseBackground cell again and again, bin by bin, with its own count and seed, away from the page. The same seed gives the numbers of{' '}
        <code>strainsheet realise</code> for any number of workers.
      </p>
      <div class="job-form no-print">
        <fieldset class="axis-fields">
          <legend>realisations</legend>
          <label>
            set-up cell
            <CellSelect value={cell()} choices={cells()} label="Realisations cell" onChange={setCell} />
          </label>
          <label>
            how many <input type="number" min="1" step="1" data-field="count" value={count()} onInput={(e) => setCount(e.currentTarget.value)} />
          </label>
          <label>
            seed <input type="number" min="0" step="1" data-field="seed" value={seed()} onInput={(e) => setSeed(e.currentTarget.value)} />
          </label>
          <label>
            workers <input type="number" min="1" max="16" step="1" data-field="workers" title={WORKERS_HINT} value={workers()} onInput={(e) => setWorkers(e.currentTarget.value)} />
          </label>
        </fieldset>
        <div class="job-buttons">
          <button type="button" class="primary" data-action="run-realisations" disabled={busy()} onClick={run}>
            Run realisations
          </button>
          <button type="button" data-action="cancel-realisations" disabled={status().state !== 'running'} onClick={() => client.cancel()}>
            Cancel
          </button>
        </div>
        <Show when={formError()}>
          <div class="form-error" role="alert">
            {formError()}
          </div>
        </Show>
        <Show when={cells().length === 0}>
          <p class="form-hint">
            No cell of this sheet holds realisations yet: add one such as realiseBackground(pop, freqs, array_span, 100, 1) (its own 100 realisations are drawn on the page; the runs here draw their own count).{' '}
            <StarterButton starter={realisationStarter(session.reader().cells, session.reader().valueOf)} onAdded={setCell} />
          </p>
        </Show>
      </div>
      <JobStatusView status={status()} unit="realisations" />
      <Show when={result()}>
        {(r) => (
          <div class="job-result" data-job-result="realise" data-workers={r().workers}>
            <div class="job-time">
              {r().count} realisations of {r().cell}, seed {r().seed}, on {r().workers} worker{r().workers === 1 ? '' : 's'}
              {status().state === 'done' ? `, finished in ${((status() as { elapsedMs: number }).elapsedMs / 1000).toFixed(2)} s` : ''}; {r().drawnBinaries} binaries drawn one by one
            </div>
            <button type="button" data-action="export-realisations-csv" onClick={() => exportCsv(r())}>
              Export CSV
            </button>
            <PlotView model={() => realisationRunModel(r(), freeSpectra(session.reader()).map((f) => ({ label: f.name, data: f.data }))[0])} height={320} onMessage={(t) => services.notify(t, 'error')} />
            <RealisationTable result={r()} />
          </div>
        )}
      </Show>
    </div>
  );
}
