// The plots of the measured spectrum in the Plots panel: the free spectrum (violins per bin, with
// the live and pinned model spectra) with its own choice of vertical axis, the (A, gamma) plane
// (measured contours, each model's fitted point), and the realisations of a realiseBackground cell
// (bands, single realisations, loudest binaries, with the violins, on the same axis). Each is shown
// when the sheet holds what it draws.
import { createMemo, createSignal, For, Show, type Accessor } from 'solid-js';
import { PlotView } from './PlotView';
import { useServices } from '../app/services';
import { MonteCarloControl } from './MonteCarloControl';
import { monteCarloBands, monteCarloCloud } from './spectrumMonteCarlo';
import type { SpectrumSampleResult } from '../../src/statistics/spectrumMonteCarloJob';
import type { StrainCurve } from './spectrumPlotModel';
import type { SheetReader } from './sheetSpectrumModel';
import { sheetFreeSpectrumModel, sheetRealisationModel } from './sheetFreeSpectrumModel';
import { sheetAmplitudeGammaModel } from './sheetAmplitudeGammaModel';
import type { FreeSpectrumAxis, StrainBand } from './freeSpectrumPlotModel';
import type { FittedCloud } from './amplitudeGammaPlotModel';
import { RichLabel } from './RichLabel';

const AXES: { id: FreeSpectrumAxis; label: string }[] = [
  { id: 'hc', label: 'h_c' },
  { id: 'rho', label: 'ρ_k' },
  { id: 'psd', label: 'residual power' },
];

export function MeasurementPlots(props: {
  reader: () => SheetReader;
  spectra: Accessor<StrainCurve[]>;
  pinned: Accessor<StrainCurve[]>;
  bands?: Accessor<StrainBand[]>;
  clouds?: Accessor<FittedCloud[]>;
  onMessage: (text: string) => void;
}) {
  const { session } = useServices();
  const [axis, setAxis] = createSignal<FreeSpectrumAxis>('hc');
  const [mc, setMc] = createSignal<{ run: SpectrumSampleResult; revision: number } | null>(null);
  const mcBands = createMemo<StrainBand[]>(() => {
    const r = mc();
    return r ? monteCarloBands(r.run) : [];
  });
  const mcClouds = createMemo<FittedCloud[]>(() => {
    const r = mc();
    return r ? [monteCarloCloud(r.run)] : [];
  });
  const safely = <T,>(what: string, make: () => T | null): T | null => {
    try {
      return make();
    } catch (err) {
      props.onMessage(`The ${what} plot could not be drawn: ${err instanceof Error ? err.message : String(err)}`);
      return null;
    }
  };
  const freeSpectrum = createMemo(() => safely('free-spectrum', () => sheetFreeSpectrumModel(props.reader(), axis(), props.pinned(), [...(props.bands?.() ?? []), ...mcBands()], props.spectra())));
  // Realisations of a realiseBackground cell, with the free spectrum's violins, on the same axis.
  const realisations = createMemo(() => safely('realisation', () => sheetRealisationModel(props.reader(), axis())));
  const amplitudeGamma = createMemo(() => safely('(A, gamma)', () => sheetAmplitudeGammaModel(props.reader(), props.pinned(), [...(props.clouds?.() ?? []), ...mcClouds()], props.spectra())));
  return (
    <>
      <Show when={freeSpectrum()}>
        {(m) => (
          <section class="measurement-plot" data-measurement-plot="free-spectrum">
            <fieldset class="quantity-switch no-print">
              <legend>free spectrum: vertical axis</legend>
              <For each={AXES}>
                {(a) => (
                  <label>
                    <input type="radio" name="free-spectrum-axis" value={a.id} checked={axis() === a.id} onChange={() => setAxis(a.id)} /> <RichLabel text={a.label} />
                  </label>
                )}
              </For>
            </fieldset>
            <PlotView model={m} onMessage={props.onMessage} />
            <MonteCarloControl
              reader={props.reader}
              sheet={() => session.current}
              whenSettled={() => session.whenSettled()}
              revision={session.revision}
              spectra={() => props.spectra().map((c) => c.label)}
              result={mc}
              setResult={setMc}
              onMessage={props.onMessage}
            />
          </section>
        )}
      </Show>
      <Show when={amplitudeGamma()}>{(m) => <PlotView model={m} onMessage={props.onMessage} />}</Show>
      <Show when={realisations()}>{(m) => <PlotView model={m} onMessage={props.onMessage} />}</Show>
    </>
  );
}
