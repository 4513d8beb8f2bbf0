// The realisation plot (issue 13) against independent computations: its bands are the quantiles of
// the raw draws computed here (Hyndman & Fan 1996, Am. Stat. 50, 361, definition 7), the loudest
// binary's own h_c is h sqrt(f T) (one binary in a bin of width 1/T, Sesana, Vecchio & Colacino 2008,
// MNRAS 390, 192), and a sheet cell and a run of the realisations job with the same seed draw the
// same figure.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadSheet, applySetOptions } from '../../src/cli/sheetLoading';
import { runChunkedJob } from '../../src/jobs/runChunks';
import { realiseJob } from '../../src/statistics/realiseJob';
import { realisationPlotModel, realisationViewOfRun, loudestOwnHc } from '../../web/plots/realisationPlotModel';
import { realisationCells, sheetRealisationModel } from '../../web/plots/sheetFreeSpectrumModel';
import type { PlotModel } from '../../web/plots/plotModel';

const sheet = loadSheet(join(import.meta.dirname, '../../examples/demo.json'));
applySetOptions(sheet, ['real=realiseBackground(pop, freqs, array_span, 64, 11)']);
const reader = { cells: sheet.cells(), valueOf: (n: string) => sheet.value(n), stateOf: (n: string) => sheet.state(n) };
const value = sheet.value('real') as unknown as { draws: { hc: Float64Array; count: number; loudestStrain: Float64Array }; setup: { spanS: number }; cells: { bins: { frequencyHz: number }[] } };

/** Definition 7 of Hyndman & Fan (1996): linear interpolation between order statistics at (n - 1) p. */
function quantile7(x: number[], p: number): number {
  const s = [...x].sort((a, b) => a - b);
  const h = (s.length - 1) * p;
  const lo = Math.floor(h);
  return s[lo] + (h - lo) * ((s[Math.min(lo + 1, s.length - 1)] ?? s[lo]) - s[lo]);
}

const series = (m: PlotModel, suffix: string) => m.series.find((s) => s.id.endsWith(suffix))!;

describe('realisation plot', { timeout: 120_000 }, () => {
  it("draws bands at the raw draws' 68.27% and 95.45% central quantiles and medians, computed here", () => {
    const m = sheetRealisationModel(reader, 'hc')!;
    const nb = value.cells.bins.length;
    const R = value.draws.count;
    const b68 = series(m, ':68');
    const b95 = series(m, ':95');
    for (let k = 0; k < nb; k++) {
      const col = Array.from({ length: R }, (_, r) => value.draws.hc[r * nb + k]);
      const rel = (a: number, b: number) => Math.abs(a / b - 1);
      // One-sigma and two-sigma central shares: erf(1/sqrt 2) = 0.682689, erf(2/sqrt 2) = 0.954500 (normal distribution, closed form).
      expect(rel(b68.yLow![k], quantile7(col, 0.5 - 0.682689 / 2)), `bin ${k + 1}`).toBeLessThan(1e-5);
      expect(rel(b68.yHigh![k], quantile7(col, 0.5 + 0.682689 / 2))).toBeLessThan(1e-5);
      expect(rel(b95.yLow![k], quantile7(col, 0.5 - 0.9545 / 2))).toBeLessThan(1e-5);
      expect(rel(b95.yHigh![k], quantile7(col, 0.5 + 0.9545 / 2))).toBeLessThan(1e-5);
      expect(rel(series(m, ':median').y[k], quantile7(col, 0.5))).toBeLessThan(1e-12);
    }
    // The free spectrum's violins are drawn with the bands.
    expect(m.series.some((s) => s.id === 'measured_free_spectrum:violins')).toBe(true);
    // A few single realisations, thin, in one legend entry.
    const singles = series(m, ':singles');
    expect(singles.label).toBe('3 single realisations');
    expect(singles.x.filter(Number.isNaN).length).toBe(2);
    expect(singles.y.slice(0, nb)).toEqual(Array.from(value.draws.hc.subarray(0, nb)));
  });

  it("draws the loudest binary's own h_c, h sqrt(f T), at the median of the raw loudest strains", () => {
    const m = sheetRealisationModel(reader, 'hc')!;
    const nb = value.cells.bins.length;
    const R = value.draws.count;
    const loud = series(m, ':loudest');
    for (let k = 0; k < nb; k++) {
      const h = quantile7(Array.from({ length: R }, (_, r) => value.draws.loudestStrain[r * nb + k]), 0.5);
      const f = value.cells.bins[k].frequencyHz;
      expect(Math.abs(loud.y[k] / (h * Math.sqrt(f * value.setup.spanS)) - 1)).toBeLessThan(1e-12);
    }
  });

  it('on the rho_k axis every band value is h_c / sqrt(12 pi^2 f^3 T) (docs/freeSpectrum.md)', () => {
    const hc = sheetRealisationModel(reader, 'hc')!;
    const rho = sheetRealisationModel(reader, 'rho')!;
    const T = (sheet.value('measured_free_spectrum') as unknown as { data: { spanS: number } }).data.spanS;
    const a = series(hc, ':95');
    const b = series(rho, ':95');
    a.x.forEach((f, k) => expect(b.yHigh![k] / (a.yHigh![k] / Math.sqrt(12 * Math.PI ** 2 * f ** 3 * T))).toBeCloseTo(1, 12));
    expect(rho.y.label).toBe('residual amplitude rho_k (s)');
  });

  it('a run of the realisations job (same count and seed) draws the same figure as the sheet cell', async () => {
    const run = await runChunkedJob(realiseJob, sheet, { cell: 'real', count: 64, seed: 11 });
    const nb = run.frequencyHz.length;
    const singles = Array.from({ length: 3 }, (_, r) => Array.from(run.draws.hc.subarray(r * nb, (r + 1) * nb)));
    const view = realisationViewOfRun({ ...run, singles, medianLoudestHc: loudestOwnHc(run.summary, run.frequencyHz, value.setup.spanS) });
    const fromRun = realisationPlotModel({ quantity: 'hc', view });
    const fromCell = realisationPlotModel({ quantity: 'hc', view: realisationCells(reader)[0].view });
    expect(fromRun.series.map((s) => [s.label, s.y, s.yLow, s.yHigh])).toEqual(fromCell.series.map((s) => [s.label, s.y, s.yLow, s.yHigh]));
  });
});
