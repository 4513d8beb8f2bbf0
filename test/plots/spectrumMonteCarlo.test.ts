// The Monte Carlo of a spectrum drawn on the free-spectrum and (A, gamma) plots, against closed
// forms: with only the merger-rate normalisation uncertain, h_c^2 is linear in it (Phinney 2001,
// arXiv:astro-ph/0108028), so a log-normal rate of sigma dex gives h_c bands of sigma/2 dex about the
// nominal h_c and fitted points with one gamma and log10 A spread sigma/2 (normal quantiles, closed form).
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadSheet } from '../../src/cli/sheetLoading';
import { runChunkedJob } from '../../src/jobs/runChunks';
import { spectrumSampleJob } from '../../src/statistics/spectrumMonteCarloJob';
import { spectrumSampleOptions, monteCarloBands, monteCarloCloud } from '../../web/plots/spectrumMonteCarlo';
import { fitCurve, fitSetup, sheetAmplitudeGammaModel } from '../../web/plots/sheetAmplitudeGammaModel';
import { sheetFreeSpectrumModel } from '../../web/plots/sheetFreeSpectrumModel';
import { strainAtFrequency } from '../../src/statistics/binnedComparison';

const sheet = loadSheet(join(import.meta.dirname, '../../examples/demo.json'));
// Only the rate normalisation stays uncertain: lognormalDist(median, 0.3 dex).
sheet.updateCell('mass_slope', { uncertainty: '' });
sheet.updateCell('rate_norm', { uncertainty: 'lognormalDist(1.2e-3 Mpc^-3 Gyr^-1, 0.3)' });
const reader = { cells: sheet.cells(), valueOf: (n: string) => sheet.value(n), stateOf: (n: string) => sheet.state(n) };
const SIGMA_DEX = 0.3;
const N = 400;

describe('Monte Carlo band and cloud', { timeout: 120_000 }, () => {
  it('bands of h_c per bin are the nominal h_c times 10^(+-sigma/2) at one sigma and 10^(+-sigma) at two (within 0.05 dex for 400 draws)', async () => {
    const opts = spectrumSampleOptions(reader, 'spectrum', N, 3);
    if ('reason' in opts) throw new Error(opts.reason);
    const r = await runChunkedJob(spectrumSampleJob, sheet, opts);
    expect(r.failures).toBe(0);
    const nominal = sheet.value('spectrum') as unknown as { frequencyHz: Float64Array; hc: Float64Array };
    r.frequencyHz.forEach((f, k) => {
      const h = strainAtFrequency(nominal.frequencyHz, nominal.hc, Math.min(f, nominal.frequencyHz.at(-1)!));
      const dex = (x: number) => Math.log10(x / h);
      // Sample-quantile error at p = 0.159: sqrt(p (1 - p) / N) / phi(1) = 0.076 in sigma units, i.e. 0.011 dex here.
      expect(Math.abs(dex(r.median[k])), `bin ${k + 1} median`).toBeLessThan(0.05);
      expect(Math.abs(dex(r.upper68[k]) - SIGMA_DEX / 2), `bin ${k + 1} upper 68`).toBeLessThan(0.05);
      expect(Math.abs(dex(r.lower68[k]) + SIGMA_DEX / 2)).toBeLessThan(0.05);
      expect(Math.abs(dex(r.upper95[k]) - SIGMA_DEX)).toBeLessThan(0.08);
      expect(Math.abs(dex(r.lower95[k]) + SIGMA_DEX)).toBeLessThan(0.08);
    });
    // The cloud: the rate scales h_c, never its slope, so every draw has the nominal spectrum's gamma;
    // log10 A spreads as sigma/2 dex (sample standard deviation within 15% for 400 draws).
    const setup = fitSetup(reader)!;
    const nominalFit = fitCurve({ frequencyHz: Array.from(nominal.frequencyHz), hc: Array.from(nominal.hc) }, setup, opts.fRefHz);
    if ('reason' in nominalFit) throw new Error(nominalFit.reason);
    expect(r.gamma.length).toBe(N);
    for (const g of r.gamma) expect(Math.abs(g - nominalFit.gamma)).toBeLessThan(1e-6);
    const mean = r.log10A.reduce((a, b) => a + b, 0) / N;
    const sd = Math.sqrt(r.log10A.reduce((a, b) => a + (b - mean) ** 2, 0) / (N - 1));
    expect(Math.abs(sd / (SIGMA_DEX / 2) - 1)).toBeLessThan(0.15);
    expect(Math.abs(mean - nominalFit.log10A)).toBeLessThan(0.03);
    // Drawn: the band on the free-spectrum plot, the cloud on the (A, gamma) plane.
    const fs = sheetFreeSpectrumModel(reader, 'hc', [], monteCarloBands(r))!;
    expect(fs.series.filter((s) => s.label.startsWith('Monte Carlo of spectrum (400 draws, seed 3)')).map((s) => s.kind)).toEqual(['band', 'band', 'line']);
    const ag = sheetAmplitudeGammaModel(reader, [], [monteCarloCloud(r)])!;
    expect(ag.series[0]).toMatchObject({ kind: 'points', label: 'Monte Carlo of spectrum (400 draws, seed 3): fitted (A, γ)' });
    expect(ag.series[0].x).toEqual(r.gamma);
  });

  it('the same seed gives the same run; another seed another', async () => {
    const opts = spectrumSampleOptions(reader, 'spectrum', 120, 9);
    if ('reason' in opts) throw new Error(opts.reason);
    const a = await runChunkedJob(spectrumSampleJob, sheet, opts);
    const b = await runChunkedJob(spectrumSampleJob, sheet, opts);
    expect(b).toEqual(a);
    const c = await runChunkedJob(spectrumSampleJob, sheet, { ...opts, seed: 10 });
    expect(c.log10A).not.toEqual(a.log10A);
  });

  it('refuses a sheet without uncertain cells and a cell that is not a spectrum, by name', async () => {
    const opts = spectrumSampleOptions(reader, 'A_yr', 10, 1);
    if ('reason' in opts) throw new Error(opts.reason);
    await expect(runChunkedJob(spectrumSampleJob, sheet, opts)).rejects.toThrow(/A_yr must hold a spectrum/);
  });
});
