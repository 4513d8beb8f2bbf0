// The plots beside the sheet: the spectrum (with pinned curves and the measurement), the choice of
// vertical quantity, and the origin breakdowns (by redshift, by chirp mass) when the sheet has them.
import { createMemo, createSignal, For, Show } from 'solid-js';
import { useServices } from '../app/services';
import { isSheetObject } from '../engine/engine';
import { PlotView } from './PlotView';
import { spectrumPlotModel, type StrainCurve, type VerticalQuantity } from './spectrumPlotModel';
import {
  binsFromJson,
  realisationBandsFromJson,
  curveFromSpectrumJson,
  drawingGrid,
  hubbleConstant,
  isOneArgumentFunction,
  measuredFromJson,
  sampleFrequencyFunction,
} from './sheetPlotData';
import { breakdownModels } from './breakdownPlotModel';
import { loadPins, savePins, type PinnedCurve } from './pins';

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

  /** Every spectrum cell's current curve. */
  const spectra = createMemo<StrainCurve[]>(() => {
    const out: StrainCurve[] = [];
    for (const c of session.cells()) {
      const v = session.value(c.name);
      if (isSheetObject(v) && v.kind === 'spectrum') {
        const curve = curveFromSpectrumJson(`cell:${c.name}`, c.name, v.toJSON());
        if (curve) out.push(curve);
      }
    }
    // The sheet's main `spectrum` first, so it keeps the first colour whatever the cell order.
    return out.sort((a, b) => Number(b.label === 'spectrum') - Number(a.label === 'spectrum'));
  });

  const model = createMemo(() => {
    const cells = session.cells();
    const valueOf = (n: string) => session.value(n);
    const notes: string[] = [];
    const h0 = hubbleConstant(cells, valueOf);
    const curves: StrainCurve[] = [...spectra()];
    const grid = drawingGrid(curves[0]?.frequencyHz, cells, valueOf);
    for (const c of cells) {
      const v = valueOf(c.name);
      if (!isOneArgumentFunction(v)) continue;
      const r = sampleFrequencyFunction(v, grid);
      if ('y' in r) curves.push({ id: `fn:${c.name}`, label: `${c.name}(f)`, frequencyHz: grid, hc: r.y, dashed: true });
      else notes.push(`${c.name}(f) is not drawn: ${r.reason}.`);
    }
    for (const p of pins()) {
      if (p.visible) curves.push({ id: `pin:${p.id}`, label: `${p.label} (pinned)`, frequencyHz: p.frequencyHz, hc: p.hc, dashed: true });
    }
    const measured = [];
    const bins = [];
    const realisations = [];
    for (const c of cells) {
      const v = valueOf(c.name);
      if (!isSheetObject(v)) continue;
      if (v.kind === 'measurement') {
        const m = measuredFromJson(c.name, v.toJSON());
        if (m) measured.push(m);
        else notes.push(`${c.name}: this measurement has no amplitude interval to draw.`);
      } else if (v.kind === 'realisations') {
        const r = realisationBandsFromJson(c.name, v.toJSON());
        if (r) realisations.push(r);
      } else if (/bin|freeSpectrum/i.test(v.kind)) {
        const b = binsFromJson(c.name, v.toJSON(), h0);
        if (b) bins.push(b);
      }
    }
    if (!spectra().length) {
      // A spectrum cell in error shows nothing: say which one and why, instead of "no spectrum".
      for (const c of cells) {
        const st = session.state(c.name);
        if (st.status === 'error' && (/spectrum/i.test(c.name) || /Spectrum\s*\(/.test(c.formula))) {
          notes.push(`${c.name} has no value: ${st.error.message}`);
        }
      }
    }
    return spectrumPlotModel({ quantity: quantity(), curves, realisations, measured, bins, h0PerS: h0, notes });
  });

  const breakdowns = createMemo(() => breakdownModels(session.cells(), (n) => session.value(n)));

  const pinCurrent = () => {
    const list = spectra();
    if (!list.length) {
      services.notify('There is no spectrum to pin yet.', 'error');
      return;
    }
    const stamp = new Date().toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' });
    const added = list.map<PinnedCurve>((c) => ({
      id: `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}`,
      label: `${c.label} at ${stamp}`,
      frequencyHz: c.frequencyHz,
      hc: c.hc,
      visible: true,
    }));
    setPins([...pins(), ...added]);
  };

  return (
    <div class="plots-panel">
      <div class="plot-controls no-print">
        <fieldset class="quantity-switch">
          <legend>vertical axis</legend>
          <For each={QUANTITIES}>
            {(q) => (
              <label>
                <input type="radio" name="quantity" value={q.id} checked={quantity() === q.id} onChange={() => setQuantity(q.id)} /> {q.label}
              </label>
            )}
          </For>
        </fieldset>
        <button type="button" data-action="pin" onClick={pinCurrent}>
          Pin current {spectra().length > 1 ? 'spectra' : 'spectrum'}
        </button>
      </div>
      <PlotView model={model} onMessage={(t) => services.notify(t, 'error')} />
      <Show when={pins().length}>
        <div class="pins no-print" aria-label="Pinned curves">
          <h3>pinned curves</h3>
          <For each={pins()}>
            {(p) => (
              <div class="pin" data-pin={p.id}>
                <input
                  type="checkbox"
                  checked={p.visible}
                  aria-label={`Show ${p.label}`}
                  onChange={(e) => setPins(pins().map((x) => (x.id === p.id ? { ...x, visible: e.currentTarget.checked } : x)))}
                />
                <input
                  class="pin-label"
                  value={p.label}
                  aria-label="Name of pinned curve"
                  onChange={(e) => {
                    const label = e.currentTarget.value.trim() || p.label;
                    setPins(pins().map((x) => (x.id === p.id ? { ...x, label } : x)));
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
      <For each={breakdowns().map((m) => m.id)}>
        {(id) => <PlotView model={() => breakdowns().find((m) => m.id === id) ?? breakdowns()[0]} height={260} onMessage={(t) => services.notify(t, 'error')} />}
      </For>
    </div>
  );
}
