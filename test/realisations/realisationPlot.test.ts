// The spectrum plot's realisation series (web/plots), built from a realisations value's toJSON():
// 95% and 68% bands around the median, the smooth spectrum, thin single realisations and the
// loudest binary's own h_c, all on the realisations' frequencies.
import { describe, expect, it } from 'vitest';
import { loadDemo } from '../physics/demoSheet';
import { isSheetObject } from '../../src/sheet/sheetObject';
import { realisationBandsFromJson } from '../../web/plots/sheetPlotData';
import { spectrumPlotModel } from '../../web/plots/spectrumPlotModel';

describe('realisation bands on the spectrum plot', () => {
  it('draws bands, median, smooth spectrum, three single realisations and loudest binaries', () => {
    const sheet = loadDemo();
    sheet.setCell({ name: 'rz', formula: 'realiseBackground(pop, freqs, array_span, 30, 2)' });
    const v = sheet.value('rz');
    expect(isSheetObject(v)).toBe(true);
    const bands = realisationBandsFromJson('rz', (v as { toJSON(): unknown }).toJSON());
    expect(bands).not.toBeNull();
    const model = spectrumPlotModel({ quantity: 'hc', curves: [], realisations: [bands!], measured: [], bins: [], h0PerS: null, notes: [] });
    const ids = model.series.map((s) => s.id);
    for (const id of ['rz:95', 'rz:68', 'rz:median', 'rz:smooth', 'rz:single1', 'rz:single3', 'rz:loudest']) expect(ids).toContain(id);
    const b95 = model.series.find((s) => s.id === 'rz:95')!;
    const b68 = model.series.find((s) => s.id === 'rz:68')!;
    b95.x.forEach((_, k) => {
      expect(b95.yLow![k]).toBeLessThanOrEqual(b68.yLow![k]);
      expect(b68.yHigh![k]).toBeLessThanOrEqual(b95.yHigh![k]);
    });
    const loud = model.series.find((s) => s.id === 'rz:loudest')!;
    const smooth = model.series.find((s) => s.id === 'rz:smooth')!;
    // A single binary's own h_c never exceeds the bin's smooth h_c in the lowest bin (10^11 binaries there).
    expect(loud.y[0]).toBeLessThan(smooth.y[0]);
    expect(realisationBandsFromJson('x', { frequencyHz: [1e-9], medianHc: [] })).toBeNull();
  });
});
