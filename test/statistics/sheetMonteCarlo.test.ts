import { describe, expect, it } from 'vitest';
import { monteCarlo, uncertainCells } from '../../src/statistics/sheetMonteCarlo';
import { measurementOfCell, runJob } from '../../src/statistics/jobs';
import { toySheet } from './toySheet';
import { normalCdf } from '../../src/statistics/normal';
import type { SampleSummary } from '../../src/statistics/sampleSummary';

// rate_norm log-normal with 0.3 dex and A_yr ~ sqrt(rate_norm): log10 A_yr is normal with 0.15 dex
// around log10 A_yr(median rate) (change of variables, closed form).
const UNCERTAIN = { rate_norm: { uncertainty: 'lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)' } };
const A_MED = Math.sqrt(1e-3 * 2.5e-27) * 1.49;

describe('Monte Carlo through the sheet', () => {
  it('finds the uncertain cells and their distributions', () => {
    const d = uncertainCells(toySheet(UNCERTAIN));
    expect([...d.keys()]).toEqual(['rate_norm']);
    expect(d.get('rate_norm')!.describe()).toMatch(/log-normal, median 0.001 Mpc\^-3 Gyr\^-1, 0.3 dex/);
  });
  it('median and 68%/95% intervals converge to the closed form as samples grow, within 4 reported Monte Carlo errors', async () => {
    const sheet = toySheet(UNCERTAIN);
    const k1 = 1; // 68.27% -> 1 sigma (A&S 1964, table 26.1)
    const k2 = 2;
    const runs: SampleSummary[] = [];
    for (const n of [1000, 16_000]) {
      const r = await monteCarlo(sheet, { samples: n, seed: 3, outputs: ['A_yr'] });
      const s = r.summaries.A_yr;
      runs.push(s);
      expect(Math.abs(s.median - A_MED)).toBeLessThan(4 * s.medianError);
      const [i68, i95] = s.intervals;
      expect(Math.abs(i68.upper - A_MED * 10 ** (0.15 * k1))).toBeLessThan(4 * i68.upperError);
      expect(Math.abs(i68.lower - A_MED * 10 ** (-0.15 * k1))).toBeLessThan(4 * i68.lowerError);
      expect(Math.abs(i95.upper - A_MED * 10 ** (0.15 * k2))).toBeLessThan(4 * i95.upperError);
      expect(Math.abs(i95.lower - A_MED * 10 ** (-0.15 * k2))).toBeLessThan(4 * i95.lowerError);
    }
    // The Monte Carlo error falls as 1/sqrt(N): factor 4 for 16x the samples. Each order-statistic
    // error estimate is itself noisy (~20% at N = 1000), so average the five (median, four ends), within 35%.
    const meanError = (s: SampleSummary) =>
      (s.medianError + s.intervals.reduce((sum, i) => sum + i.lowerError + i.upperError, 0)) / 5;
    const ratio = meanError(runs[0]) / meanError(runs[1]);
    expect(ratio).toBeGreaterThan(4 / 1.35);
    expect(ratio).toBeLessThan(4 * 1.35);
  });
  it('applying rate_norm as a sqrt factor gives the same samples as evaluating every sample in full', async () => {
    const sheet = toySheet({ ...UNCERTAIN, slope: { uncertainty: 'normalDist(0.7, 0.1)' } });
    const fast = await monteCarlo(sheet, { samples: 400, seed: 17, outputs: ['A_yr', 'bent'] });
    const full = await monteCarlo(sheet, { samples: 400, seed: 17, outputs: ['A_yr', 'bent'], evaluateEverySample: true });
    // bent = A_yr + 1e-15 is not proportional to sqrt(rate_norm): nothing may be factored for it.
    expect(fast.scaledInputs).toEqual([]);
    const one = await monteCarlo(sheet, { samples: 400, seed: 17, outputs: ['A_yr'] });
    const oneFull = await monteCarlo(sheet, { samples: 400, seed: 17, outputs: ['A_yr'], evaluateEverySample: true });
    expect(one.scaledInputs).toEqual(['rate_norm']);
    expect(oneFull.evaluations).toBe(400);
    for (let i = 0; i < 400; i++) {
      expect(one.outputs.A_yr[i] / oneFull.outputs.A_yr[i]).toBeCloseTo(1, 12);
      expect(fast.outputs.bent[i]).toBe(full.outputs.bent[i]);
    }
    // Only rate_norm uncertain: a single evaluation serves every sample.
    const only = await monteCarlo(toySheet(UNCERTAIN), { samples: 400, seed: 17, outputs: ['A_yr'] });
    expect(only.evaluations).toBe(1);
  });
  it('a fixed seed reproduces the run exactly; another seed does not', async () => {
    const sheet = toySheet(UNCERTAIN);
    const a = await monteCarlo(sheet, { samples: 300, seed: 42, outputs: ['A_yr'] });
    const b = await monteCarlo(sheet, { samples: 300, seed: 42, outputs: ['A_yr'] });
    const c = await monteCarlo(sheet, { samples: 300, seed: 43, outputs: ['A_yr'] });
    expect(Array.from(b.outputs.A_yr)).toEqual(Array.from(a.outputs.A_yr));
    expect(Array.from(c.outputs.A_yr)).not.toEqual(Array.from(a.outputs.A_yr));
  });
  it('overlap with the measurement: fraction inside the 90% interval equals the closed form for log-normal predictions', async () => {
    const sheet = toySheet(UNCERTAIN);
    const r = await monteCarlo(sheet, { samples: 20_000, seed: 9, outputs: ['A_yr'], measurement: measurementOfCell(sheet, 'measured') });
    const mu = Math.log10(A_MED);
    const exact = normalCdf((Math.log10(4.5e-15) - mu) / 0.15) - normalCdf((Math.log10(2e-15) - mu) / 0.15);
    expect(Math.abs(r.overlap!.fractionInside - exact)).toBeLessThan(4 * r.overlap!.fractionInsideError);
  });
  it('refuses bad set-ups with the cell named, and leaves the sheet unchanged', async () => {
    const sheet = toySheet(UNCERTAIN);
    const before = sheet.toFileText();
    await expect(monteCarlo(toySheet(), { samples: 10, seed: 1, outputs: ['A_yr'] })).rejects.toThrow(/no cell has an uncertainty/);
    await expect(monteCarlo(sheet, { samples: 0, seed: 1, outputs: ['A_yr'] })).rejects.toThrow(/positive whole number/);
    await expect(monteCarlo(sheet, { samples: 10, seed: -2, outputs: ['A_yr'] })).rejects.toThrow(/seed/);
    await expect(monteCarlo(sheet, { samples: 10, seed: 1, outputs: ['nosuch'] })).rejects.toThrow(/no output cell nosuch/);
    await expect(monteCarlo(toySheet({ slope: { uncertainty: 'normalDist(1 Mpc, 0.1 Mpc)' } }), { samples: 10, seed: 1, outputs: ['A_yr'] })).rejects.toThrow(
      /uncertainty of slope gives values in Mpc, but slope is in no unit/,
    );
    await expect(monteCarlo(toySheet({ slope: { uncertainty: 'normalDist(1, 0)' } }), { samples: 10, seed: 1, outputs: ['A_yr'] })).rejects.toThrow(
      /uncertainty of slope: .*sd must be positive/,
    );
    await expect(monteCarlo(toySheet({ slope: { uncertainty: '3' } }), { samples: 10, seed: 1, outputs: ['A_yr'] })).rejects.toThrow(/must give a distribution/);
    await runJob(sheet, { kind: 'sample', samples: 50, seed: 1, outputs: ['A_yr'] });
    expect(sheet.toFileText()).toBe(before);
  });
  it('cancelling a run leaves the sheet unchanged', async () => {
    const sheet = toySheet(UNCERTAIN);
    const before = sheet.toFileText();
    const a = sheet.value('A_yr');
    const ctl = new AbortController();
    ctl.abort();
    await expect(monteCarlo(sheet, { samples: 1_000_000, seed: 1, outputs: ['A_yr'] }, { signal: ctl.signal })).rejects.toThrow(/cancelled/);
    expect(sheet.toFileText()).toBe(before);
    expect(sheet.value('A_yr')).toBe(a);
  });
});
