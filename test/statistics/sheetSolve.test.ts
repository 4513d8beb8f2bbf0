import { describe, expect, it } from 'vitest';
import { solveRateForMeasurement } from '../../src/statistics/rateSolve';
import { goalSeek } from '../../src/statistics/goalSeek';
import { checkSqrtProportional } from '../../src/statistics/proportionality';
import { measurementOfCell, runJob } from '../../src/statistics/jobs';
import { toySheet, toyAmplitude } from './toySheet';
import { valueLike } from '../../src/statistics/sheetValues';

describe('the rates a measurement allows (A_yr^2 linear in the normalisation, Phinney 2001)', () => {
  it('the direct solve equals brute-force scanning of the sheet (fine log grid, crossing interpolated)', () => {
    const sheet = toySheet();
    const m = measurementOfCell(sheet, 'measured');
    const r = solveRateForMeasurement(sheet, { measurement: m, densityCell: 'local_rate' });
    // Brute force: evaluate A_yr through the sheet on 801 log-spaced rates and find where it crosses each target.
    const nominal = sheet.value('rate_norm');
    const perUnitSI = (nominal as { value: number }).value / 1e-3; // 1 Mpc^-3 Gyr^-1 in SI
    const n = 801;
    const lo = Math.log(1e-5);
    const hi = Math.log(1e-1);
    const rates: number[] = [];
    const amps: number[] = [];
    for (let i = 0; i < n; i++) {
      const x = Math.exp(lo + ((hi - lo) * i) / (n - 1));
      rates.push(x);
      const out = sheet.evaluateWith({ rate_norm: valueLike(nominal, x * perUnitSI) }, ['A_yr']);
      amps.push((out.A_yr as { status: 'value'; value: number }).value);
    }
    const crossing = (target: number) => {
      for (let i = 1; i < n; i++) {
        if (amps[i - 1] <= target && amps[i] > target) {
          const t = (Math.log(target) - Math.log(amps[i - 1])) / (Math.log(amps[i]) - Math.log(amps[i - 1]));
          return Math.exp(Math.log(rates[i - 1]) + t * (Math.log(rates[i]) - Math.log(rates[i - 1])));
        }
      }
      return NaN;
    };
    expect(r.rate.median / crossing(3e-15)).toBeCloseTo(1, 6);
    expect(r.rate.lower / crossing(2e-15)).toBeCloseTo(1, 6);
    expect(r.rate.upper / crossing(4.5e-15)).toBeCloseTo(1, 6);
    expect(r.level).toBe(0.9);
    expect(r.rateUnit).toBe('Mpc^-3 Gyr^-1');
    // The closed form of the toy sheet, independently: rate = (A / ((1 + s^2) sqrt K))^2.
    expect(r.rate.median / (3e-15 / 1.49) ** 2 * 2.5e-27).toBeCloseTo(1, 10);
    // Density linear in the normalisation: 0.8 x rate.
    expect(r.density!.values.median / (0.8 * r.rate.median)).toBeCloseTo(1, 10);
  });
  it('goal seek (Brent) finds the same normalisation as the direct solve', () => {
    const sheet = toySheet();
    const r = solveRateForMeasurement(sheet, { measurement: measurementOfCell(sheet, 'measured') });
    const g = goalSeek(sheet, { input: 'rate_norm', output: 'A_yr', target: 3e-15 });
    expect(g.valueSI / r.rateSI.median).toBeCloseTo(1, 8);
    expect(g.achievedSI / 3e-15).toBeCloseTo(1, 9);
    expect(g.unit).toBe('Mpc^-3 Gyr^-1');
  });
  it('refuses with a clear message when the output is not proportional to sqrt of the input', () => {
    const sheet = toySheet();
    expect(() => solveRateForMeasurement(sheet, { measurement: measurementOfCell(sheet, 'measured'), output: 'bent' })).toThrow(
      /cannot solve rate_norm directly: bent is not proportional to the square root of rate_norm/,
    );
    expect(() => solveRateForMeasurement(sheet, { measurement: measurementOfCell(sheet, 'measured'), rateCell: 'slope' })).toThrow(/not proportional/);
    expect(checkSqrtProportional(sheet, 'rate_norm', 'A_yr').proportional).toBe(true);
    expect(() => solveRateForMeasurement(sheet, { measurement: measurementOfCell(sheet, 'measured'), densityCell: 'A_yr' })).toThrow(/A_yr is not proportional to rate_norm/);
  });
  it('the solve leaves the sheet as it was', () => {
    const sheet = toySheet();
    const before = sheet.toFileText();
    const a = sheet.value('A_yr');
    solveRateForMeasurement(sheet, { measurement: measurementOfCell(sheet, 'measured') });
    goalSeek(sheet, { input: 'slope', output: 'A_yr', target: 3e-15 });
    expect(sheet.toFileText()).toBe(before);
    expect(sheet.value('A_yr')).toBe(a);
  });
});

describe('goal seek on known functions', () => {
  it('solves a non-linear input: slope with (1 + s^2) sqrt(rate K) = target, closed form s = sqrt(target/(sqrt(rate K)) - 1)', () => {
    const sheet = toySheet();
    const g = goalSeek(sheet, { input: 'slope', output: 'A_yr', target: 4e-15 });
    expect(g.valueSI).toBeCloseTo(Math.sqrt(4e-15 / toyAmplitude(1e-3, 0) - 1), 8);
  });
  it('says when there is no solution in the range', () => {
    const sheet = toySheet();
    // A_yr >= sqrt(rate K) > 0 for every slope: a negative target cannot be reached.
    expect(() => goalSeek(sheet, { input: 'slope', output: 'A_yr', target: -1 })).toThrow(/goal seek: no value of slope gives A_yr = -1/);
    expect(() => goalSeek(sheet, { input: 'slope', output: 'A_yr', target: 4e-15, lo: 0, hi: 0.5 })).toThrow(/no value of slope/);
    expect(() => goalSeek(sheet, { input: 'slope', output: 'A_yr', target: 4e-15, lo: 2, hi: 1 })).toThrow(/empty or reversed/);
    expect(() => goalSeek(sheet, { input: 'nosuch', output: 'A_yr', target: 1 })).toThrow(/input nosuch: there is no cell/);
  });
  it('runs as a job with targets and limits as formula text', async () => {
    const sheet = toySheet();
    const j = await runJob(sheet, { kind: 'goalSeek', input: 'rate_norm', output: 'A_yr', target: '3e-15', lo: '1e-6 Mpc^-3 Gyr^-1', hi: '1 Mpc^-3 Gyr^-1' });
    expect(j.kind).toBe('goalSeek');
    if (j.kind === 'goalSeek') expect(j.result.value).toBeCloseTo((3e-15 / 1.49) ** 2 / 2.5e-27, 12);
    await expect(runJob(sheet, { kind: 'goalSeek', input: 'rate_norm', output: 'A_yr', target: '3e-15', lo: '1e-6 Msun' })).rejects.toThrow(
      /different unit/,
    );
  });
});
