// Posterior sampling of the sheet's free cells given a likelihood cell, run in the job worker with
// the likelihood evaluated on Web Workers: live steps, acceptance and autocorrelation estimate,
// cancel, the verdict, posteriors, corner plot, exports and pinned results. The same seed gives the
// chains of `strainsheet infer` (docs/inference.md).
import { createMemo, createSignal, For, onCleanup, Show } from 'solid-js';
import { useServices } from '../app/services';
import { JobClient } from '../jobs/jobClient';
import { CellSelect } from '../jobs/CellSelect';
import { JobStatusView, wholeIn, WORKERS_HINT } from '../jobs/JobStatusView';
import { FreeCellList } from './FreeCellList';
import { InferenceResultView } from './InferenceResultView';
import { PosteriorTable } from './PosteriorTable';
import { loadInferencePins, pinOf, saveInferencePins, type PinnedInference } from './inferencePins';
import type { InferJobResult, InferJobSpec } from './inferRun';
import { fileStem } from '../files/download';
import { isSheetObject } from '../engine/engine';
import { math } from '../../src/sheet/mathInstance';
import { likelihoodStarter } from '../jobs/starterCells';
import { freeSpectra } from '../plots/sheetFreeSpectrumModel';
import { StarterButton } from '../jobs/StarterButton';

/** A number, or a quantity with a unit: what a posterior can be reported for. */
const isScalar = (v: unknown) => (typeof v === 'number' && Number.isFinite(v)) || math.isUnit(v);
const sameNames = (a: string[], b: string[]) => a.length === b.length && a.every((x, i) => x === b[i]);

export function InferencePanel() {
  const services = useServices();
  const { session } = services;
  const client = new JobClient();
  onCleanup(() => client.dispose());
  const status = client.status;
  const busy = () => status().state === 'running' || status().state === 'cancelling';

  // Cells holding a plain number: the likelihood candidates (ln L); those with no inputs: cells a prior can be given to.
  // Read through session.reader(): once per completed recalculation, not one signal per cell.
  const numberCells = createMemo(() => {
    const r = session.reader();
    return r.cells.filter((c) => typeof r.valueOf(c.name) === 'number').map((c) => c.name);
  }, undefined, { equals: sameNames });
  const inputs = createMemo(() => {
    const r = session.reader();
    return r.cells.filter((c) => r.valueOf(c.name) !== undefined && r.inputsOf(c.name).length === 0).map((c) => c.name);
  }, undefined, { equals: sameNames });
  // Cells computed from others (a derived posterior), and spectrum cells (the posterior-predictive band).
  const derivedChoices = createMemo(() => {
    const r = session.reader();
    return r.cells.filter((c) => r.inputsOf(c.name).length > 0 && isScalar(r.valueOf(c.name))).map((c) => c.name);
  }, undefined, { equals: sameNames });
  const spectrumCells = createMemo(() => {
    const r = session.reader();
    return r.objects.filter((c) => {
      const v = r.valueOf(c.name);
      return isSheetObject(v) && v.kind === 'spectrum';
    }).map((c) => c.name);
  }, undefined, { equals: sameNames });
  const numberSet = createMemo(() => new Set(numberCells()));
  const [derived, setDerived] = createSignal<ReadonlySet<string>>(new Set());
  const [bandCell, setBandCell] = createSignal('');
  const guessLikelihood = () => session.cells().find((c) => numberSet().has(c.name) && (/LogLikelihood|binChiSquare/.test(c.formula) || /^(ln|log)_?L/i.test(c.name)))?.name ?? '';
  // The user's own picks; until then (and for a sheet opened later) the defaults of the command line:
  // the likelihood-looking cell, and every cell with a prior ticked.
  const [likelihoodPick, setLikelihood] = createSignal('');
  const likelihood = () => likelihoodPick() || guessLikelihood();
  const [picked, setPicked] = createSignal<Record<string, boolean>>({});
  const chosen = createMemo<ReadonlySet<string>>(() => new Set(session.cells().filter((c) => picked()[c.name] ?? !!(c.prior ?? '').trim()).map((c) => c.name)));
  const toggle = (cell: string, on: boolean) => setPicked({ ...picked(), [cell]: on });
  const [walkers, setWalkers] = createSignal('16');
  const [steps, setSteps] = createSignal('1000');
  const [burnIn, setBurnIn] = createSignal('');
  const [thin, setThin] = createSignal('1');
  const [seed, setSeed] = createSignal('1');
  const [workers, setWorkers] = createSignal('1');
  const [formError, setFormError] = createSignal<string | null>(null);

  const run = () => {
    setFormError(null);
    const lik = likelihood();
    if (!lik) return setFormError('Choose the likelihood cell: a cell holding ln L, e.g. amplitudeLogLikelihood(A_yr, measured).');
    // The free cells in the sheet's order (the order of `strainsheet infer`), among those that can be free now.
    const free = session.cells().filter((c) => chosen().has(c.name) && ((c.prior ?? '').trim() || (c.uncertainty ?? '').trim())).map((c) => c.name);
    if (free.length === 0) return setFormError('Choose at least one free cell (a cell with a prior, or an uncertainty as its default prior).');
    const W = wholeIn(walkers(), 4, 10_000);
    if (W === null || W % 2 !== 0) return setFormError(`Walkers must be an even whole number of at least 4, got "${walkers()}".`);
    if (W < 2 * free.length) return setFormError(`Use at least ${2 * free.length} walkers for ${free.length} free cells (twice as many), got ${W}.`);
    const N = wholeIn(steps(), 2, 10_000_000);
    if (N === null) return setFormError(`Steps must be a whole number of at least 2, got "${steps()}".`);
    const B = burnIn().trim() === '' ? undefined : wholeIn(burnIn(), 0, N - 1);
    if (B === null) return setFormError(`The burn-in must be a whole number smaller than the steps (${N}), or empty for half, got "${burnIn()}".`);
    const T = wholeIn(thin(), 1, N);
    if (T === null) return setFormError(`Thinning must be a whole number of at least 1, got "${thin()}".`);
    const S = wholeIn(seed(), 0, Number.MAX_SAFE_INTEGER);
    if (S === null) return setFormError(`The seed must be a whole number of at least 0, got "${seed()}".`);
    const K = wholeIn(workers(), 1, 16);
    if (K === null) return setFormError(`Workers must be a whole number from 1 to 16, got "${workers()}".`);
    const extra = session.cells().filter((c) => derived().has(c.name) && !free.includes(c.name) && c.name !== lik).map((c) => c.name);
    const job: InferJobSpec = { kind: 'infer', likelihood: lik, free, walkers: W, steps: N, seed: S, burnIn: B, thin: T, derived: extra, spectrumCell: bandCell() || null };
    client.start(session.toFileText(), job, K);
  };

  const done = createMemo(() => {
    const s = status();
    return s.state === 'done' && s.result.kind === 'infer' ? { result: s.result as InferJobResult, elapsedMs: s.elapsedMs } : null;
  });
  const [pins, setPinsRaw] = createSignal<PinnedInference[]>(loadInferencePins());
  const setPins = (next: PinnedInference[]) => {
    const r = saveInferencePins(next);
    if (!r.ok) return services.notify(r.message, 'error');
    setPinsRaw(next);
  };
  const stem = () => fileStem(session.current.title || 'sheet', 'sheet');
  const fmt = (x: number, digits: number) => (Number.isFinite(x) ? x.toFixed(digits) : '–');

  return (
    <div class="inference-panel" data-inference-panel>
      <p class="panel-intro">
        Samples the posterior of the free cells with an affine-invariant ensemble sampler (Goodman &amp; Weare 2010), evaluating the sheet itself at every point, away from the page. The same seed gives the chains of{' '}
        <code>strainsheet infer</code> for any number of workers.
      </p>
      <div class="job-form no-print">
        <FreeCellList chosen={chosen()} onToggle={toggle} inputs={inputs()} />
        <fieldset class="axis-fields">
          <legend>likelihood and sampler</legend>
          <label>
            likelihood (ln L)
            <CellSelect value={likelihood()} choices={numberCells()} label="Likelihood cell" emptyLabel="choose" onChange={setLikelihood} />
          </label>
          <label>
            walkers <input type="number" min="4" step="2" data-field="walkers" value={walkers()} onInput={(e) => setWalkers(e.currentTarget.value)} />
          </label>
          <label>
            steps <input type="number" min="2" step="1" data-field="steps" value={steps()} onInput={(e) => setSteps(e.currentTarget.value)} />
          </label>
          <label>
            burn-in <input type="number" min="0" step="1" data-field="burn-in" placeholder="half" value={burnIn()} onInput={(e) => setBurnIn(e.currentTarget.value)} />
          </label>
          <label>
            thinning <input type="number" min="1" step="1" data-field="thin" value={thin()} onInput={(e) => setThin(e.currentTarget.value)} />
          </label>
          <label>
            seed <input type="number" min="0" step="1" data-field="seed" value={seed()} onInput={(e) => setSeed(e.currentTarget.value)} />
          </label>
          <label>
            workers <input type="number" min="1" max="16" step="1" data-field="workers" title={WORKERS_HINT} value={workers()} onInput={(e) => setWorkers(e.currentTarget.value)} />
          </label>
        </fieldset>
        <Show when={numberCells().length > 0 && !guessLikelihood()}>
          <p class="form-hint">
            No cell looks like a likelihood (ln L) yet.{' '}
            <StarterButton starter={likelihoodStarter(session.reader().cells, session.reader().valueOf)} onAdded={setLikelihood} />
          </p>
        </Show>
        <fieldset class="axis-fields">
          <legend>also report</legend>
          <label>
            posterior-predictive h_c of
            <CellSelect value={bandCell()} choices={spectrumCells()} label="Spectrum cell for the predictive band" emptyLabel="none" onChange={setBandCell} />
          </label>
          <details class="derived-cells">
            <summary>derived cells ({derived().size} chosen)</summary>
            <For each={derivedChoices()}>
              {(name) => (
                <label class="inline">
                  <input
                    type="checkbox"
                    data-derived={name}
                    checked={derived().has(name)}
                    onChange={(e) => {
                      const next = new Set(derived());
                      if (e.currentTarget.checked) next.add(name);
                      else next.delete(name);
                      setDerived(next);
                    }}
                  />{' '}
                  {name}
                </label>
              )}
            </For>
          </details>
        </fieldset>
        <div class="job-buttons">
          <button type="button" class="primary" data-action="run-inference" disabled={busy()} onClick={run}>
            Run inference
          </button>
          <button type="button" data-action="cancel-inference" disabled={status().state !== 'running'} onClick={() => client.cancel()}>
            Cancel
          </button>
        </div>
        <Show when={formError()}>
          <div class="form-error" role="alert">
            {formError()}
          </div>
        </Show>
      </div>
      <JobStatusView
        status={status()}
        unit="steps"
        detail={(s) => (
          <Show when={s.detail}>
            {(d) => (
              <span class="job-detail" data-infer-progress data-step={d().step} data-acceptance={d().acceptance}>
                acceptance {fmt(d().acceptance, 3)}, autocorrelation time {Number.isFinite(d().tau) ? `${fmt(d().tau, 1)} steps` : 'not yet estimated'}
              </span>
            )}
          </Show>
        )}
      />
      <Show when={done()}>
        {(d) => (
          <InferenceResultView
            result={d().result.result}
            corner={d().result.corner}
            freeSpectrum={freeSpectra(session.reader()).map((f) => ({ label: f.name, data: f.data }))[0]}
            workers={d().result.workers}
            elapsedMs={d().elapsedMs}
            fileStem={stem()}
            onMessage={(t) => services.notify(t, 'error')}
            onPin={(label) => setPins([...pins(), pinOf(d().result.result, label)])}
          />
        )}
      </Show>
      <Show when={pins().length}>
        <section class="inference-pins" aria-label="Pinned inference results">
          <h3>pinned results</h3>
          <For each={pins()}>
            {(p) => (
              <div class="inference-pin" data-inference-pin={p.id}>
                <p>
                  <b>{p.label}</b>: {p.settings}; likelihood {p.likelihood}; {p.verdict}, acceptance {fmt(p.acceptance, 3)}{' '}
                  <button type="button" class="danger" onClick={() => setPins(pins().filter((x) => x.id !== p.id))}>
                    remove
                  </button>
                </p>
                <PosteriorTable rows={p.posteriors} />
              </div>
            )}
          </For>
        </section>
      </Show>
    </div>
  );
}
