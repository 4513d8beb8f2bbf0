import { describe, expect, it } from 'vitest';
import { axisValues, scan1D, scan2D } from '../../src/statistics/sheetScan';
import { measurementOfCell, runJob } from '../../src/statistics/jobs';
import { JobCancelledError, valueLike } from '../../src/statistics/sheetValues';
import { relativeLikelihood } from '../../src/statistics/measurement';
import { toySheet, toyAmplitude } from './toySheet';

const PER_UNIT = (s: ReturnType<typeof toySheet>) => (s.value('rate_norm') as { value: number }).value / 1e-3;

describe('one-input scans', () => {
  it('A_yr against rate_norm (log) follows the closed form sqrt(rate K)(1 + s^2) and carries the measured band', async () => {
    const sheet = toySheet();
    const u = PER_UNIT(sheet);
    const r = await scan1D(sheet, { cell: 'rate_norm', lo: 1e-4 * u, hi: 1e-2 * u, n: 21, log: true }, ['A_yr', 'bent'], {
      measurement: measurementOfCell(sheet, 'measured'),
    });
    expect(r.scaled).toEqual(['A_yr']); // bent is evaluated point by point
    r.axis.values.forEach((x, i) => {
      expect(r.outputs.A_yr[i] / toyAmplitude(x)).toBeCloseTo(1, 10);
      expect(r.outputs.bent[i] / (toyAmplitude(x) + 1e-15)).toBeCloseTo(1, 10);
    });
    expect(r.axis.values[10]).toBeCloseTo(1e-3, 12);
    expect(r.band!.median / 3e-15).toBeCloseTo(1, 12);
    expect(r.band!.lower).toBe(2e-15);
    expect(r.band!.upper).toBe(4.5e-15);
    expect(r.band!.level).toBe(0.9);
  });
  it('a linear scan of a plain-number input', async () => {
    const sheet = toySheet();
    const r = await scan1D(sheet, { cell: 'slope', lo: 0, hi: 1, n: 5, log: false }, ['A_yr']);
    expect(Array.from(r.axis.values)).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(r.outputs.A_yr[4] / toyAmplitude(1e-3, 1)).toBeCloseTo(1, 12);
  });
  it('refuses an output that is not a single number', async () => {
    const sheet = toySheet();
    await expect(scan1D(sheet, { cell: 'slope', lo: 0, hi: 1, n: 3, log: false }, ['measured'])).rejects.toThrow(
      /scan: output measured is not a single number or quantity/,
    );
    await expect(scan1D(sheet, { cell: 'slope', lo: 0, hi: 1, n: 3, log: false }, ['nosuch'])).rejects.toThrow(/scan: there is no output cell nosuch/);
  });
  it('empty, reversed, too short or non-positive log ranges are refused with the cell named', () => {
    expect(() => axisValues({ cell: 'x', lo: 1, hi: 1, n: 10, log: false })).toThrow(/scan of x: the range is empty/);
    expect(() => axisValues({ cell: 'x', lo: 2, hi: 1, n: 10, log: false })).toThrow(/scan of x: the range is reversed/);
    expect(() => axisValues({ cell: 'x', lo: 0, hi: 1, n: 1, log: false })).toThrow(/at least 2/);
    expect(() => axisValues({ cell: 'x', lo: 0, hi: 1, n: 10, log: true })).toThrow(/log scan needs a positive lower end/);
    expect(() => axisValues({ cell: 'x', lo: 0, hi: 1, n: 2.5, log: false })).toThrow(/whole number/);
  });
  it('scan jobs take range ends as formula text and refuse a plain number for a quantity cell without display unit', async () => {
    const sheet = toySheet({ rate_norm: { unit: undefined } });
    await expect(runJob(sheet, { kind: 'scan', vary: [{ cell: 'rate_norm', lo: 1e-4, hi: 1e-2, n: 5, log: true }], outputs: ['A_yr'] })).rejects.toThrow(
      /needs a unit/,
    );
    const ok = await runJob(sheet, { kind: 'scan', vary: [{ cell: 'rate_norm', lo: '1e-4 Mpc^-3 Gyr^-1', hi: '1e-2 Mpc^-3 Gyr^-1', n: 5, log: true }], outputs: ['A_yr'] });
    expect(ok.kind).toBe('scan1d');
    await expect(runJob(sheet, { kind: 'scan', vary: [{ cell: 'rate_norm', lo: '1e-2 Mpc^-3 Gyr^-1', hi: '1e-4 Mpc^-3 Gyr^-1', n: 5, log: true }], outputs: ['A_yr'] })).rejects.toThrow(/reversed/);
  });
});

describe('job results are plain data a worker can post', () => {
  it('structuredClone keeps every job result whole', async () => {
    const sheet = toySheet({ rate_norm: { uncertainty: 'lognormalDist(1e-3 Mpc^-3 Gyr^-1, 0.3)' } });
    const jobs = [
      await runJob(sheet, { kind: 'scan', vary: [{ cell: 'slope', lo: 0, hi: 1, n: 3 }], outputs: ['A_yr'], measurementCell: 'measured' }),
      await runJob(sheet, { kind: 'scan', vary: [{ cell: 'slope', lo: 0, hi: 1, n: 3 }, { cell: 'rate_norm', lo: '1e-4 Mpc^-3 Gyr^-1', hi: '1e-2 Mpc^-3 Gyr^-1', n: 3, log: true }], outputs: ['A_yr'], measurementCell: 'measured' }),
      await runJob(sheet, { kind: 'sample', samples: 20, seed: 1, outputs: ['A_yr'], measurementCell: 'measured' }),
      await runJob(sheet, { kind: 'goalSeek', input: 'slope', output: 'A_yr', target: '3e-15' }),
      await runJob(sheet, { kind: 'rate', measurementCell: 'measured', densityCell: 'local_rate' }),
    ];
    for (const j of jobs) expect(structuredClone(j)).toEqual(j);
  });
});

describe('two-input likelihood maps', () => {
  it('the sqrt scaling along rate_norm gives the same grid as evaluating every point (brute force through the sheet)', async () => {
    const sheet = toySheet();
    const u = PER_UNIT(sheet);
    const x = { cell: 'slope', lo: 0, hi: 1.5, n: 12, log: false };
    const y = { cell: 'rate_norm', lo: 1e-4 * u, hi: 1e-2 * u, n: 9, log: true };
    const r = await scan2D(sheet, x, y, 'A_yr', { measurement: measurementOfCell(sheet, 'measured') });
    expect(r.scaledAxis).toBe('y');
    expect(r.evaluations).toBe(12);
    const nominalRate = sheet.value('rate_norm');
    for (let iy = 0; iy < 9; iy++) {
      for (let ix = 0; ix < 12; ix++) {
        const st = sheet.evaluateWith({ slope: r.x.valuesSI[ix], rate_norm: valueLike(nominalRate, r.y.valuesSI[iy]) }, ['A_yr']).A_yr;
        expect(r.values[iy * 12 + ix] / (st as { value: number }).value).toBeCloseTo(1, 10);
      }
    }
    // Likelihood is the measurement's relative likelihood at each grid value.
    const m = measurementOfCell(sheet, 'measured');
    expect(r.likelihood![40]).toBeCloseTo(relativeLikelihood(m, r.values[40]), 14);
    // Posterior is normalised, levels enclose at least their mass.
    expect(r.posterior!.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
    r.levels!.forEach((l, k) => expect(r.enclosed![k]).toBeGreaterThanOrEqual(l));
    expect(r.priors).toMatch(/slope: uniform, rate_norm: log-uniform/);
  });
  it('without a sqrt law every grid point is evaluated', async () => {
    const sheet = toySheet();
    const r = await scan2D(sheet, { cell: 'slope', lo: 0, hi: 1, n: 4, log: false }, { cell: 'K_coef', lo: -1, hi: 1, n: 3, log: false }, 'bent');
    expect(r.scaledAxis).toBeNull();
    expect(r.evaluations).toBe(12);
    // sqrt of a negative K_coef gives a complex or failed value: counted, not thrown.
    expect(r.failures).toBeGreaterThan(0);
    expect(r.firstError).toBeTruthy();
  });
  it('cancelling a scan stops it with JobCancelledError and leaves the sheet unchanged', async () => {
    const sheet = toySheet();
    const before = sheet.toFileText();
    const states = sheet.cells().map((c) => sheet.state(c.name));
    const ctl = new AbortController();
    let reports = 0;
    const job = runJob(
      sheet,
      { kind: 'scan', vary: [{ cell: 'slope', lo: 0, hi: 2, n: 400, log: false }, { cell: 'K_coef', lo: '1e-27 Mpc^3 Gyr', hi: '5e-27 Mpc^3 Gyr', n: 400 }], outputs: ['bent'] },
      {
        signal: ctl.signal,
        onProgress: (done, total) => {
          reports++;
          expect(done).toBeLessThan(total);
          ctl.abort();
        },
      },
    );
    await expect(job).rejects.toBeInstanceOf(JobCancelledError);
    expect(reports).toBe(1);
    expect(sheet.toFileText()).toBe(before);
    sheet.cells().forEach((c, i) => expect(sheet.state(c.name)).toBe(states[i]));
  });
});
