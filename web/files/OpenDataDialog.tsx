// The Open data dialog: before a free spectrum is read, the user states the prior its analysis used
// on the sampled quantity (uniform in log10 rho_k over a range is common in published free spectra),
// so that the comparison can divide it out; the prior is stored with the data in the cell. Then the
// file is chosen. (A, gamma) samples need no prior and ignore the choice.
import { createSignal, Show, type Accessor } from 'solid-js';
import { priorInFormula, priorProblem, type DataPrior } from './openDataFile';

export interface OpenDataDialogControl {
  /** The prior chosen now (used for the next file read, also a file set on the picker directly). */
  prior: Accessor<DataPrior>;
  open(existingFormula: string | undefined): void;
}

export function createOpenDataDialog(chooseFile: () => void): { control: OpenDataDialogControl; Dialog: () => ReturnType<typeof DialogView> } {
  const [mode, setMode] = createSignal<DataPrior['kind']>('keep');
  const [lower, setLower] = createSignal('-10');
  const [upper, setUpper] = createSignal('-4');
  const [kept, setKept] = createSignal<{ lower: number; upper: number } | undefined>(undefined);
  const [problem, setProblem] = createSignal<string | null>(null);
  let dialog: HTMLDialogElement | undefined;
  const prior = (): DataPrior => (mode() === 'uniform' ? { kind: 'uniform', lower: Number(lower()), upper: Number(upper()) } : mode() === 'none' ? { kind: 'none' } : { kind: 'keep' });
  const control: OpenDataDialogControl = {
    prior,
    open(existingFormula) {
      const k = priorInFormula(existingFormula);
      setKept(k);
      if (k) {
        setLower(String(k.lower));
        setUpper(String(k.upper));
      }
      setMode(k ? 'keep' : 'uniform');
      setProblem(null);
      dialog?.showModal();
    },
  };
  const choose = () => {
    const p = prior();
    const why = p.kind === 'uniform' ? priorProblem(p.lower, p.upper) : null;
    setProblem(why);
    if (why) return;
    dialog?.close();
    chooseFile();
  };
  const Dialog = () => DialogView({ ref: (el) => (dialog = el), mode, setMode, lower, setLower, upper, setUpper, kept, problem, choose, cancel: () => dialog?.close() });
  return { control, Dialog };
}

function DialogView(p: {
  ref: (el: HTMLDialogElement) => void;
  mode: Accessor<DataPrior['kind']>;
  setMode: (m: DataPrior['kind']) => void;
  lower: Accessor<string>;
  setLower: (v: string) => void;
  upper: Accessor<string>;
  setUpper: (v: string) => void;
  kept: Accessor<{ lower: number; upper: number } | undefined>;
  problem: Accessor<string | null>;
  choose: () => void;
  cancel: () => void;
}) {
  return (
    <dialog ref={p.ref} class="open-data-dialog" aria-labelledby="open-data-title" data-dialog="open-data">
      <form
        method="dialog"
        onSubmit={(e) => {
          e.preventDefault();
          p.choose();
        }}
      >
        <h2 id="open-data-title">Open data</h2>
        <p>
          A free spectrum (CSV or JSON: samples of log10 ρ<sub>k</sub> or log10 h<sub>c</sub> per bin) or (A, γ) samples (CSV with a gamma column). The file's samples are stored in the sheet.
        </p>
        <fieldset>
          <legend>Prior the free-spectrum analysis used on each bin's sampled quantity</legend>
          <Show when={p.kept()}>
            {(k) => (
              <label>
                <input type="radio" name="data-prior" value="keep" checked={p.mode() === 'keep'} onChange={() => p.setMode('keep')} /> as in the sheet now: uniform from {k().lower} to {k().upper}
              </label>
            )}
          </Show>
          <label>
            <input type="radio" name="data-prior" value="uniform" checked={p.mode() === 'uniform'} onChange={() => p.setMode('uniform')} /> uniform from{' '}
            <input class="prior-bound" type="number" step="any" aria-label="Lower end of the prior" data-prior="lower" value={p.lower()} onInput={(e) => (p.setLower(e.currentTarget.value), p.setMode('uniform'))} /> to{' '}
            <input class="prior-bound" type="number" step="any" aria-label="Upper end of the prior" data-prior="upper" value={p.upper()} onInput={(e) => (p.setUpper(e.currentTarget.value), p.setMode('uniform'))} />
          </label>
          <label>
            <input type="radio" name="data-prior" value="none" checked={p.mode() === 'none'} onChange={() => p.setMode('none')} /> none: read the samples as a likelihood
          </label>
        </fieldset>
        <Show when={p.problem()}>
          {(why) => (
            <p class="form-error" role="alert">
              {why()}
            </p>
          )}
        </Show>
        <div class="dialog-buttons">
          <button type="button" onClick={p.cancel}>
            Cancel
          </button>
          <button type="submit" data-action="choose-data-file">
            Choose file…
          </button>
        </div>
      </form>
    </dialog>
  );
}
