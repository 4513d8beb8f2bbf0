// The plots beside the sheet: the spectrum (with pinned curves and the measurement), the choice of
// vertical quantity, the measured free spectrum and (A, gamma) plane (MeasurementPlots.tsx), and the
// origin breakdowns (by redshift, by chirp mass) when the sheet has them.
import { createMemo, createSignal, For, Show } from 'solid-js';
import { useServices } from '../app/services';
import { PlotView } from './PlotView';
import type { StrainCurve, VerticalQuantity } from './spectrumPlotModel';
import type { PlotModel } from './plotModel';
import { sheetSpectrumModel, spectrumCurves, type SheetReader } from './sheetSpectrumModel';
import { breakdownModels } from './breakdownPlotModel';
import { loadPins, pinLabel, savePins, type PinnedCurve } from './pins';
import { MeasurementPlots } from './MeasurementPlots';
import { RichLabel } from './RichLabel';

const QUANTITIES: { id: VerticalQuantity; label: string }[] = [
  { id: 'hc', label: 'h_c' },
  { id: 'omega', label: 'Ω_gw' },
  { id: 'psd', label: 'residual power' },
];

export function PlotsPanel() {
  const services = useServices();
  const { session } = services;
  const [quantity, setQuantity] = createSignal<VerticalQuantity>('hc');
  const [pins, setPinsRaw] = createSignal<PinnedCurve[]>(loadPins());
  const setPins = (next: PinnedCurve[]) => {
    setPinsRaw(next);
    const r = savePins(next);
    if (!r.ok) services.notify(r.message, 'error');
  };

  /** Every cell's formula now, for naming pinned curves by what changed. */
  const allFormulas = (): Record<string, string> => Object.fromEntries(session.cells().map((c) => [c.name, c.formula]));
  /** The same, made only while there are pins to name (a long sheet does not pay for it at each change). */
  const formulas = createMemo<Record<string, string>>(() => (pins().length ? allFormulas() : {}));
  // Plots scan every cell: they are drawn again when the cells change or a recalculation is complete.
  const reader = (): SheetReader => session.reader();
  /** Every spectrum cell's current curve. */
  const spectra = createMemo<StrainCurve[]>(() => spectrumCurves(reader()));

  /** The visible pinned curves, drawn on the spectrum, the free spectrum and the (A, gamma) plane. */
  const pinned = createMemo<StrainCurve[]>(() =>
    pins()
      .filter((p) => p.visible)
      .map<StrainCurve>((p) => ({ id: `pin:${p.id}`, label: `${pinLabel(p, formulas())} (pinned)`, frequencyHz: p.frequencyHz, hc: p.hc, dashed: true })),
  );
  const model = createMemo(() => sheetSpectrumModel(reader(), quantity(), pinned(), spectra()));
  // While the sheet's spectra have no value (an input in error, a recalculation under way), the
  // last drawn curves stay, marked as stale, instead of an empty plot.
  let prevQuantity = quantity();
  const shown = createMemo<{ model: PlotModel; stale: string | null }>((prev) => {
    const m = model();
    const why = spectra().length === 0 ? m.notes.find((n) => / has no value: /.test(n)) : undefined;
    if (why && prev && prev.model.series.length && quantity() === prevQuantity) return { model: prev.model, stale: why };
    prevQuantity = quantity();
    return { model: m, stale: null };
  });

  const breakdowns = createMemo(() => {
    const r = session.reader();
    return breakdownModels(r.objects, r.valueOf);
  });

  const [pinChoice, setPinChoice] = createSignal('spectrum');
  const pinCurrent = () => {
    const list = spectra();
    const c = list.find((x) => x.label === pinChoice()) ?? list[0];
    if (!c) {
      services.notify('There is no spectrum to pin yet.', 'error');
      return;
    }
    const pin: PinnedCurve = {
      id: `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}`,
      label: `${c.label} pinned at ${new Date().toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' })}`,
      curve: c.label,
      formulas: allFormulas(),
      frequencyHz: c.frequencyHz,
      hc: c.hc,
      visible: true,
    };
    setPins([...pins(), pin]);
  };

  return (
    <div class="plots-panel">
      <div class="plot-controls no-print">
        <fieldset class="quantity-switch">
          <legend>vertical axis</legend>
          <For each={QUANTITIES}>
            {(q) => (
              <label>
                <input type="radio" name="quantity" value={q.id} checked={quantity() === q.id} onChange={() => setQuantity(q.id)} /> <RichLabel text={q.label} />
              </label>
            )}
          </For>
        </fieldset>
        <div class="pin-controls">
          <Show when={spectra().length > 1}>
            <select aria-label="Curve to pin" data-pin-choice onChange={(e) => setPinChoice(e.currentTarget.value)}>
              <For each={spectra().map((c) => c.label)}>{(n) => <option value={n} selected={n === pinChoice()}>{n}</option>}</For>
            </select>
          </Show>
          <button type="button" data-action="pin" onClick={pinCurrent}>
            Pin this curve
          </button>
        </div>
      </div>
      <PlotView model={() => shown().model} stale={shown().stale} onMessage={(t) => services.notify(t, 'error')} />
      <Show when={pins().length}>
        <div class="pins no-print" aria-label="Pinned curves">
          <h3>pinned curves</h3>
          <For each={pins()}>
            {(p) => (
              <div class="pin" data-pin={p.id}>
                <input
                  type="checkbox"
                  checked={p.visible}
                  aria-label={`Show ${pinLabel(p, formulas())}`}
                  onChange={(e) => setPins(pins().map((x) => (x.id === p.id ? { ...x, visible: e.currentTarget.checked } : x)))}
                />
                <input
                  class="pin-label"
                  value={pinLabel(p, formulas())}
                  title={pinLabel(p, formulas())}
                  aria-label="Name of pinned curve"
                  onChange={(e) => {
                    const label = e.currentTarget.value.trim();
                    setPins(pins().map((x) => (x.id === p.id ? (label ? { ...x, label, named: true } : { ...x, named: false }) : x)));
                  }}
                />
                <button type="button" class="danger" onClick={() => setPins(pins().filter((x) => x.id !== p.id))}>
                  remove
                </button>
              </div>
            )}
          </For>
        </div>
      </Show>
      <MeasurementPlots reader={reader} spectra={spectra} pinned={pinned} onMessage={(t) => services.notify(t, 'error')} />
      <For each={breakdowns().map((m) => m.id)}>
        {(id) => <PlotView model={() => breakdowns().find((m) => m.id === id) ?? breakdowns()[0]} height={260} onMessage={(t) => services.notify(t, 'error')} />}
      </For>
    </div>
  );
}
