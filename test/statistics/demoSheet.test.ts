// The statistics jobs on the demo circular model (examples/demo.json, an invented scenario),
// checked against independent routes through the same physics.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Sheet } from '../../src/sheet/sheet';
import { solveRateForMeasurement } from '../../src/statistics/rateSolve';
import { goalSeek } from '../../src/statistics/goalSeek';
import { measurementOfCell } from '../../src/statistics/jobs';
import { scan1D } from '../../src/statistics/sheetScan';
import { valueLike } from '../../src/statistics/sheetValues';

const demoText = readFileSync(new URL('../../examples/demo.json', import.meta.url), 'utf8');

describe('demo sheet: per-bin values against the model spectrum', () => {
  it('a bin placed at the model (strainAt of the physics) has tension 0; one whose lower 90% end sits on the model is at -1.6449', () => {
    const sheet = Sheet.fromFile(demoText);
    // Invented per-bin values built from the model itself at two of the demo's frequencies.
    sheet.setCell({ name: 'f_a', formula: '4.527 nHz' });
    sheet.setCell({ name: 'f_b', formula: '9.054 nHz' });
    sheet.setCell({ name: 'h_a', formula: 'strainAt(spectrum, f_a)' });
    sheet.setCell({ name: 'h_b', formula: 'strainAt(spectrum, f_b) * 2' });
    sheet.setCell({ name: 'test_bins', formula: 'binsFromTable([f_a, h_a, h_a / 2, h_a * 2; f_b, h_b, h_b / 2, h_b * 3], "hc", 90%)' });
    sheet.setCell({ name: 'test_tension', formula: 'binTension(spectrum, test_bins)' });
    const st = sheet.state('test_tension');
    if (st.status !== 'value') throw new Error(JSON.stringify(st));
    const t = (st.value as { toArray(): number[] }).toArray();
    expect(t[0]).toBeCloseTo(0, 8);
    // Model = h_b / 2 = the bin's lower 90% end: one 90% half-width below, so -1.6449 (A&S 1964, table 26.1).
    expect(t[1]).toBeCloseTo(-1.6449, 4);
  });
});

describe('demo sheet: the rates the invented measurement allows', () => {
  const sheet = Sheet.fromFile(demoText);
  sheet.setCell({ name: 'test_measured', formula: 'measuredAmplitude(measured_A, measured_A_low, measured_A_high, measured_level)' });
  const m = measurementOfCell(sheet, 'test_measured');
  const solved = solveRateForMeasurement(sheet, { measurement: m, densityCell: 'rate_today' });

  it('the direct solve (two sqrt-law probes) equals goal seek by Brent through the full spectrum, to 1e-7', () => {
    const g = goalSeek(sheet, { input: 'rate_norm', output: 'A_yr', target: 10 ** m.log10Median, relTol: 1e-12 });
    expect(g.valueSI / solved.rateSI.median).toBeCloseTo(1, 7);
    const gl = goalSeek(sheet, { input: 'rate_norm', output: 'A_yr', target: m.stated!.lower, relTol: 1e-12 });
    expect(gl.valueSI / solved.rateSI.lower).toBeCloseTo(1, 7);
  });
  it('the rate found reproduces the measured median when put back into the sheet', () => {
    const nominal = sheet.value('rate_norm');
    const r = sheet.evaluateWith({ rate_norm: valueLike(nominal, solved.rateSI.median) }, ['A_yr', 'rate_today']);
    expect((r.A_yr as { value: number }).value / 10 ** m.log10Median).toBeCloseTo(1, 9);
    // The local merger-rate density it implies equals the sheet's own rate_today at that normalisation.
    const today = (r.rate_today as { value: { toNumber(u: string): number } }).value.toNumber('Mpc^-3 Gyr^-1');
    expect(solved.density!.unit).toBe('Mpc^-3 Gyr^-1');
    expect(solved.density!.values.median / today).toBeCloseTo(1, 9);
  });
  it('a one-input scan over rate_norm is the sqrt law exactly, and over mass_slope it is evaluated point by point', async () => {
    const r0 = (sheet.value('rate_norm') as { value: number }).value;
    const a0 = sheet.value('A_yr') as number;
    const s = await scan1D(sheet, { cell: 'rate_norm', lo: r0 / 10, hi: r0 * 10, n: 5, log: true }, ['A_yr']);
    expect(s.scaled).toEqual(['A_yr']);
    expect(s.outputs.A_yr[4] / (a0 * Math.sqrt(10))).toBeCloseTo(1, 10);
    const t = await scan1D(sheet, { cell: 'mass_slope', lo: 0, hi: 0.5, n: 3, log: false }, ['A_yr']);
    expect(t.scaled).toEqual([]);
    const direct = sheet.evaluateWith({ mass_slope: 0.5 }, ['A_yr']).A_yr as { value: number };
    expect(t.outputs.A_yr[2]).toBe(direct.value);
  });
});
