// The Monte Carlo of a spectrum for the measurement plots: how many draws of the uncertain cells and
// the seed, run in this page's thread in slices (the job yields to the page every 30 ms:
// src/jobs/runChunks.ts), with progress and cancel. The result is drawn as the free spectrum's band
// and the (A, gamma) plane's cloud until it is cleared or run again.
import { createSignal, For, Show, type Accessor } from 'solid-js';
import type { Sheet } from '../../src/sheet/sheet';
import { runChunkedJob } from '../../src/jobs/runChunks';
import { JobCancelledError } from '../../src/statistics/sheetValues';
import { spectrumSampleJob, type SpectrumSampleResult, MAX_SPECTRUM_SAMPLES } from '../../src/statistics/spectrumMonteCarloJob';
import { spectrumSampleOptions } from './spectrumMonteCarlo';
import type { SheetReader } from './sheetSpectrumModel';

export function MonteCarloControl(props: {
  reader: () => SheetReader;
  sheet: () => Sheet;
  /** Resolves once the sheet's values are up to date (the draws start from them). */
  whenSettled: () => Promise<void>;
  /** Sheet revision: a result from an older revision is marked as such. */
  revision: Accessor<number>;
  spectra: Accessor<string[]>;
  result: Accessor<{ run: SpectrumSampleResult; revision: number } | null>;
  setResult: (r: { run: SpectrumSampleResult; revision: number } | null) => void;
  onMessage: (text: string) => void;
}) {
  const [draws, setDraws] = createSignal('200');
  const [seed, setSeed] = createSignal('1');
  const [cell, setCell] = createSignal('');
  const [progress, setProgress] = createSignal<number | null>(null);
  let abort: AbortController | null = null;
  const run = async () => {
    const n = Number(draws());
    const s = Number(seed());
    if (!(Number.isInteger(n) && n >= 2 && n <= MAX_SPECTRUM_SAMPLES)) return props.onMessage(`Monte Carlo: draws must be a whole number from 2 to ${MAX_SPECTRUM_SAMPLES}.`);
    if (!(Number.isInteger(s) && s >= 0)) return props.onMessage('Monte Carlo: the seed must be a whole number >= 0.');
    // The draws vary the uncertain cells around the sheet's values: wait for a recalculation under way.
    await props.whenSettled();
    const spectrum = cell() || props.spectra()[0];
    if (!spectrum) return props.onMessage('Monte Carlo: the sheet has no spectrum cell.');
    const options = spectrumSampleOptions(props.reader(), spectrum, n, s);
    if ('reason' in options) return props.onMessage(`Monte Carlo: ${options.reason}.`);
    abort = new AbortController();
    const revision = props.revision();
    setProgress(0);
    try {
      const r = await runChunkedJob(spectrumSampleJob, props.sheet(), options, { signal: abort.signal, onProgress: (done, total) => setProgress(done / total) });
      props.setResult({ run: r, revision });
      if (r.failures) props.onMessage(`Monte Carlo: ${r.failures} of ${n} draws failed (first: ${r.firstError}).`);
    } catch (err) {
      if (!(err instanceof JobCancelledError)) props.onMessage(`Monte Carlo failed: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      abort = null;
      setProgress(null);
    }
  };
  return (
    <fieldset class="monte-carlo-control no-print" data-monte-carlo>
      <legend>Monte Carlo of the uncertain cells</legend>
      <Show when={props.spectra().length > 1}>
        <select aria-label="Spectrum to draw" data-field="mc-spectrum" onChange={(e) => setCell(e.currentTarget.value)}>
          <For each={props.spectra()}>{(n) => <option value={n}>{n}</option>}</For>
        </select>
      </Show>
      <label>
        draws <input type="number" min="2" step="1" data-field="mc-draws" value={draws()} onInput={(e) => setDraws(e.currentTarget.value)} />
      </label>
      <label>
        seed <input type="number" min="0" step="1" data-field="mc-seed" value={seed()} onInput={(e) => setSeed(e.currentTarget.value)} />
      </label>
      <Show
        when={progress() !== null}
        fallback={
          <button type="button" data-action="run-monte-carlo" onClick={() => void run()}>
            Run
          </button>
        }
      >
        <progress max="1" value={progress() ?? 0} aria-label="Monte Carlo progress" />
        <button type="button" data-action="cancel-monte-carlo" onClick={() => abort?.abort()}>
          Cancel
        </button>
      </Show>
      <Show when={props.result()}>
        {(r) => (
          <span class="mc-state" data-mc-state>
            {r().run.samples - r().run.failures} draws of {r().run.spectrum}, seed {r().run.seed}
            {r().revision !== props.revision() ? ' (the sheet has changed since)' : ''}{' '}
            <button type="button" data-action="clear-monte-carlo" onClick={() => props.setResult(null)}>
              Clear
            </button>
          </span>
        )}
      </Show>
    </fieldset>
  );
}
